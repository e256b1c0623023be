import { describe, expect, it } from 'vitest';
import { datumKindOf, heightsOf } from '../../server/exports/datum';
import { waypointsOf } from '../../server/exports/waypoints';
import { readResult } from '../../server/versions/result-view';
import { analysedResult } from '../support/fixtures';
import { geoidUndulationM } from '../../terrain/heights';

const leg = (d0: number, d1: number, z0: number, z1: number, lon0: number, lon1: number) => ({
  start: { lon: lon0, lat: 54.2, distanceM: d0 },
  end: { lon: lon1, lat: 54.2, distanceM: d1 },
  altitudeStartM: z0,
  altitudeEndM: z1,
  altitudeStartAboveTakeoffM: z0 - 200,
  altitudeEndAboveTakeoffM: z1 - 200,
  aglMinM: 100,
  aglMaxM: 110,
  gsdMinCm: 2.9,
  gsdMaxCm: 3.1,
  gradient: (z1 - z0) / (d1 - d0),
});
// a real analysis's result with its first line's legs replaced, read through the one result schema
const base = analysedResult();
const view = (legs: ReturnType<typeof leg>[]) => readResult({ ...base, lines: [{ ...base.lines[0], index: 0, stations: [], legs }] });
const egm = { name: 'EGM96', kind: 'egm96' as const };

describe('waypoints of a line', () => {
  it('shares one waypoint where two legs meet at the same place and altitude', () => {
    const w = waypointsOf(view([leg(0, 100, 300, 310, -2.8, -2.799), leg(100, 250, 310, 310, -2.799, -2.797)]), egm);
    expect(w.map((p) => [p.role, p.leg, p.altitudeAboveDatumM])).toEqual([
      ['line-start', 1, 300],
      ['leg-change', 2, 310],
      ['line-end', 2, 310],
    ]);
    expect(w.map((p) => p.seq)).toEqual([1, 2, 3]);
    expect(w[0].altitudeAboveTakeoffM).toBe(100);
  });

  it('keeps both ends where the next leg starts at another altitude', () => {
    const w = waypointsOf(view([leg(0, 100, 300, 300, -2.8, -2.799), leg(100, 250, 320, 320, -2.799, -2.797)]), egm);
    expect(w.map((p) => [p.role, p.leg, p.altitudeAboveDatumM])).toEqual([
      ['line-start', 1, 300],
      ['leg-change', 1, 300],
      ['leg-change', 2, 320],
      ['line-end', 2, 320],
    ]);
  });
});

describe('vertical datums of the exports', () => {
  it('reads the stated datum text', () => {
    expect(datumKindOf('EGM96 geoid')).toBe('egm96');
    expect(datumKindOf('EGM 96')).toBe('egm96');
    expect(datumKindOf('EPSG:5773')).toBe('egm96');
    expect(datumKindOf('WGS 84 ellipsoid')).toBe('ellipsoid');
    expect(datumKindOf('ellipsoidal heights (EPSG:4979)')).toBe('ellipsoid');
    expect(datumKindOf('Ordnance Datum Newlyn')).toBe('other');
  });

  it('relates the heights by h = H + N with the EGM96 geoid height N', () => {
    const n = geoidUndulationM(54.2, -2.8);
    expect(heightsOf('egm96', 54.2, -2.8, 300)).toEqual({ altitudeSeaLevelM: 300, altitudeEllipsoidM: 300 + n, geoidHeightM: n, heightsApproximate: false });
    expect(heightsOf('ellipsoid', 54.2, -2.8, 300)).toEqual({ altitudeSeaLevelM: 300 - n, altitudeEllipsoidM: 300, geoidHeightM: n, heightsApproximate: false });
    expect(heightsOf('other', 54.2, -2.8, 300).heightsApproximate).toBe(true);
  });
});

import { describe, expect, it } from 'vitest';
import { stationStats } from '../../server/reports/report.build';
import { compareHeadingOptions, type HeadingOption } from '../../terrain/heading';
import { shortLegWarnings } from '../../terrain/plan';

const station = (aglM: number) => ({ distanceM: 0, lon: 0, lat: 0, groundM: 100, altitudeM: 100 + aglM, altitudeAboveTakeoffM: aglM, aglM, gsdCm: 3, forwardOverlap: 0.8, sideOverlap: 0.7, flags: [] });

describe('a status and the figures beside it agree', () => {
  it('spans the height above ground over the legs flown between photos, where a height-limit stretch can lie', () => {
    // photos at 109.8 and 119.8 m above ground; between them the leg dips over a gully to 121.3 m
    const stations = [station(109.8), station(119.8)] as never[];
    const legs = [{ aglMinM: 109.5, aglMaxM: 121.3 }];
    const s = stationStats(stations, [2.7, 3.3], legs);
    expect(s.aglMaxM).toBe(121.3);
    expect(s.aglMinM).toBe(109.5);
    // stations alone, as before: the range would say 109.8-119.8 beside "above the 120 m height limit"
    expect(stationStats(stations, [2.7, 3.3]).aglMaxM).toBe(119.8);
  });
});

describe('legs shorter than the shortest-leg setting', () => {
  const leg = (from: number, to: number, z0: number, z1: number) => ({
    start: { lon: 0, lat: 0, distanceM: from }, end: { lon: 0, lat: 0, distanceM: to },
    altitudeStartM: z0, altitudeEndM: z1, altitudeStartAboveTakeoffM: 0, altitudeEndAboveTakeoffM: 0,
    aglMinM: 100, aglMaxM: 110, gsdMinCm: 3, gsdMaxCm: 3.2, gradient: (z1 - z0) / (to - from),
  });

  it('say why, naming the line, the leg and its length', () => {
    const w = shortLegWarnings(2, 800, [leg(0, 300, 150, 150), leg(300, 304, 150, 151), leg(304, 800, 151, 151)], 50);
    expect(w).toHaveLength(1);
    expect(w[0].code).toBe('short-leg');
    expect(w[0].message).toBe('Line 3, leg 2 is 4 m long, shorter than the 50 m shortest-leg setting: it is the climb of 1 m between two levels, at the climb limit; a longer one would leave the clearance or the GSD band.');
  });

  it('name a line shorter than the setting as the reason', () => {
    const w = shortLegWarnings(0, 30, [leg(0, 30, 150, 150)], 50);
    expect(w[0].message).toMatch(/the whole line is only 30 m long/);
  });

  it('stay silent for legs at or above the setting', () => {
    expect(shortLegWarnings(0, 800, [leg(0, 50, 150, 150), leg(50, 800, 150, 150)], 50)).toEqual([]);
  });
});

describe('heading order', () => {
  const opt = (headingDeg: number, aglSpreadM: number, flightDistanceM = 5000): HeadingOption => ({ headingDeg, aglSpreadM, flightDistanceM, lineCount: 10, aglRangeMaxM: 20 });

  it('lets the smaller spread win however much longer its flight (no tolerance band that a larger spread can win in)', () => {
    expect(compareHeadingOptions(opt(43, 2.000, 9000), opt(40, 2.015, 5000))).toBeLessThan(0);
    expect(compareHeadingOptions(opt(40, 2.015, 5000), opt(43, 2.000, 9000))).toBeGreaterThan(0);
  });

  it('breaks equal spreads by the shorter flight, then by the heading nearer the first candidate (0°)', () => {
    expect(compareHeadingOptions(opt(90, 0, 4000), opt(0, 0, 4600))).toBeLessThan(0);
    expect(compareHeadingOptions(opt(170, 1.2341), opt(15, 1.2339))).toBeLessThan(0); // same spread to the mm; 170° is 10° from 0°
    expect(compareHeadingOptions(opt(5, 1), opt(175, 1))).toBeLessThan(0); // both 5° away: the smaller heading
  });

  it('is a total order: sorting any shuffle gives the same list', () => {
    const opts = [opt(40, 2.015), opt(39, 2.02), opt(41, 2.0151), opt(43, 2.0), opt(44, 2.0), opt(137, 2.0), opt(0, 3)];
    const a = [...opts].sort(compareHeadingOptions).map((o) => o.headingDeg);
    const b = [...opts].reverse().sort(compareHeadingOptions).map((o) => o.headingDeg);
    expect(a).toEqual(b);
    expect(a.slice(0, 3)).toEqual([43, 137, 44]); // equal spreads: 43° and 137° are both 43° from 0°, 44° is 44° away
  });
});

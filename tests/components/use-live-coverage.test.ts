import { describe, expect, it } from 'vitest';
import type { LiveCoverage } from '../../contracts/live-coverage';
import { linkLineOf, liveCoveragePath, liveStateOf, liveViewOf } from '../../components/flights/use-live-coverage';
import { liveLayersOf } from '../../components/coverage/live-coverage-layers';

const base: LiveCoverage = {
  versionId: 'v1', state: 'ready', reason: null, photoCount: 120, matched: 118, extra: 2, missedSoFar: 3,
  progress: { line: 3, station: 14 }, raster: { width: 100, height: 80, cellM: 5 }, spec: { maxGsdCm: 3.3, minViews: 2 },
  flown: { shareAll: 0.41234, items: [{ item: 'gsd', asks: 'a view with GSD at most 3.3 cm', share: 0.5 }, { item: 'views', asks: 'at least 2 views', share: 0.4125 }] },
  passed: { cells: 3000, areaM2: 75000, shortCells: 50, shortAreaM2: 1250, patches: [{ cells: 40, areaM2: 1000, centroid: { lon: -2.5, lat: 54.25 } }, { cells: 10, areaM2: 250, centroid: { lon: -2.51, lat: 54.26 } }] },
  map: null, heights: 'Photo heights are the autopilot\'s, above its home.', cautions: ['Wind moves the aircraft off the plan.'], computedAt: '2026-12-02T10:00:00Z',
};

describe('the leg sheet\'s live coverage', () => {
  it('says how far the flight is, the share of the area meeting each spec item, and the short patches passed, largest first', () => {
    const v = liveViewOf(base, 'metric');
    expect(v.headline).toBe('120 photos recorded, last matched to line 3 station 14; 3 planned stations passed without a photo. 41.2 % of the area meets the whole spec so far.');
    expect(v.items).toEqual(['a view with GSD at most 3.3 cm: 50.0 % of the area', 'at least 2 views: 41.3 % of the area']);
    expect(v.patches).toHaveLength(2);
    expect(v.patches[0]).toMatch(/^1,000 m² short of the spec around /);
    // 1000 m² is 10,764 sq ft (0.3048 m to the foot, exact by definition).
    expect(liveViewOf(base, 'imperial').patches[0]).toMatch(/^10,764 sq ft short/);
  });

  it('lists no patch while nothing passed falls short, and passes a refusal on with its reason', () => {
    expect(liveViewOf({ ...base, passed: { ...base.passed!, shortCells: 0, shortAreaM2: 0, patches: [] } }, 'metric').patches).toEqual([]);
    const r = liveViewOf({ ...base, state: 'refused', reason: 'Live coverage could not be computed: too many cells.' }, 'metric');
    expect(r.refused).toBe('Live coverage could not be computed: too many cells.');
    expect(liveViewOf({ ...base, state: 'empty', photoCount: 0 }, 'metric').headline).toMatch(/^No photos recorded yet: run the link with --follow/);
  });

  it('streams only for a signed-off version, online, in a browser that can; keeps the last figures when the connection drops', () => {
    const q = { signedOff: true, offline: false, teamId: 't1', canStream: true, doc: null, connected: false };
    expect(liveStateOf(q)).toEqual({ kind: 'waiting' });
    expect(liveStateOf({ ...q, signedOff: false }).kind).toBe('unavailable');
    expect(liveStateOf({ ...q, canStream: false })).toEqual({ kind: 'unavailable', reason: 'This browser cannot receive live updates (no EventSource).' });
    expect(liveStateOf({ ...q, offline: true })).toEqual({ kind: 'unavailable', reason: 'Live coverage needs the connection back.' });
    expect(liveStateOf({ ...q, offline: true, doc: base, connected: true })).toEqual({ kind: 'live', doc: base, connected: false });
    expect(liveCoveragePath('t 1', 'v/1')).toBe('/api/teams/t%201/flights/v%2F1/live');
    expect(liveCoveragePath('t1', 'v1', true)).toBe('/api/teams/t1/flights/v1/live?map=1');
  });
});

describe('the live coverage map layers', () => {
  it('place the views image and the short-ground hatching on the hillshade, by the two geotransforms', () => {
    // Raster of 100 x 80 cells of 5 m from (1000, 2000) south-east; hillshade pixels of 10 m from (500, 2500).
    const doc = { ...base, map: { geotransform: [1000, 5, 0, 2000, 0, -5], width: 100, height: 80, viewsPngBase64: 'AAA', viewsMax: 4, shortPngBase64: 'BBB' } };
    const layers = liveLayersOf(doc, [500, 10, 0, 2500, 0, -10]);
    expect(layers.map((l) => [l.kind, l.href, l.rect])).toEqual([
      ['image', 'data:image/png;base64,AAA', [50, 50, 50, 40]],
      ['hatch', 'data:image/png;base64,BBB', [50, 50, 50, 40]],
    ]);
    expect(liveLayersOf(doc, null)).toEqual([]);
    expect(liveLayersOf(base, [500, 10, 0, 2500, 0, -10])).toEqual([]);
  });
});

describe('the link\'s state on the leg sheet', () => {
  it('says the step, the aircraft and the connection, and when and by whom it was reported', () => {
    const line = linkLineOf({ run: '00000000-0000-4000-8000-000000000000', step: 'ready', message: 'Version 2 is on the aircraft: 120 items read back.', connection: 'udp 127.0.0.1:14550', aircraft: { sysid: 1, compid: 1, mavlink: 2 }, reportedAt: '2026-12-02T10:00:00Z', reportedBy: 'Jory Marsh' });
    expect(line).toMatch(/^Link: ready: the mission on the aircraft matches this version\. Version 2 is on the aircraft: 120 items read back\. aircraft 1\/1 \(MAVLink 2\) over udp 127\.0\.0\.1:14550; reported .+ by Jory Marsh\.$/);
    expect(linkLineOf({ run: '00000000-0000-4000-8000-000000000000', step: 'not-ready', message: 'No heartbeat.', connection: 'serial /dev/ttyUSB0 at 57600 baud', aircraft: null, reportedAt: '2026-12-02T10:00:00Z', reportedBy: 'A' })).toMatch(/^Link: NOT ready\. No heartbeat\. over serial/);
  });
});

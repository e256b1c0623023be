import fs from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { profileSeries } from '../../components/charts/profile-series';
import { niceDomain, niceStep } from '../../contracts/format/ticks';
import { lineRows, sortLineRows, type LineRow } from '../../components/results/line-rows';
import { statusLooks } from '../../components/results/station-status';
import { countStatuses, stationStatus, stationStatuses } from '../../contracts/station-status';
import { resultOverview } from '../../contracts/result-parts';
import { readDem } from '../../terrain/dem';
import { analysePlan, type PlanResult } from '../../terrain/plan';

// A real analysis over the synthetic demo grid (datasets/README.md), so the table is checked against the
// engine's own plan-wide summary, which it computes by a separate path.
let result: PlanResult;
let withEnvelope: PlanResult;
beforeAll(async () => {
  const grid = await readDem(new Uint8Array(fs.readFileSync('datasets/harrow-fell-dem.tif')));
  const mission = {
    area: { type: 'Polygon', coordinates: [[[4.478, 46.768], [4.486, 46.768], [4.486, 46.774], [4.478, 46.774], [4.478, 46.768]]] },
    camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 },
    targetGsdCm: 3,
    takeoff: { lon: 4.477, lat: 46.767 },
    headingDeg: 90,
    mode: 'steps',
  };
  result = analysePlan(grid, mission);
  withEnvelope = analysePlan(grid, { ...mission, envelope: { preset: 'fixed-wing', windMps: 4, windFromDeg: 0, airspeedMps: 15 } });
});

describe('stationStatus', () => {
  it('calls a station without flags "meets" and takes the worst status among several flags', () => {
    expect(stationStatus({ flags: [] })).toBe('meets');
    const f = (code: string) => ({ code, reason: '' }) as never;
    expect(stationStatus({ flags: [f('forward-overlap-low')] })).toBe('overlap');
    expect(stationStatus({ flags: [f('forward-overlap-low'), f('gsd-coarse')] })).toBe('gsd');
    expect(stationStatus({ flags: [f('gsd-fine'), f('below-clearance')] })).toBe('height');
    expect(stationStatus({ flags: [f('side-overlap-low'), f('ground-unknown')] })).toBe('unknown');
    expect(stationStatus({ flags: [f('a-code-added-later')] })).toBe('unknown');
    expect(stationStatus({ flags: [f('side-overlap-envelope')] })).toBe('overlap');
    expect(stationStatus({ flags: [f('forward-overlap-envelope'), f('gsd-fine')] })).toBe('gsd');
  });

  it('gives every status its own marker shape and its own colour, so none is told apart by colour alone', () => {
    const shapes = new Set(stationStatuses.map((s) => statusLooks[s].shape));
    const colours = new Set(stationStatuses.map((s) => statusLooks[s].color));
    expect(shapes.size).toBe(stationStatuses.length);
    expect(colours.size).toBe(stationStatuses.length);
  });

  it('counts every station of the analysis exactly once', () => {
    const all = result.lines.flatMap((l) => l.stations);
    const counts = countStatuses(all);
    expect(Object.values(counts).reduce((a, b) => a + b, 0)).toBe(result.summary.photoCount);
    expect(all.length - counts.meets).toBe(result.summary.flaggedStationCount);
  });
});

describe('lineRows', () => {
  it('adds up to the engine summary: photos, smallest and largest GSD, least overlaps and least height above ground', () => {
    const rows = lineRows(resultOverview(result).lines);
    expect(rows).toHaveLength(result.summary.lineCount);
    expect(rows.reduce((s, r) => s + r.photos, 0)).toBe(result.summary.photoCount);
    const min = (k: keyof LineRow) => Math.min(...rows.map((r) => r[k] as number).filter((v) => v !== null));
    expect(min('gsdMinCm')).toBe(result.summary.gsdCm.min);
    expect(Math.max(...rows.map((r) => r.gsdMaxCm ?? -Infinity))).toBe(result.summary.gsdCm.max);
    expect(min('forwardOverlapMin')).toBe(result.summary.forwardOverlapMin);
    expect(min('sideOverlapMin')).toBe(result.summary.sideOverlapMin);
    expect(min('aglMinM')).toBe(result.summary.aglMinM);
    // without an envelope: as planned only, no guaranteed figure anywhere
    for (const r of rows) expect([r.forwardOverlapGuaranteedMin, r.sideOverlapGuaranteedMin]).toEqual([null, null]);
  });

  it('gives each line its least overlaps as guaranteed, adding up to the engine summary and never above the planned ones', () => {
    const rows = lineRows(resultOverview(withEnvelope).lines);
    const min = (k: keyof LineRow) => Math.min(...rows.map((r) => r[k] as number | null).filter((v): v is number => v !== null));
    expect(min('forwardOverlapGuaranteedMin')).toBe(withEnvelope.summary.forwardOverlapGuaranteedMin);
    expect(min('sideOverlapGuaranteedMin')).toBe(withEnvelope.summary.sideOverlapGuaranteedMin);
    for (const r of rows) {
      if (r.forwardOverlapMin !== null) expect(r.forwardOverlapGuaranteedMin!).toBeLessThanOrEqual(r.forwardOverlapMin);
      if (r.sideOverlapMin !== null) expect(r.sideOverlapGuaranteedMin!).toBeLessThanOrEqual(r.sideOverlapMin);
    }
    // ±15° of roll takes the side overlap of this plan well under its 70 % target
    expect(withEnvelope.summary.sideOverlapGuaranteedMin!).toBeLessThan(0.5);
    expect(withEnvelope.summary.overlapEnvelope?.crabDegMax).toBeGreaterThan(0);
  });

  it('names as worst status of a line the worst of its stations, and "meets" only when none is flagged', () => {
    for (const [i, r] of lineRows(resultOverview(result).lines).entries()) {
      const statuses = result.lines[i].stations.map(stationStatus);
      expect(statuses).toContain(r.worst);
      expect(r.worst === 'meets').toBe(r.flagged === 0);
      for (const st of statuses) expect(stationStatuses.indexOf(st)).toBeGreaterThanOrEqual(stationStatuses.indexOf(r.worst));
    }
  });

  it('puts each line median between its minimum and maximum and numbers lines from 1 in flying order', () => {
    for (const [i, r] of lineRows(resultOverview(result).lines).entries()) {
      expect(r.number).toBe(i + 1);
      if (r.gsdMedianCm !== null) {
        expect(r.gsdMedianCm).toBeGreaterThanOrEqual(r.gsdMinCm!);
        expect(r.gsdMedianCm).toBeLessThanOrEqual(r.gsdMaxCm!);
      }
    }
  });
});

describe('sortLineRows', () => {
  const row = (number: number, lengthM: number, gsdMinCm: number | null): LineRow => ({
    index: number - 1, number, lengthM, photos: 1, gsdMinCm, gsdMedianCm: null, gsdMaxCm: null, forwardOverlapMin: null,
    sideOverlapMin: null, forwardOverlapGuaranteedMin: null, sideOverlapGuaranteedMin: null, aglMinM: null, legs: 1, flagged: 0, worst: 'meets', warnings: number === 2 ? ['x', 'y'] : [],
  });
  const rows = [row(1, 300, 2.9), row(2, 100, null), row(3, 200, 2.8), row(4, 200, 3.1)];

  it('sorts both ways, breaking ties by flying order', () => {
    expect(sortLineRows(rows, 'lengthM', 'asc').map((r) => r.number)).toEqual([2, 3, 4, 1]);
    expect(sortLineRows(rows, 'lengthM', 'desc').map((r) => r.number)).toEqual([1, 3, 4, 2]);
    expect(sortLineRows(rows, 'warningCount', 'desc')[0].number).toBe(2);
  });

  it('keeps rows without a value last in either direction and does not mutate its input', () => {
    const copy = structuredClone(rows);
    expect(sortLineRows(rows, 'gsdMinCm', 'asc').map((r) => r.number)).toEqual([3, 1, 4, 2]);
    expect(sortLineRows(rows, 'gsdMinCm', 'desc').map((r) => r.number)).toEqual([4, 1, 3, 2]);
    expect(rows).toEqual(copy);
  });
});

describe('profileSeries', () => {
  it('puts the clearance floor exactly the clearance above the ground and the altitude at every leg end', () => {
    const line = result.lines[0];
    const p = profileSeries(line, 30, 'metric');
    const grounds = p.rows.filter((r) => r.ground !== null);
    expect(grounds).toHaveLength(line.stations.filter((s) => s.groundM !== null).length);
    for (const r of grounds) expect(r.clearance! - r.ground!).toBeCloseTo(30, 9);
    expect(p.rows.filter((r) => r.altitude !== null)).toHaveLength(line.legs.length * 2);
    expect(p.legs.map((l) => l.number)).toEqual(line.legs.map((_, i) => i + 1));
    for (let i = 1; i < p.rows.length; i++) expect(p.rows[i].distance).toBeGreaterThanOrEqual(p.rows[i - 1].distance);
  });

  it('converts distances and heights to feet for imperial projects and leaves GSD in centimetres', () => {
    const line = result.lines[0];
    const m = profileSeries(line, 30, 'metric');
    const ft = profileSeries(line, 30, 'imperial');
    expect(ft.distanceDomain[1]).toBeCloseTo(m.distanceDomain[1] / 0.3048, 6);
    ft.rows.forEach((r, i) => {
      if (r.ground !== null) expect(r.ground).toBeCloseTo(m.rows[i].ground! / 0.3048, 6);
      expect(r.gsd).toBe(m.rows[i].gsd);
    });
    expect(ft.gsdDomain).toEqual(m.gsdDomain);
  });

  it('draws the height limit the maximum height above ground over the ground under each photo, and never above an altitude the engine capped there', () => {
    const line = result.lines[0];
    const none = profileSeries(line, 30, 'metric');
    expect(none.rows.every((r) => r.limit === null)).toBe(true);
    const p = profileSeries(line, 30, 'metric', 120);
    const grounds = p.rows.filter((r) => r.ground !== null);
    for (const r of grounds) expect(r.limit! - r.ground!).toBeCloseTo(120, 9);
    // the engine's own figure per station: height above ground never beyond the limit unless flagged above-max-agl
    for (const s of line.stations) if (s.aglM !== null && !s.flags.some((f) => f.code === 'above-max-agl')) expect(s.aglM).toBeLessThanOrEqual(120 + 1e-6);
    for (const r of p.rows) if (r.limit !== null) expect(r.limit).toBeLessThanOrEqual(p.heightDomain[1]);
    const ft = profileSeries(line, 30, 'imperial', 120);
    ft.rows.forEach((r, i) => {
      if (r.limit !== null) expect(r.limit).toBeCloseTo(p.rows[i].limit! / 0.3048, 6);
    });
  });

  it('keeps every plotted value inside the axis domains', () => {
    for (const line of result.lines) {
      const p = profileSeries(line, 30, 'metric');
      for (const r of p.rows) {
        for (const v of [r.ground, r.altitude, r.clearance]) if (v !== null) expect(v).toBeGreaterThanOrEqual(p.heightDomain[0]), expect(v).toBeLessThanOrEqual(p.heightDomain[1]);
        if (r.gsd !== null) expect(r.gsd).toBeGreaterThanOrEqual(p.gsdDomain[0]), expect(r.gsd).toBeLessThanOrEqual(p.gsdDomain[1]);
      }
    }
  });
});

describe('niceDomain', () => {
  it('steps in the 1-2-5 series and widens the range to whole steps', () => {
    expect(niceStep(0.07)).toBeCloseTo(0.1, 12);
    expect(niceStep(23)).toBe(50);
    expect(niceStep(1.5)).toBe(2);
    expect(niceDomain(337.2, 488.9)).toEqual([300, 500]);
    const [lo, hi] = niceDomain(2.93, 3.34);
    expect(lo).toBeCloseTo(2.9, 12);
    expect(hi).toBeCloseTo(3.4, 12);
  });
});

import { describe, expect, it } from 'vitest';
import { normaliseDeg, planFlightLines, pointAlong, polygonToLocal, type LocalPolygon } from '../../terrain/lines';
import { TerrainError } from '../../terrain/errors';

const rect = (x0: number, y0: number, x1: number, y1: number): LocalPolygon => [[[x0, y0], [x1, y0], [x1, y1], [x0, y1], [x0, y0]]];

describe('planFlightLines', () => {
  it('lays parallel lines at the spacing, centred so the outer ones sit at most half a spacing inside the edges', () => {
    const lines = planFlightLines(rect(-500, -500, 500, 500), { headingDeg: 0, lineSpacingM: 100, triggerDistanceM: 40, runInM: 0 });
    expect(lines).toHaveLength(10);
    const xs = lines.map((l) => l.start[0]).sort((a, b) => a - b);
    xs.forEach((x, i) => expect(x).toBeCloseTo(-450 + 100 * i, 9));
    for (const l of lines) {
      expect(l.start[0]).toBeCloseTo(l.end[0], 9); // heading 0: lines run north-south
      expect(l.areaEndM - l.areaStartM).toBeCloseTo(1000, 6);
    }
  });

  it('alternates the flying direction and orders the rows across the area (back and forth)', () => {
    const lines = planFlightLines(rect(0, 0, 800, 400), { headingDeg: 90, lineSpacingM: 100, triggerDistanceM: 50, runInM: 30 });
    expect(lines.map((l) => l.headingDeg)).toEqual([90, 270, 90, 270]);
    for (let i = 1; i < lines.length; i++) {
      expect(Math.abs(lines[i].offsetM - lines[i - 1].offsetM)).toBeCloseTo(100, 9);
      // each line starts near where the last one ended
      expect(Math.abs(lines[i].start[0] - lines[i - 1].end[0])).toBeLessThan(1e-6);
    }
    expect(lines.map((l) => l.index)).toEqual([0, 1, 2, 3]);
  });

  it('places stations exactly one trigger distance apart, covering the area, with the run-in before and after', () => {
    const [l] = planFlightLines(rect(0, 0, 1000, 50), { headingDeg: 90, lineSpacingM: 100, triggerDistanceM: 30, runInM: 25 });
    const s = [...l.stationsM];
    expect(s.length).toBe(Math.ceil(1000 / 30) + 1);
    for (let i = 1; i < s.length; i++) expect(s[i] - s[i - 1]).toBeCloseTo(30, 9);
    expect(s[0]).toBeCloseTo(25, 9);
    expect(l.lengthM - s[s.length - 1]).toBeCloseTo(25, 9);
    expect(s[0]).toBeLessThanOrEqual(l.areaStartM + 1e-9);
    expect(s[s.length - 1]).toBeGreaterThanOrEqual(l.areaEndM - 1e-9);
    expect(l.lengthM).toBeCloseTo((s.length - 1) * 30 + 50, 9);
  });

  it('splits a line that crosses a concave area twice, and merges pieces closer than two run-ins', () => {
    // a U: two arms 0..200 and 800..1000 wide, joined along the south edge
    const u: LocalPolygon = [[[0, 0], [1000, 0], [1000, 1000], [800, 1000], [800, 200], [200, 200], [200, 1000], [0, 1000], [0, 0]]];
    const split = planFlightLines(u, { headingDeg: 90, lineSpacingM: 100, triggerDistanceM: 50, runInM: 20 });
    const northRows = split.filter((l) => Math.abs(pointAlong(l, l.lengthM / 2)[1] - 600) < 400 || l.start[1] > 200);
    expect(split.length).toBeGreaterThan(10);
    expect(northRows.some((l) => l.areaEndM - l.areaStartM < 250)).toBe(true); // pieces over one arm only
    const merged = planFlightLines(u, { headingDeg: 90, lineSpacingM: 100, triggerDistanceM: 50, runInM: 400 });
    expect(merged.length).toBe(10); // gap 600 m < 2 x 400 m: one line per row
  });

  it('starts at the line end nearest the takeoff point', () => {
    const area = rect(0, 0, 1000, 1000);
    for (const takeoff of [[-50, -50], [1050, -50], [-50, 1050], [1050, 1050]] as Array<[number, number]>) {
      const [first] = planFlightLines(area, { headingDeg: 0, lineSpacingM: 100, triggerDistanceM: 50, runInM: 10, takeoff });
      expect(Math.hypot(first.start[0] - takeoff[0], first.start[1] - takeoff[1])).toBeLessThan(130);
    }
  });

  it('throws invalid-input on a bad spacing, trigger distance or too many lines', () => {
    const area = rect(0, 0, 100, 100);
    expect(() => planFlightLines(area, { headingDeg: 0, lineSpacingM: 0, triggerDistanceM: 10 })).toThrow(TerrainError);
    expect(() => planFlightLines(area, { headingDeg: 0, lineSpacingM: 10, triggerDistanceM: -1 })).toThrow(/trigger distance/);
    expect(() => planFlightLines(rect(0, 0, 1e6, 10), { headingDeg: 90, lineSpacingM: 0.1, triggerDistanceM: 10, maxLines: 50 })).toThrow(/50|flight lines/);
  });

  it('does not mutate its inputs', () => {
    const area = rect(0, 0, 300, 300);
    const copy = JSON.parse(JSON.stringify(area));
    planFlightLines(area, { headingDeg: 33, lineSpacingM: 40, triggerDistanceM: 20, takeoff: [0, 0] });
    expect(area).toEqual(copy);
  });
});

describe('helpers', () => {
  it('normalise angles to [0, 360) and project polygons ring by ring', () => {
    expect(normaliseDeg(-90)).toBe(270);
    expect(normaliseDeg(720)).toBe(0);
    const p = polygonToLocal({ type: 'Polygon', coordinates: [[[1, 2], [3, 4], [5, 6], [1, 2]]] }, (lon, lat) => [lon * 10, lat * 10]);
    expect(p).toEqual([[[10, 20], [30, 40], [50, 60], [10, 20]]]);
  });
});

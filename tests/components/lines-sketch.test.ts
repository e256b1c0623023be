/**
 * The leg sheet's sketch of lines and takeoff (components/flights/lines-sketch.ts): drawn distances and directions
 * checked against GeographicLib's geodesics (the npm package geographiclib-geodesic, Karney's algorithms), the
 * sketch north up and kept to its box.
 */
import { Geodesic } from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { linesSketch } from '../../components/flights/lines-sketch';

const geod = Geodesic.WGS84;
/** A point `distanceM` from `from` towards `azimuthDeg` (clockwise from true north), by GeographicLib's direct problem. */
function go(from: { lon: number; lat: number }, azimuthDeg: number, distanceM: number) {
  const r = geod.Direct(from.lat, from.lon, azimuthDeg, distanceM);
  return { lon: r.lon2 as number, lat: r.lat2 as number };
}

describe('the sketch of lines and takeoff', () => {
  // Six parallel 600 m lines heading 030° true, 40 m apart, at 54.5° N (a hill-country latitude).
  const takeoff = { lon: -2.9, lat: 54.5 };
  const origin = go(takeoff, 120, 150);
  const lines = Array.from({ length: 6 }, (_, i) => {
    const start = go(origin, 120, i * 40);
    return { number: i + 1, start, end: go(start, 30, 600) };
  });
  const sketch = linesSketch(lines, takeoff, { widthPx: 320, heightPx: 240, marginPx: 16 });

  it('keeps ground distances in proportion: each drawn line is its geodesic length at the sketch scale (0.5 %)', () => {
    for (const [i, l] of sketch.lines.entries()) {
      const g = geod.Inverse(lines[i]!.start.lat, lines[i]!.start.lon, lines[i]!.end.lat, lines[i]!.end.lon);
      const drawnM = Math.hypot(l.x2 - l.x1, l.y2 - l.y1) * sketch.metresPerPx;
      expect(Math.abs(drawnM - (g.s12 as number)) / (g.s12 as number)).toBeLessThan(0.005);
    }
    // Takeoff to the first line's start: 150 m towards 120°.
    const first = sketch.lines[0]!;
    expect(Math.hypot(first.x1 - sketch.takeoff.x, first.y1 - sketch.takeoff.y) * sketch.metresPerPx).toBeCloseTo(150, -0.5);
  });

  it('is north up: a line heading 030° true is drawn at 030° from the top of the sketch (within 0.3°)', () => {
    for (const l of sketch.lines) {
      const drawnDeg = (Math.atan2(l.x2 - l.x1, -(l.y2 - l.y1)) * 180) / Math.PI;
      expect(Math.abs(drawnDeg - 30)).toBeLessThan(0.3);
    }
  });

  it('fits inside the box, margins kept, and offers a scale bar in round steps that matches its label', () => {
    const xs = [sketch.takeoff.x, ...sketch.lines.flatMap((l) => [l.x1, l.x2])];
    const ys = [sketch.takeoff.y, ...sketch.lines.flatMap((l) => [l.y1, l.y2])];
    expect(Math.min(...xs)).toBeGreaterThanOrEqual(16 - 1e-9);
    expect(Math.max(...xs)).toBeLessThanOrEqual(320 - 16 + 1e-9);
    expect(Math.min(...ys)).toBeGreaterThanOrEqual(16 - 1e-9);
    expect(Math.max(...ys)).toBeLessThanOrEqual(240 - 16 + 1e-9);
    expect(sketch.scale.lengthPx * sketch.metresPerPx).toBeCloseTo(sketch.scale.lengthM, 6);
    expect(sketch.scale.label).toMatch(/^(1|2|5)(0*) (m|km)$/);
  });

  it('draws a single takeoff point with no lines without dividing by zero', () => {
    const only = linesSketch([], takeoff, { widthPx: 200, heightPx: 100, marginPx: 10 });
    expect(only.takeoff).toEqual({ x: 100, y: 50 });
    expect(only.metresPerPx).toBe(1);
  });
});

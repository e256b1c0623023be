import { describe, expect, it } from 'vitest';
import { placeTriggers } from '../../terrain/solve-triggers';
import type { FlightLine } from '../../terrain/lines';
import type { LocalHeights } from '../../terrain/local-frame';

/** Ground of a local frame given by a function (NaN-free), as the sampler the solver gets. */
function heightsOf(h: (x: number, y: number) => number): LocalHeights {
  return {
    heightAt: h,
    sampleMany: (xs: Float64Array, ys: Float64Array, out: Float64Array) => { for (let i = 0; i < xs.length; i++) out[i] = h(xs[i], ys[i]); return xs.length; },
  } as unknown as LocalHeights;
}

describe('photo spacing along a line', () => {
  it('follows (1 − overlap) · 2 · tan(half-angle − pitch) · height above the highest ground under the photo, tighter over a hill', () => {
    // a 1 km line flown north along x = 0 at 400 m; ground 300 m, with a 50 m high, 200 m wide plateau from 400 to 600 m along
    const ground = (_x: number, y: number) => (y >= 400 && y <= 600 ? 350 : 300);
    const line: FlightLine = { index: 0, headingDeg: 0, offsetM: 0, start: [0, 0], end: [0, 1000], lengthM: 1000, areaStartM: 20, areaEndM: 980, stationsM: new Float64Array() };
    const x = Float64Array.from({ length: 501 }, (_, i) => i * 2);
    const z = new Float64Array(x.length).fill(400);
    // along half-angle of an 8.8 mm sensor side behind an 8.8 mm lens: atan(0.5); 5° of pitch
    const tanAlong = Math.tan(Math.atan(0.5) - (5 * Math.PI) / 180);
    const t = placeTriggers(line, x, z, heightsOf(ground), { belowM: 40, aboveM: 40 }, tanAlong, 0.6, 80);
    const st = Array.from(t.stationsM);
    const gaps = st.slice(1).map((s, i) => s - st[i]);
    const flat = 0.4 * 2 * tanAlong * 100, high = 0.4 * 2 * tanAlong * 50;
    // far from the plateau (more than half a footprint, 40 m) the spacing is the flat-ground figure; over it, the plateau's
    const at = (d: number) => gaps[st.findIndex((s, i) => s <= d && st[i + 1] > d)];
    expect(at(150)).toBeCloseTo(flat, 6);
    expect(at(500)).toBeCloseTo(high, 6);
    expect(at(850)).toBeCloseTo(flat, 6);
    expect(t.minM).toBeCloseTo(high, 6);
    expect(t.maxM).toBeCloseTo(flat, 6);
    expect(t.tightestGroundM).toBe(350);
    // every point of the area is covered: the first photo at most half a spacing before the area, the last past its end
    expect(st[0]).toBeLessThanOrEqual(line.areaStartM);
    expect(st[st.length - 1]).toBeGreaterThanOrEqual(line.areaEndM);
    // no step is longer than the spacing the highest ground it spans allows (so no pair falls under the overlap)
    for (let i = 0; i < gaps.length; i++) {
      const spansPlateau = st[i + 1] >= 400 - 40 && st[i] <= 600 + 40;
      expect(gaps[i]).toBeLessThanOrEqual((spansPlateau ? high : flat) + 1e-9);
    }
  });
});

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { stationOverlaps, type LinePhotos } from '../../terrain/overlap';
import { planFlightLines, pointAlong } from '../../terrain/lines';
import { localFrameFor, localHeights } from '../../terrain/local-frame';
import { airBaseM, gsdCm, lineSpacingM } from '../../terrain/gsd';
import { ONE_INCH, lonLatOf, utmGrid } from './plan-fixtures';

// one rugged UTM grid (33N, 1 m pixels) shared by the runs: ridges and valleys up to ~120 m of relief
const grid = utmGrid({ width: 700, height: 700, f: (x, y) => 300 + 45 * Math.sin(x / 70) * Math.cos(y / 95) + 30 * Math.sin((x + 2 * y) / 40) + 0.05 * x });
const [lon, lat] = lonLatOf(grid, 350, 350);
const frame = localFrameFor(lon, lat);
const { heightAt } = localHeights(grid, frame);

function photosFor(headingDeg: number, H: number, fwd: number, side: number, altitude: (x: number, y: number, i: number) => number): LinePhotos[] {
  const area = [[[-120, -120], [120, -120], [120, 120], [-120, 120], [-120, -120]]] as Array<Array<[number, number]>>;
  const lines = planFlightLines(area, { headingDeg, lineSpacingM: lineSpacingM(ONE_INCH, H, side), triggerDistanceM: airBaseM(ONE_INCH, H, fwd), runInM: 0 });
  const offsets = [...new Set(lines.map((l) => l.offsetM))].sort((a, b) => a - b);
  return lines.map((l) => {
    const n = l.stationsM.length;
    const x = new Float64Array(n), y = new Float64Array(n), alt = new Float64Array(n);
    for (let i = 0; i < n; i++) { [x[i], y[i]] = pointAlong(l, l.stationsM[i]); alt[i] = altitude(x[i], y[i], i); }
    return { headingDeg: l.headingDeg, row: offsets.indexOf(l.offsetM), x, y, altitudeM: alt };
  });
}

const targets = (H: number) => ({ forwardOverlap: 0.8, sideOverlap: 0.7, gsdMinCm: 0, gsdMaxCm: 100, maxAglM: 500, clearanceM: 0, plannedHeightM: H });

describe('station overlaps (properties)', () => {
  it('stay in [0, 1] over rugged ground at any heading and any altitudes above it', () => {
    fc.assert(fc.property(
      fc.double({ min: 0, max: 179, noNaN: true }), fc.double({ min: 30, max: 150, noNaN: true }),
      fc.double({ min: 0, max: 0.9, noNaN: true }), fc.double({ min: 0, max: 0.9, noNaN: true }), fc.integer({ min: 0, max: 1000 }),
      (heading, H, fwd, side, seed) => {
        const photos = photosFor(heading, H, fwd, side, (x, y, i) => heightAt(x, y) + 10 + ((seed * 7919 + i * 104729) % 200));
        for (const line of stationOverlaps(ONE_INCH, heightAt, photos, heading, targets(H))) {
          for (const s of line) {
            for (const v of [s.forwardOverlap, s.sideOverlap]) if (v !== null) { expect(v).toBeGreaterThanOrEqual(0); expect(v).toBeLessThanOrEqual(1); }
          }
        }
      }), { numRuns: 40 });
  });

  it('change nothing when ground and aircraft are raised together by a constant', () => {
    fc.assert(fc.property(fc.double({ min: 0, max: 179, noNaN: true }), fc.double({ min: 40, max: 120, noNaN: true }), fc.integer({ min: -200, max: 2000 }), (heading, H, dz) => {
      const base = photosFor(heading, H, 0.8, 0.7, (x, y) => heightAt(x, y) + H);
      const up = base.map((l) => ({ ...l, altitudeM: l.altitudeM.map((v) => v + dz) }));
      const a = stationOverlaps(ONE_INCH, heightAt, base, heading, targets(H));
      const b = stationOverlaps(ONE_INCH, (x, y) => heightAt(x, y) + dz, up, heading, targets(H));
      a.forEach((line, li) => line.forEach((s, i) => {
        const t = b[li][i];
        expect(t.gsdCm!).toBeCloseTo(s.gsdCm!, 6);
        if (s.forwardOverlap !== null) expect(t.forwardOverlap!).toBeCloseTo(s.forwardOverlap, 6);
        if (s.sideOverlap !== null) expect(t.sideOverlap!).toBeCloseTo(s.sideOverlap, 6);
      }));
    }), { numRuns: 25 });
  });

  it('equal the flat-ground formulas over a flat grid for any height and overlaps', () => {
    const flat = utmGrid({ width: 500, height: 500, f: () => 123.5 });
    const [fl, fb] = lonLatOf(flat, 250, 250);
    const fh = localHeights(flat, localFrameFor(fl, fb)).heightAt;
    fc.assert(fc.property(fc.double({ min: 0, max: 179, noNaN: true }), fc.double({ min: 20, max: 120, noNaN: true }), fc.double({ min: 0.3, max: 0.9, noNaN: true }), fc.double({ min: 0.3, max: 0.9, noNaN: true }), (heading, H, fwd, side) => {
      const photos = photosFor(heading, H, fwd, side, () => 123.5 + H);
      for (const line of stationOverlaps(ONE_INCH, fh, photos, heading, targets(H))) {
        line.forEach((s, i) => {
          expect(s.gsdCm!).toBeCloseTo(gsdCm(ONE_INCH, H), 9);
          if (i > 0) expect(s.forwardOverlap!).toBeCloseTo(fwd, 6);
          if (s.sideOverlap !== null) expect(s.sideOverlap).toBeCloseTo(side, 6);
        });
      }
    }), { numRuns: 40 });
  });
});

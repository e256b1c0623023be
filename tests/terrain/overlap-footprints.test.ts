import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { stationOverlaps } from '../../terrain/overlap';
import { camera, footprintRing, steepHeightAt, steepLine } from '../fixtures/overlap/steep-setup';

// Forward overlaps of the ray-cast footprints on a 35° cross-slope (invented terrain), by shapely 1.8.5 / GEOS 3.11.1
// (Debian python3-shapely): tests/fixtures/overlap/dump-footprints.ts wrote the footprints, shapely-overlap.py the values
const ref = JSON.parse(readFileSync(new URL('../fixtures/overlap/reference.json', import.meta.url), 'utf8'));
const rings = JSON.parse(readFileSync(new URL('../fixtures/overlap/footprints.json', import.meta.url), 'utf8')).rings;
const T = { forwardOverlap: 0.8, sideOverlap: 0.7, gsdMinCm: 0, gsdMaxCm: 100, maxAglM: 1000, clearanceM: 0, plannedHeightM: 120 };

describe('forward overlap on a steep cross-slope, against shapely', () => {
  const heightAt = steepHeightAt();
  const line = steepLine();
  const res = stationOverlaps(camera, heightAt, [line], 0, T)[0];

  it('casts the same footprints that shapely intersected', () => {
    for (const s of [0, 5, 11]) {
      const ring = footprintRing(heightAt, line, s);
      ring.forEach(([x, y], k) => {
        expect(x).toBeCloseTo(rings[s][k][0], 6);
        expect(y).toBeCloseTo(rings[s][k][1], 6);
      });
    }
  });

  it('reports the least overlap across the footprint: within 0.01 of shapely\'s and never above it, never above the shared-area figure', () => {
    expect(ref.pairs).toHaveLength(11);
    let worstBelow = 0;
    for (const p of ref.pairs) {
      const ours = res[p.photo].forwardOverlap!;
      expect(ours, `photo ${p.photo}`).toBeLessThanOrEqual(p.least); // never optimistic
      expect(ours, `photo ${p.photo}`).toBeLessThanOrEqual(p.area); // the shared area overstates the weak side
      worstBelow = Math.max(worstBelow, p.least - ours);
    }
    // the engine finds the exact least of its 8-segment edge polylines, shapely samples 201 ground lines of the
    // 16-ray footprints: within 0.01 on the safe side (measured 0.0005 at photo 9)
    expect(worstBelow).toBeLessThan(0.01);
  });

  it('flags the photos whose least overlap is under the target, as shapely\'s figures say they are', () => {
    for (const p of ref.pairs) {
      const flagged = res[p.photo].flags.some((f) => f.code === 'forward-overlap-low');
      if (p.least < T.forwardOverlap - 0.01) expect(flagged, `photo ${p.photo}`).toBe(true);
    }
  });
});

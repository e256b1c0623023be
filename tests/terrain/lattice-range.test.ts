import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { heightLattice } from '../../terrain/occlusion';
import { latticeMax, latticeRange, maxRuns, rangeBlocks } from '../../terrain/lattice-range';

/** The plain scan latticeRange stands for: every node inside the box, unknown (NaN) nodes skipped. */
function scan(L: ReturnType<typeof heightLattice>, box: [number, number, number, number]): [number, number] {
  const i0 = Math.max(0, Math.floor((box[0] - L.x0) / L.stepM)), i1 = Math.min(L.nx - 1, Math.ceil((box[2] - L.x0) / L.stepM));
  const j0 = Math.max(0, Math.floor((box[1] - L.y0) / L.stepM)), j1 = Math.min(L.ny - 1, Math.ceil((box[3] - L.y0) / L.stepM));
  let lo = Infinity, hi = -Infinity;
  for (let j = j0; j <= j1; j++) for (let i = i0; i <= i1; i++) {
    const h = L.heights[j * L.nx + i];
    if (h < lo) lo = h;
    if (h > hi) hi = h;
  }
  return [lo, hi];
}

describe('lattice range', () => {
  it('gives exactly the lowest and highest node of any box, as a scan of every node does (fixed seed)', () => {
    fc.assert(fc.property(
      fc.integer({ min: 1, max: 70 }), fc.integer({ min: 1, max: 30 }), fc.integer({ min: 0, max: 2 ** 31 - 1 }),
      fc.array(fc.tuple(fc.double({ min: -30, max: 200, noNaN: true }), fc.double({ min: -30, max: 100, noNaN: true }), fc.double({ min: 0, max: 150, noNaN: true }), fc.double({ min: 0, max: 80, noNaN: true })), { minLength: 1, maxLength: 20 }),
      (nx, ny, seed, boxes) => {
        // heights from a small LCG, about one node in eight unknown
        let r = seed;
        const next = () => { r = (r * 1103515245 + 12345) % 2 ** 31; return r / 2 ** 31; };
        const h = Float32Array.from({ length: nx * ny }, () => (next() < 0.125 ? NaN : 300 + 100 * next()));
        const L = heightLattice(-5, -5, 2, nx, ny, h);
        const R = rangeBlocks(L);
        for (const [x, y, w, d] of boxes) {
          const box: [number, number, number, number] = [x, y, x + w, y + d];
          expect(latticeRange(L, R, box)).toEqual(scan(L, box));
        }
      },
    ), { seed: 20261203, numRuns: 300 });
  });

  it('bounds the highest node of any box from above: exactly the highest node of the 4 x 4 blocks of nodes holding the box, as a scan of them gives (fixed seed)', () => {
    fc.assert(fc.property(
      fc.integer({ min: 1, max: 90 }), fc.integer({ min: 1, max: 40 }), fc.integer({ min: 0, max: 2 ** 31 - 1 }),
      fc.array(fc.tuple(fc.double({ min: -30, max: 200, noNaN: true }), fc.double({ min: -30, max: 100, noNaN: true }), fc.double({ min: 0, max: 150, noNaN: true }), fc.double({ min: 0, max: 80, noNaN: true })), { minLength: 1, maxLength: 20 }),
      (nx, ny, seed, boxes) => {
        let r = seed;
        const next = () => { r = (r * 1103515245 + 12345) % 2 ** 31; return r / 2 ** 31; };
        const h = Float32Array.from({ length: nx * ny }, () => (next() < 0.125 ? NaN : 300 + 100 * next()));
        const L = heightLattice(-5, -5, 2, nx, ny, h);
        const M = maxRuns(L);
        for (const [x, y, w, d] of boxes) {
          const box: [number, number, number, number] = [x, y, x + w, y + d];
          const got = latticeMax(L, M, box), exact = scan(L, box)[1];
          expect(got).toBeGreaterThanOrEqual(exact);
          // the blocks of 4 x 4 nodes holding the box's nodes, scanned node by node
          const i0 = Math.max(0, Math.floor((box[0] - L.x0) / L.stepM)), i1 = Math.min(L.nx - 1, Math.ceil((box[2] - L.x0) / L.stepM));
          const j0 = Math.max(0, Math.floor((box[1] - L.y0) / L.stepM)), j1 = Math.min(L.ny - 1, Math.ceil((box[3] - L.y0) / L.stepM));
          let blocks = -Infinity;
          if (i0 <= i1 && j0 <= j1) {
            for (let j = 4 * Math.floor(j0 / 4); j < Math.min(L.ny, 4 * Math.floor(j1 / 4) + 4); j++) {
              for (let i = 4 * Math.floor(i0 / 4); i < Math.min(L.nx, 4 * Math.floor(i1 / 4) + 4); i++) if (h[j * nx + i] > blocks) blocks = h[j * nx + i];
            }
          }
          expect(got).toBe(blocks);
        }
      },
    ), { seed: 20261203, numRuns: 300 });
  });
});

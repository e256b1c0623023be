/** Lowest and highest lattice height inside a box, fast: per lattice row, the range of each run of nodes kept once. */
import type { HeightLattice } from './occlusion';

/** Nodes per run of a lattice row whose lowest and highest height `rangeBlocks` keeps. */
const RUN = 16;

/** Per lattice row, the lowest and highest known height of each run of RUN nodes (+Infinity / -Infinity when none is known). */
export interface RangeBlocks { runs: number; lo: Float32Array; hi: Float32Array }

export function rangeBlocks(L: HeightLattice): RangeBlocks {
  const runs = Math.ceil(L.nx / RUN);
  const lo = new Float32Array(runs * L.ny).fill(Infinity), hi = new Float32Array(runs * L.ny).fill(-Infinity);
  for (let j = 0; j < L.ny; j++) {
    for (let i = 0; i < L.nx; i++) {
      const h = L.heights[j * L.nx + i], b = j * runs + Math.floor(i / RUN);
      if (h < lo[b]) lo[b] = h;
      if (h > hi[b]) hi[b] = h;
    }
  }
  return { runs, lo, hi };
}

/**
 * Lowest and highest known lattice height inside a local box: every node of the box's rows, whole runs of a row
 * from `rangeBlocks` (exactly the same figures as reading each node, at a fraction of the reads).
 */
export function latticeRange(L: HeightLattice, R: RangeBlocks, box: [number, number, number, number]): [number, number] {
  const i0 = Math.max(0, Math.floor((box[0] - L.x0) / L.stepM)), i1 = Math.min(L.nx - 1, Math.ceil((box[2] - L.x0) / L.stepM));
  const j0 = Math.max(0, Math.floor((box[1] - L.y0) / L.stepM)), j1 = Math.min(L.ny - 1, Math.ceil((box[3] - L.y0) / L.stepM));
  let lo = Infinity, hi = -Infinity;
  // the whole runs inside [i0, i1], and the nodes before and after them
  const r0 = Math.ceil(i0 / RUN), r1 = Math.floor((i1 + 1) / RUN) - 1;
  const headEnd = r0 <= r1 ? r0 * RUN - 1 : i1, tailStart = r0 <= r1 ? (r1 + 1) * RUN : i1 + 1;
  for (let j = j0; j <= j1; j++) {
    const row = j * L.nx;
    for (let i = i0; i <= headEnd; i++) {
      const h = L.heights[row + i];
      if (h < lo) lo = h;
      if (h > hi) hi = h;
    }
    const rb = j * R.runs;
    for (let r = r0; r <= r1; r++) {
      const a = R.lo[rb + r], b = R.hi[rb + r];
      if (a < lo) lo = a;
      if (b > hi) hi = b;
    }
    for (let i = tailStart; i <= i1; i++) {
      const h = L.heights[row + i];
      if (h < lo) lo = h;
      if (h > hi) hi = h;
    }
  }
  return [lo, hi];
}

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

/** Lattice nodes per side of the blocks `maxRuns` keeps the highest height of. */
const MAX_BLOCK = 4;

/**
 * The highest known height of each MAX_BLOCK x MAX_BLOCK block of lattice nodes (-Infinity when none is known),
 * and along each row of blocks the highest over runs of 2^k blocks (level k from block i, row-major per level):
 * any run of a row is the union of two of them, so `latticeMax` reads two values per row of blocks.
 */
export interface MaxRuns { bnx: number; bny: number; levels: Float32Array[] }

export function maxRuns(L: HeightLattice): MaxRuns {
  const bnx = Math.ceil(L.nx / MAX_BLOCK), bny = Math.ceil(L.ny / MAX_BLOCK);
  const first = new Float32Array(bnx * bny).fill(-Infinity);
  for (let j = 0; j < L.ny; j++) {
    const row = Math.floor(j / MAX_BLOCK) * bnx;
    for (let i = 0; i < L.nx; i++) {
      const h = L.heights[j * L.nx + i], b = row + Math.floor(i / MAX_BLOCK);
      if (h > first[b]) first[b] = h;
    }
  }
  const levels = [first];
  for (let w = 1; 2 * w <= bnx; w *= 2) {
    const prev = levels[levels.length - 1], next = new Float32Array(bnx * bny).fill(-Infinity);
    for (let j = 0; j < bny; j++) for (let i = 0; i + 2 * w <= bnx; i++) next[j * bnx + i] = Math.max(prev[j * bnx + i], prev[j * bnx + i + w]);
    levels.push(next);
  }
  return { bnx, bny, levels };
}

/**
 * At least the highest known node `latticeRange` reads for a box, and at most the highest within MAX_BLOCK − 1 nodes
 * of those (the blocks holding them): a bound for the ground over the box in a few reads, -Infinity when nothing is
 * known there.
 */
export function latticeMax(L: HeightLattice, M: MaxRuns, box: readonly [number, number, number, number]): number {
  const i0 = Math.max(0, Math.floor((box[0] - L.x0) / L.stepM)), i1 = Math.min(L.nx - 1, Math.ceil((box[2] - L.x0) / L.stepM));
  const j0 = Math.max(0, Math.floor((box[1] - L.y0) / L.stepM)), j1 = Math.min(L.ny - 1, Math.ceil((box[3] - L.y0) / L.stepM));
  let hi = -Infinity;
  if (!(i0 <= i1 && j0 <= j1)) return hi;
  const b0 = Math.floor(i0 / MAX_BLOCK), b1 = Math.floor(i1 / MAX_BLOCK);
  let k = 0;
  while (2 << k <= b1 - b0 + 1) k++;
  const level = M.levels[k], w = 1 << k;
  for (let c = Math.floor(j0 / MAX_BLOCK); c <= Math.floor(j1 / MAX_BLOCK); c++) {
    const a = level[c * M.bnx + b0], b = level[c * M.bnx + b1 - w + 1];
    if (a > hi) hi = a;
    if (b > hi) hi = b;
  }
  return hi;
}

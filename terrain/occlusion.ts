/** Terrain occlusion along viewing rays: a height lattice in the local frame, block maxima, and a march from the ground point towards the camera. */

/** Heights on a regular lattice of the local frame (node i, j at x0 + i·step, y0 + j·step), with block maxima for skipping clear air. */
export interface HeightLattice {
  x0: number;
  y0: number;
  stepM: number;
  /**
   * 1 / stepM where that is exact, stepM a power of two (1 m, 2 m, 0.5 m …): multiplying by it is then dividing
   * by stepM to the bit, at a fraction of the cost in the march; 0 otherwise (divide).
   */
  perStep: number;
  nx: number;
  ny: number;
  /** Row-major heights (index j * nx + i), NaN where unknown. */
  heights: Float32Array;
  /** Highest known height of the lattice. */
  maxM: number;
  minM: number;
  block: number;
  bnx: number;
  bny: number;
  /** Highest height of each block of `block` x `block` cells (its nodes and the next row/column), -Infinity when none is known. */
  blockMax: Float32Array;
  /**
   * Steepest rise of the bilinear surface in any direction within each block (metres per metre): a bound from the
   * cells' edge differences; Infinity where a cell of the block has an unknown node (ground beyond a void may stand
   * at any height, so no rise across it is bounded).
   */
  blockSlope: Float32Array;
  /**
   * Along each row of blocks, the steepest rise over runs of 2^k blocks (level k starting at block i, row-major
   * per level): any run of a row is the union of two of them, so `slopeIn` reads two values per row.
   */
  slopeRuns: Float32Array[];
}

/** Lattice cells per block side: a power of two (`occludedRay` multiplies by its inverse). */
const BLOCK = 8;

/** Build a lattice from heights already sampled at its nodes (block maxima worked out here). */
export function heightLattice(x0: number, y0: number, stepM: number, nx: number, ny: number, heights: Float32Array): HeightLattice {
  let maxM = -Infinity, minM = Infinity;
  for (let i = 0; i < heights.length; i++) { const h = heights[i]; if (h > maxM) maxM = h; if (h < minM) minM = h; }
  const bnx = Math.ceil(nx / BLOCK), bny = Math.ceil(ny / BLOCK);
  const blockMax = new Float32Array(bnx * bny).fill(-Infinity);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const h = heights[j * nx + i];
      if (!(h === h)) continue;
      // a node bounds the cells on both sides of it: it counts for the block it starts and the one it ends
      const bi = Math.floor(i / BLOCK), bj = Math.floor(j / BLOCK);
      for (let dj = 0; dj <= (j % BLOCK === 0 && bj > 0 ? 1 : 0); dj++) {
        for (let di = 0; di <= (i % BLOCK === 0 && bi > 0 ? 1 : 0); di++) {
          const b = (bj - dj) * bnx + (bi - di);
          if (h > blockMax[b]) blockMax[b] = h;
        }
      }
    }
  }
  // on one bilinear cell ∂h/∂x is a blend of its two x edges' differences (and ∂h/∂y of its y edges'), so
  // |∇h| ≤ √(max|Δx|² + max|Δy|²) / step there; the surface is continuous, so this bounds every rise through the
  // block, unless a cell of it has an unknown node
  const blockSlope = new Float32Array(bnx * bny);
  for (let j = 0; j + 1 < ny; j++) {
    for (let i = 0; i + 1 < nx; i++) {
      const a = heights[j * nx + i], b = heights[j * nx + i + 1], c = heights[(j + 1) * nx + i], d = heights[(j + 1) * nx + i + 1];
      if (!(a === a && b === b && c === c && d === d)) { blockSlope[Math.floor(j / BLOCK) * bnx + Math.floor(i / BLOCK)] = Infinity; continue; }
      const gx = Math.max(Math.abs(b - a), Math.abs(d - c)), gy = Math.max(Math.abs(c - a), Math.abs(d - b));
      const g = Math.sqrt(gx * gx + gy * gy) / stepM;
      const k = Math.floor(j / BLOCK) * bnx + Math.floor(i / BLOCK);
      if (g > blockSlope[k]) blockSlope[k] = g;
    }
  }
  const slopeRuns = [blockSlope];
  for (let w = 1; 2 * w <= bnx; w *= 2) {
    const prev = slopeRuns[slopeRuns.length - 1], next = new Float32Array(bnx * bny);
    for (let j = 0; j < bny; j++) for (let i = 0; i + 2 * w <= bnx; i++) next[j * bnx + i] = Math.max(prev[j * bnx + i], prev[j * bnx + i + w]);
    slopeRuns.push(next);
  }
  const perStep = stepM > 0 && 2 ** Math.round(Math.log2(stepM)) === stepM ? 1 / stepM : 0;
  return { x0, y0, stepM, perStep, nx, ny, heights, maxM, minM, block: BLOCK, bnx, bny, blockMax, blockSlope, slopeRuns };
}

/** The steepest rise of the lattice's surface over a local box [x0, y0, x1, y1] (block bound; 0 off the lattice). */
export function slopeIn(L: HeightLattice, box: readonly [number, number, number, number]): number {
  const span = L.block * L.stepM;
  const b0 = Math.max(0, Math.floor((box[0] - L.x0) / span)), b1 = Math.min(L.bnx - 1, Math.floor((box[2] - L.x0) / span));
  const c0 = Math.max(0, Math.floor((box[1] - L.y0) / span)), c1 = Math.min(L.bny - 1, Math.floor((box[3] - L.y0) / span));
  let g = 0;
  if (b0 > b1) return g;
  // the run b0..b1 of each row as two runs of 2^k blocks that overlap
  let k = 0;
  while (2 << k <= b1 - b0 + 1) k++;
  const level = L.slopeRuns[k], w = 1 << k;
  for (let j = c0; j <= c1; j++) {
    const a = level[j * L.bnx + b0], b = level[j * L.bnx + b1 - w + 1];
    if (a > g) g = a;
    if (b > g) g = b;
  }
  return g;
}

/** Lattice cells each way from a point within which `nearSlopes` bounds the rise of the ground. */
export const NEAR_CELLS = 4;

const nearOf = new WeakMap<HeightLattice, Float32Array>();

/**
 * Per lattice cell (index j * nx + i), the steepest rise of the bilinear surface (the bound of `blockSlope`, from
 * each cell's edge differences) over the cells at most NEAR_CELLS away each way; Infinity where one of them has
 * an unknown node (the surface is not continuous there, so no rise is bounded). Ground within NEAR_CELLS · step
 * (along either axis) of a point of cell (i, j) lies in those cells, so a ray leaving the surface at the point and
 * rising at least this fast clears every sample of the march within that distance. Worked out on first use and kept
 * with the lattice.
 */
export function nearSlopes(L: HeightLattice): Float32Array {
  const kept = nearOf.get(L);
  if (kept) return kept;
  const { nx, ny, heights: h, stepM } = L;
  // the last row and column of nodes start no cell (0); off the lattice the march ends unhidden, so no ground there counts
  const own = new Float32Array(nx * ny);
  for (let j = 0; j + 1 < ny; j++) {
    for (let i = 0; i + 1 < nx; i++) {
      const a = h[j * nx + i], b = h[j * nx + i + 1], c = h[(j + 1) * nx + i], d = h[(j + 1) * nx + i + 1];
      if (!(a === a && b === b && c === c && d === d)) { own[j * nx + i] = Infinity; continue; }
      const gx = Math.max(Math.abs(b - a), Math.abs(d - c)), gy = Math.max(Math.abs(c - a), Math.abs(d - b));
      own[j * nx + i] = Math.sqrt(gx * gx + gy * gy) / stepM;
    }
  }
  // the window's maximum, along rows then along columns
  const rows = new Float32Array(nx * ny), out = new Float32Array(nx * ny);
  const r = NEAR_CELLS;
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      let g = 0;
      for (let k = Math.max(0, i - r); k <= Math.min(nx - 1, i + r); k++) { const v = own[j * nx + k]; if (v > g) g = v; }
      rows[j * nx + i] = g;
    }
  }
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      let g = 0;
      for (let k = Math.max(0, j - r); k <= Math.min(ny - 1, j + r); k++) { const v = rows[k * nx + i]; if (v > g) g = v; }
      out[j * nx + i] = g;
    }
  }
  nearOf.set(L, out);
  return out;
}

/** Bilinear height of the lattice at local (x, y); NaN off the lattice or beside unknown nodes. */
function latticeHeight(L: HeightLattice, x: number, y: number): number {
  const fx = (x - L.x0) / L.stepM, fy = (y - L.y0) / L.stepM;
  if (!(fx >= 0 && fy >= 0 && fx <= L.nx - 1 && fy <= L.ny - 1)) return NaN;
  let i = Math.floor(fx), j = Math.floor(fy);
  if (i > L.nx - 2) i = L.nx - 2;
  if (j > L.ny - 2) j = L.ny - 2;
  if (i < 0) i = 0;
  if (j < 0) j = 0;
  const tx = fx - i, ty = fy - j;
  const o = j * L.nx + i;
  const h = L.heights;
  const a = h[o], b = h[o + 1 < h.length ? o + 1 : o], c = h[o + L.nx < h.length ? o + L.nx : o], d = h[o + L.nx + 1 < h.length ? o + L.nx + 1 : o];
  const top = a + (b - a) * tx;
  return top + (c + (d - c) * tx - top) * ty;
}

/**
 * The lattice around a point, for its ground normal and surface height: reads x, y from a[0], a[1] and writes the
 * heights at x + d, x − d, y + d, y − d (d = `a[2]`) and at the point itself into a[3..7] (as `latticeHeight`).
 */
export function heightsAround(L: HeightLattice, a: Float64Array): void {
  const x = a[0], y = a[1], d = a[2];
  const x0 = L.x0, y0 = L.y0, step = L.stepM, perStep = L.perStep, nx = L.nx, ny = L.ny, h = L.heights;
  // latticeHeight written out for the five points where each lies inside the lattice's last row and column (no
  // clamping there: the same arithmetic); a call would box the numbers it passes
  for (let k = 0; k < 5; k++) {
    const px = k === 0 ? x + d : k === 1 ? x - d : x, py = k === 2 ? y + d : k === 3 ? y - d : y;
    const fx = perStep !== 0 ? (px - x0) * perStep : (px - x0) / step, fy = perStep !== 0 ? (py - y0) * perStep : (py - y0) / step;
    if (!(fx >= 0 && fy >= 0 && fx < nx - 1 && fy < ny - 1)) {
      a[3] = latticeHeight(L, x + d, y);
      a[4] = latticeHeight(L, x - d, y);
      a[5] = latticeHeight(L, x, y + d);
      a[6] = latticeHeight(L, x, y - d);
      a[7] = latticeHeight(L, x, y);
      return;
    }
    const i = Math.floor(fx), j = Math.floor(fy), tx = fx - i, ty = fy - j, o = j * nx + i;
    const top = h[o] + (h[o + 1] - h[o]) * tx;
    a[3 + k] = top + (h[o + nx] + (h[o + nx + 1] - h[o + nx]) * tx - top) * ty;
  }
}

/**
 * True when the terrain rises above the straight line from the ground point (px, py, pz) to the camera
 * (ox, oy, oz) by more than `toleranceM` at any sample between (a ray march on the lattice: samples at whole
 * multiples of the lattice spacing along the ground, from one spacing away from the point, stopping once the ray
 * is above every height of the lattice, or above `maxM` when the caller knows the highest ground around the whole
 * ray (e.g. under a photo's box, which holds the point and the camera and so the ray); where the ray is above a
 * block's highest height it skips the samples up to the block's far side). Unknown heights never hide a point.
 * The numbers come in one array (px, py, pz, ox, oy, oz, toleranceM, maxM): a hot loop passes one reference
 * instead of eight numbers the engine would box on every call. A ninth, when given, ends the march at that
 * distance along the ground, and a tenth starts it there (where the caller has proven the rest of the ray clear:
 * `ray-clearance.ts`). The samples sit at the same whole multiples whatever the start, end and skips, so a march
 * cut short by such proofs reads the same samples as a whole one, less those proven clear.
 */
export function occludedRay(L: HeightLattice, a: Float64Array): boolean {
  const px = a[0], py = a[1], pz = a[2], ox = a[3], oy = a[4], oz = a[5], toleranceM = a[6], maxM = a[7];
  const hx = ox - px, hy = oy - py;
  const lenH = Math.sqrt(hx * hx + hy * hy);
  const end = a.length > 8 && a[8] < lenH ? a[8] : lenH;
  const step = L.stepM;
  if (lenH < step) return false;
  const ux = hx / lenH, uy = hy / lenH;
  const rise = (oz - pz) / lenH; // metres up per metre along the ground
  // the lattice's fields read once (each read of a fractional field goes through its box)
  const lx0 = L.x0, ly0 = L.y0, perStep = L.perStep, nx = L.nx, ny = L.ny, block = L.block, bnx = L.bnx, blockMax = L.blockMax, hs = L.heights;
  // the block size is a power of two (BLOCK), so multiplying by its inverse is dividing by it, to the bit
  const cellsPerBlock = block * step, perBlock = 1 / block;
  // sample n at s = n·step (a whole count, so every march reads the same positions)
  let n = 1;
  if (a.length > 9 && a[9] > step) n = Math.ceil(a[9] / step - 1e-9);
  // an eleventh number, when given and above 0, names a sample to read first (where a neighbouring ray was hidden):
  // one the march would read (from its start, before its end, the ray rising, so no sample before it ends the
  // march above `maxM`, which bounds the heights under the whole ray) that hides the point hides it
  if (a.length > 10 && a[10] >= n && rise > 0) {
    const sp = a[10] * step;
    if (sp < end) {
      // the march's own arithmetic at that sample, so the probe reads the height and ray it would
      const x = px + sp * ux, y = py + sp * uy;
      let fi: number, fj: number;
      if (perStep !== 0) { fi = (x - lx0) * perStep; fj = (y - ly0) * perStep; } else { fi = (x - lx0) / step; fj = (y - ly0) / step; }
      if (fi >= 0 && fj >= 0 && fi < nx - 1 && fj < ny - 1) {
        const i = Math.floor(fi), j = Math.floor(fj), tx = fi - i, ty = fj - j, o = j * nx + i;
        const top = hs[o] + (hs[o + 1] - hs[o]) * tx;
        const h = top + (hs[o + nx] + (hs[o + nx + 1] - hs[o + nx]) * tx - top) * ty;
        if (h - toleranceM > pz + sp * rise) return true;
      }
    }
  }
  let s = n * step;
  while (s < end) {
    const z = pz + s * rise;
    if (z - toleranceM > maxM) return false;
    const x = px + s * ux, y = py + s * uy;
    let fi: number, fj: number;
    if (perStep !== 0) { fi = (x - lx0) * perStep; fj = (y - ly0) * perStep; } else { fi = (x - lx0) / step; fj = (y - ly0) / step; }
    if (!(fi >= 0 && fj >= 0 && fi < nx - 1 && fj < ny - 1)) return false; // off the lattice: nothing known to hide it
    const bi = Math.floor(fi * perBlock), bj = Math.floor(fj * perBlock);
    if (z - toleranceM > blockMax[bj * bnx + bi]) {
      // clear above this block (the ray rises or falls straight across it, so it is clear until it leaves the
      // block's box): go to the first sample past where it leaves (slab method on the block's edges)
      const bx0 = lx0 + bi * cellsPerBlock, by0 = ly0 + bj * cellsPerBlock;
      // 1e300 (farther than any lattice reaches), not Infinity, for an edge the ray runs along, and written as a
      // literal: the engine boxes every number a ternary mixes with the constant Infinity, and with a module's named
      // constant too (read from the module's scope as a boxed number; 72 MB of boxes a demo raster, 1.6 million
      // marches, when it was). Where ux is 0, |uy| is 1 and ty is a block at most, so the minimum is the same
      const tx = ux > 0 ? (bx0 + cellsPerBlock - x) / ux : ux < 0 ? (bx0 - x) / ux : 1e300;
      const ty = uy > 0 ? (by0 + cellsPerBlock - y) / uy : uy < 0 ? (by0 - y) / uy : 1e300;
      const jump = Math.min(tx, ty);
      // (a sample a hair inside the block is read again; none past its edge is skipped)
      const past = jump > 0 ? Math.ceil((s + jump) / step - 1e-9) : n;
      n = past > n ? past : n + 1;
      s = n * step;
      continue;
    }
    // latticeHeight written out (a call would box the height it returns); inside the lattice, as tested above
    const i = Math.floor(fi), j = Math.floor(fj), tx = fi - i, ty = fj - j, o = j * nx + i;
    const ha = hs[o], hb = hs[o + 1], hc = hs[o + nx], hd = hs[o + nx + 1];
    const top = ha + (hb - ha) * tx;
    const h = top + (hc + (hd - hc) * tx - top) * ty;
    if (h - toleranceM > z) {
      if (a.length > 10) a[10] = n;
      return true;
    }
    n++;
    s = n * step;
  }
  return false;
}

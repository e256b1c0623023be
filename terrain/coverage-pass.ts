/** The per-cell pass of the coverage raster: for each cell the candidate photos of its tile, the views that count and the figures from them. */
import { directionGapDeg } from './view-directions';
import { rowPositions, type ColumnBlend, type CoverageCells } from './coverage-grid';
import { classifyBox, IN, MIXED, OUT } from './coverage-blocks';
import type { NormalisedBounds } from './image-bounds';
import type { AttitudeEnvelope } from './attitude-envelope';
import { insideImageAt, projectFrom, type ImageModel } from './pose';
import { sigmaFromNormal } from './ray-intersection';
import { heightsAround, occludedRay, type HeightLattice } from './occlusion';
import type { MaxRuns } from './lattice-range';
import { CLEARANCE_STRIDE, clearanceProfile, HIGHEST_AT, STEEPEST_AT } from './ray-clearance';

/** Cells per tile side; each tile is matched once against the photos' boxes (a multiple of the cells' node step). */
export const TILE = 16;
/** Numbers per tile in `tileBoxes` (coverage-tiles.ts): x0, y0, x1, y1 of its cells' local positions, its lowest and highest ground. */
export const TILE_BOX = 6;
/** Cells per block side: each block of a tile is decided at once against each photo of the tile (`coverage-blocks.ts`). */
const BLOCK = 4;
const BLOCKS = (TILE / BLOCK) * (TILE / BLOCK);
/** Slack of the decisions on the photos' horizontal boxes, metres (the rounding of a point's offset is far below). */
const BOX_SLACK = 1e-9;
/** A surface seen at less than about 1.1° (cos of the incidence below 0.02) is treated as unseen: back-facing or grazing. */
const MIN_COS_INCIDENCE = 0.02;
/** Above the square of any GSD in cm (not Infinity: a number mixed with that constant is boxed). */
const FAR_SQ = 1e300;

/** Everything the per-cell pass reads and writes (one small function, so the engine optimises its loops on their own). */
interface CellPass {
  th: number; tw: number; tileLists: Int32Array[];
  /** Per tile, parallel to its photo list: the steepest ground a ray from the tile's cells to that camera crosses. */
  tileSlopes: Float64Array[]; width: number; height: number; inside: Uint8Array; cells: CoverageCells;
  views: Uint16Array; viewsPlanned: Uint16Array; viewsAtSpecGsd: Uint16Array; finestGsdCm: Float32Array; maxRayAngleDeg: Float32Array;
  sigmaHorizontalM: Float32Array; sigmaVerticalM: Float32Array; viewsOnly: boolean; boxes: Float64Array; obox: Float64Array; pos: Float64Array;
  model: ImageModel; rots: Float64Array[]; uv: Float64Array;
  /** The photos' rotations end to end (9 numbers each, as `rots`), and the camera's 1/fx², 1/fy², fx/σ, fy/σ (pixels), then the spec's GSD squared less and more a relative hair (1e-9): read per view. */
  rotAll: Float64Array; optics: Float64Array; env: AttitudeEnvelope | null; envCount: Int32Array;
  envRots: Float64Array[]; boxTop: Float64Array;
  /** Per photo: the steepest rise of the ground between its footprint and the camera (a ray rising faster cannot be hidden). */
  boxSlope: Float64Array; marginPx: number; lattice: HeightLattice; hStep: number; N: Float64Array; useOcclusion: boolean; tol: number; spec: number;
  sig: Float64Array;
  /** Scratch of the block being visited (`visitBlock`). */
  block: BlockScratch;
  /** The widest gap between oblique view directions (`view-directions.ts`), when the spec asks for views from all round; null otherwise. */
  directionGap: Float32Array | null; cosOblique: number; azimuths: Float64Array;
  /** Where the planned image and the envelope's shrunk image hold a whole box of ground points (`image-bounds.ts`). */
  bounds: NormalisedBounds; envBounds: NormalisedBounds;
  /** Test every candidate photo at every cell, deciding no block at once (the reference the block decisions are checked against). */
  exact: boolean;
  /**
   * Scratch: the cell's ground point, the ray handed to the occlusion march (`occludedRay`'s eleven numbers: the
   * last, the sample that hid the block's last ray to the photo being visited, is read first), the heights around
   * the point, a box against a photo (`classifyBox`).
   */
  pt: Float64Array; ray: Float64Array; around: Float64Array; q: Float64Array;
  /** Scratch: the minimum `minRayDot` writes, and the rays it keeps. */
  least: Float64Array; kept: Int32Array;
  /** The two photos whose rays gave the largest angle at the cell visited last (-1: none yet). */
  pair: Int32Array;
  /** Per raster column, how its position blends between nodes (`rowPositions`). */
  cb: ColumnBlend;
  /** Scratch: the local positions of the current tile's cells (row-major, TILE per row). */
  px: Float64Array; py: Float64Array;
  /** Longest photo list of a tile. */
  longest: number;
  /** Per tile its box and ground range (`tileBoxes`); the tile being visited; the lattice's block maxima. */
  tileBox: Float64Array; tile: number; maxRuns: MaxRuns;
  /**
   * Per lattice cell, the steepest ground within `nearM` of its points (`nearSlopes`), and that distance; scratch:
   * the value at the cell being visited (a ray leaving the surface there rising at least this fast clears the
   * march's first `nearM` metres).
   */
  near: Float32Array; nearM: number; nearRise: Float64Array;
  /** Per photo of the tile being visited: its clearance profile (CLEARANCE_STRIDE numbers, count 0 until worked out), and the narrowest bin, metres. */
  profiles: Float64Array; binM: number;
  /** Stop after the first cell for which this says true (null: visit every cell). */
  stop: ((cell: number) => boolean) | null;
  /** Every tile (ty · tw + tx) once, in the order visited (`tileOrder`). */
  order: Int32Array;
}

/**
 * The per-cell pass over the tiles: views and the figures from them. Returns the cell it stopped at (`stop`), else
 * -1. `stop` is asked of cells in the same order with or without block decisions (tile by tile in `order`, row by
 * row in a tile; the full figures are worked out for a whole tile, block by block, before it asks any of its
 * cells), so it sees the same first cell either way. A cell's figures depend on its own ground point and the
 * photos alone, so the order changes none of them.
 */
export function fillCells(c: CellPass): number {
  const { th, tw, tileLists, tileSlopes, width, height, inside, stop, cells, longest } = c;
  // per tile: the cells' positions; per block: the photos that may see some of its cells and how far each is decided
  const { px, py } = c;
  const picks = new Int32Array(BLOCKS * Math.max(1, longest)), codes = new Uint8Array(BLOCKS * Math.max(1, longest));
  const picked = new Int32Array(BLOCKS), sure = new Int32Array(BLOCKS), tileCodes = new Int8Array(Math.max(1, longest));
  const nb = TILE / BLOCK;
  const order = c.order;
  for (let step = 0; step < order.length; step++) {
    const t = order[step];
    const ty = Math.floor(t / tw), tx = t - ty * tw;
    const list = tileLists[ty * tw + tx], slopes = tileSlopes[ty * tw + tx];
    const r0 = ty * TILE, c0 = tx * TILE, r1 = Math.min(height, r0 + TILE), c1 = Math.min(width, c0 + TILE);
    let any = false;
    for (let i = r0 * width + c0; i < r0 * width + c1 && !any; i++) any = inside[i] === 1;
    for (let r = r0 + 1; r < r1 && !any; r++) for (let i = r * width + c0; i < r * width + c1 && !any; i++) any = inside[i] === 1;
    if (!any) continue;
    for (let r = r0; r < r1; r++) rowPositions(cells.nodes, c.cb, r, c0, c1, px, py, (r - r0) * TILE);
    c.tile = ty * tw + tx;
    for (let li = 0; li < list.length; li++) c.profiles[li * CLEARANCE_STRIDE] = 0;
    decideTile(c, list, r0, c0, r1, c1, px, py, tileCodes, picks, codes, picked, sure);
    if (c.viewsOnly) {
      for (let r = r0; r < r1; r++) {
        for (let col = c0; col < c1; col++) {
          const i = r * width + col;
          if (!inside[i]) continue;
          const k = (r - r0) * TILE + (col - c0);
          const b = Math.floor((r - r0) / BLOCK) * nb + Math.floor((col - c0) / BLOCK);
          countViews(c, list, i, k, picks, codes, b * longest, picked[b], sure[b]);
          if (stop !== null && stop(i)) return i;
        }
      }
      continue;
    }
    // the full figures block by block, each block's photos in the outer loop (their numbers read once for its
    // cells); each cell still meets its photos in the tile list's order, so every sum is the same to the bit
    for (let b = 0; b < BLOCKS; b++) {
      const br = r0 + Math.floor(b / nb) * BLOCK, bc = c0 + (b % nb) * BLOCK;
      if (br < r1 && bc < c1) visitBlock(c, list, slopes, br, bc, Math.min(r1, br + BLOCK), Math.min(c1, bc + BLOCK), r0, c0, picks, codes, b * longest, picked[b]);
    }
    if (stop !== null) {
      for (let r = r0; r < r1; r++) {
        for (let i = r * width + c0; i < r * width + c1; i++) if (inside[i] && stop(i)) return i;
      }
    }
  }
  return -1;
}

/** Every one of `count` tiles once: those of `first` in their order (repeats dropped), then the rest in row order. */
export function tileOrder(count: number, first: ArrayLike<number>): Int32Array {
  const order = new Int32Array(count), seen = new Uint8Array(count);
  let n = 0;
  for (let k = 0; k < first.length; k++) if (!seen[first[k]]) { seen[first[k]] = 1; order[n++] = first[k]; }
  for (let t = 0; t < count; t++) if (!seen[t]) order[n++] = t;
  return order;
}

/** Codes of a photo against a box of cells: the planned decision (ground boxes and image) | the envelope's << 2; DROP when no cell can count it. */
const DROP = -1;
const ALL_IN = IN | (IN << 2);

/**
 * One photo against a box of ground points (x0, x1, y0, y1, z0, z1 from `bx` at `at`): the planned
 * decision takes the photo's axis-aligned ground box, its box in the heading frame and the image; the envelope's
 * decision every attitude of it. `known` is the code of a box holding this one (a tile around a block): what it
 * decided holds here too and is not worked out again.
 */
function decidePhoto(c: CellPass, j: number, bx: Float64Array, at: number, known: number): number {
  const { boxes, obox, pos, rots, env, envRots, envCount, bounds, envBounds, viewsOnly, q } = c;
  const x0 = bx[at], x1 = bx[at + 1], y0 = bx[at + 2], y1 = bx[at + 3], z0 = bx[at + 4], z1 = bx[at + 5];
  const mz = (z0 + z1) / 2, hz = (z1 - z0) / 2;
  let planned = known & 3, enc = known >> 2;
  const mx = (x0 + x1) / 2, my = (y0 + y1) / 2, hx = (x1 - x0) / 2, hy = (y1 - y0) / 2;
  const dx = mx - pos[j * 3], dy = my - pos[j * 3 + 1], dz = mz - pos[j * 3 + 2];
  q[0] = dx; q[1] = dy; q[2] = dz; q[3] = hx; q[4] = hy; q[5] = hz;
  if (planned === MIXED) {
    const g = j * 4;
    if (x1 < boxes[g] || x0 > boxes[g + 2] || y1 < boxes[g + 1] || y0 > boxes[g + 3]) return DROP;
    let boxIn = x0 >= boxes[g] && x1 <= boxes[g + 2] && y0 >= boxes[g + 1] && y1 <= boxes[g + 3];
    const o = j * 6, sp = obox[o], cp = obox[o + 1];
    const a = sp * dx + cp * dy, e = cp * dx - sp * dy;
    const sa = Math.abs(sp) * hx + Math.abs(cp) * hy + BOX_SLACK, se = Math.abs(cp) * hx + Math.abs(sp) * hy + BOX_SLACK;
    if (a + sa < obox[o + 2] || a - sa > obox[o + 3] || e + se < obox[o + 4] || e - se > obox[o + 5]) return DROP;
    boxIn = boxIn && a - sa >= obox[o + 2] && a + sa <= obox[o + 3] && e - se >= obox[o + 4] && e + se <= obox[o + 5];
    const seen = classifyBox(rots[j], 0, bounds.inner, bounds.outer, q);
    if (seen === OUT) return DROP;
    planned = seen === IN && boxIn ? IN : MIXED;
  }
  if (env && enc === MIXED) {
    enc = IN;
    for (let k = 0; k < envCount[j] && enc !== OUT; k++) {
      const d = classifyBox(envRots[j], k * 9, envBounds.inner, envBounds.outer, q);
      if (d < enc) enc = d;
    }
  }
  if (enc === OUT && viewsOnly) return DROP;
  return planned | (enc << 2);
}

/**
 * The tile's photos against its whole box (`codes` per photo of the tile list), then each block of it: which
 * photos may see some of the block's cells (`picks`, in the tile list's order, so each cell meets its photos in the
 * same order as without blocks) and their codes. Counting views only, photos IN on both are counted in `sure`
 * instead of picked. Returns false (nothing picked) when the tile has no cell with a known height.
 */
function decideTile(
  c: CellPass, list: Int32Array, r0: number, c0: number, r1: number, c1: number, px: Float64Array, py: Float64Array,
  tileCodes: Int8Array, picks: Int32Array, codes: Uint8Array, picked: Int32Array, sure: Int32Array,
): boolean {
  const { width, inside, cells, exact, longest, env, viewsOnly } = c;
  const z = cells.z;
  const nb = TILE / BLOCK;
  const mixed = MIXED | ((env ? MIXED : IN) << 2);
  // each block's box, and the tile's
  let t0 = Infinity, t1 = -Infinity, u0 = Infinity, u1 = -Infinity, w0 = Infinity, w1 = -Infinity;
  const bx = boxScratch;
  for (let b = 0; b < BLOCKS; b++) {
    const br = r0 + Math.floor(b / nb) * BLOCK, bc = c0 + (b % nb) * BLOCK;
    let x0 = Infinity, x1 = -Infinity, y0 = Infinity, y1 = -Infinity, z0 = Infinity, z1 = -Infinity;
    for (let r = br; r < Math.min(r1, br + BLOCK); r++) {
      for (let col = bc; col < Math.min(c1, bc + BLOCK); col++) {
        const i = r * width + col;
        const h = z[i];
        if (!inside[i] || !(h === h)) continue;
        const k = (r - r0) * TILE + (col - c0);
        const x = px[k], y = py[k];
        if (x < x0) x0 = x; if (x > x1) x1 = x; if (y < y0) y0 = y; if (y > y1) y1 = y; if (h < z0) z0 = h; if (h > z1) z1 = h;
      }
    }
    bx[b * 6] = x0; bx[b * 6 + 1] = x1; bx[b * 6 + 2] = y0; bx[b * 6 + 3] = y1; bx[b * 6 + 4] = z0; bx[b * 6 + 5] = z1;
    if (x0 < t0) t0 = x0; if (x1 > t1) t1 = x1; if (y0 < u0) u0 = y0; if (y1 > u1) u1 = y1; if (z0 < w0) w0 = z0; if (z1 > w1) w1 = z1;
    picked[b] = 0; sure[b] = 0;
  }
  const tb = BLOCKS * 6;
  bx[tb] = t0; bx[tb + 1] = t1; bx[tb + 2] = u0; bx[tb + 3] = u1; bx[tb + 4] = w0; bx[tb + 5] = w1;
  if (!(t0 <= t1)) return false; // no cell with a known height: none is visited past its first line
  for (let li = 0; li < list.length; li++) tileCodes[li] = exact ? mixed : decidePhoto(c, list[li], bx, tb, mixed);
  for (let b = 0; b < BLOCKS; b++) {
    if (!(bx[b * 6] <= bx[b * 6 + 1])) continue;
    const at = b * longest;
    let n = 0, s = 0;
    for (let li = 0; li < list.length; li++) {
      const t = tileCodes[li];
      if (t === DROP) continue;
      const code = t === ALL_IN || exact ? t : decidePhoto(c, list[li], bx, b * 6, t);
      if (code === DROP) continue;
      if (viewsOnly && code === ALL_IN) { s++; continue; }
      picks[at + n] = li;
      codes[at + n] = code;
      n++;
    }
    picked[b] = n; sure[b] = s;
  }
  return true;
}

/** Each block's box while its tile is decided (x0, x1, y0, y1, z0, z1 per block), then the tile's. */
const boxScratch = new Float64Array((BLOCKS + 1) * 6);

/**
 * Whether the cell's ground point (c.pt[0..2]) lies in a photo's ground boxes and its image: the test the block
 * decisions stand in for. Numbers pass through `c.pt`: a call boxes each number it passes.
 */
function seenAt(c: CellPass, j: number): boolean {
  const { boxes, obox, pos, model, rots, uv, pt } = c;
  const px = pt[0], py = pt[1];
  const b = j * 4;
  if (px < boxes[b] || px > boxes[b + 2] || py < boxes[b + 1] || py > boxes[b + 3]) return false;
  // inOrientedBox written out (its offsets would be boxed on the way in)
  const o = j * 6, dx = px - pos[j * 3], dy = py - pos[j * 3 + 1];
  const a = obox[o] * dx + obox[o + 1] * dy, e = obox[o + 1] * dx - obox[o] * dy;
  if (!(a >= obox[o + 2] && a <= obox[o + 3] && e >= obox[o + 4] && e <= obox[o + 5])) return false;
  return projectFrom(model, rots[j], 0, pos, j * 3, pt, uv) && insideImageAt(model, uv, 0);
}

/** Whether the cell's ground point (c.pt[0..2]) stays in the image (shrunk by the envelope's margin) at every attitude of a photo's envelope. */
function heldAt(c: CellPass, j: number): boolean {
  const { model, uv, envCount, envRots, marginPx, pt, pos } = c;
  const er = envRots[j];
  for (let s = 0; s < envCount[j]; s++) {
    if (!(projectFrom(model, er, s * 9, pos, j * 3, pt, uv) && insideImageAt(model, uv, marginPx))) return false;
  }
  return true;
}

/**
 * Whether terrain hides the cell's ground point (c.pt[0..2]) from photo j (`occludedRay`, numbers passed in an
 * array), marching only the bins of the tile's clearance profile for photo `li` of its list that `bins` names
 * (`marchNeeded`; all the way for NO_PROOF).
 */
function hiddenFrom(c: CellPass, j: number, li: number, bins: number): boolean {
  const a = c.ray, pt = c.pt, pos = c.pos;
  a[0] = pt[0]; a[1] = pt[1]; a[2] = pt[2]; a[3] = pos[j * 3]; a[4] = pos[j * 3 + 1]; a[5] = pos[j * 3 + 2]; a[6] = c.tol; a[7] = c.boxTop[j];
  // a[9], where the march starts, is set by `marchNeeded`
  if (bins === NO_PROOF) { a[8] = Infinity; a[9] = 0; } else a[8] = bins * c.profiles[li * CLEARANCE_STRIDE + 1];
  // a[10], the sample that hid the last ray to this photo (read first), is kept by the caller; the exact pass reads none
  if (c.exact) a[10] = 0;
  return occludedRay(c.lattice, a);
}

/** `marchNeeded`: no bin of the ray is proven clear, march it all. */
const NO_PROOF = -1;

/**
 * How many bins of the clearance profile of the tile and photo `li` of its list (worked out on first use) the ray
 * from the cell (c.pt) to photo j must be marched up to: 0 when the profile and the ground near the cell prove the
 * whole ray clear (`ray-clearance.ts`), NO_PROOF when they are not used; where the march may start is written to
 * c.ray[9]. Whole numbers in and out (a call boxes each fraction it passes).
 */
function marchNeeded(c: CellPass, li: number, j: number, nearSurface: boolean): number {
  const pt = c.pt, pos = c.pos;
  const dx = pt[0] - pos[j * 3], dy = pt[1] - pos[j * 3 + 1], dz = pt[2] - pos[j * 3 + 2];
  if (!(dz < 0) || c.exact) return NO_PROOF;
  const prof = c.profiles, base = li * CLEARANCE_STRIDE;
  if (!(prof[base] > 0)) {
    clearanceProfile(c.lattice, c.maxRuns, c.tileBox, c.tile * TILE_BOX, pos[j * 3], pos[j * 3 + 1], pos[j * 3 + 2], c.tol, c.binM, prof, base, c.boxTop[j]);
  }
  const W = prof[base + 1];
  const rho = -dz / Math.sqrt(dx * dx + dy * dy);
  // bins from the last down that the ray clears: pz + ρ·S_k ≥ H_k − tolerance, with a hair for rounding
  const lift = c.pt[2] + c.tol - 1e-6;
  let k = prof[base + 2];
  while (k > 0 && lift + (k - 1) * W * rho >= prof[base + HIGHEST_AT + k - 1]) k--;
  if (k === 0) return 0;
  c.ray[9] = 0;
  if (!nearSurface) return k;
  // a ray leaving the surface and rising faster than the steepest ground of bins 0..m−1 clears them (the
  // argument of `blockSlope`), and one rising faster than the steepest ground near its cell clears the first
  // `nearM` metres: the march starts past both
  let m = 0;
  while (m < k && rho >= prof[base + STEEPEST_AT + m + 1]) m++;
  if (m === k) return 0;
  let from = m * W;
  const nearM = c.nearM;
  if (nearM > from && rho >= c.nearRise[0]) {
    if (k * W <= nearM) return 0;
    from = nearM;
  }
  c.ray[9] = from;
  return k;
}

/**
 * The smallest dot product of two of the `v` unit rays (x, y, z from `rays`, the photo of each in `ids`): the
 * largest angle between two views. Exactly the minimum over every pair, with pairs that cannot reach it skipped:
 * for rays at angles θa and θb from the vertical, a·b ≥ cos(θa + θb) (the triangle inequality of angles on the
 * sphere), so with m the steepest ray (`steep`, the caller's), a ray a with cos(θa + θm) above some pair's dot
 * meets no ray that gives less (θb ≤ θm for every b). The minimum is then among the pairs of the rays left
 * (`kept`, scratch), each pair read once. The fewer left the better, so the pair that gave the minimum at the cell
 * before (`pair`, its two photos; neighbouring cells see much the same views) gives the first dot when both its
 * photos see this cell (at `sa` and `sb`, else -1; without it, m paired with every other ray does, and m itself
 * is then not kept), and `pair` is then set to this cell's. Applies while every ray points up (`up`:
 * all angles below 90°); else every pair is read. Any pair read is a real pair, and every pair the bound does not
 * rule out is read, so the minimum is the same whatever the seed. It is written into least[0] (a returned
 * fraction would be boxed).
 */
function minRayDot(rays: Float64Array, v: number, ids: Int32Array, steep: number, up: boolean, sa: number, sb: number, pair: Int32Array, least: Float64Array, kept: Int32Array): void {
  let minDot = 1, ba = 0, bb = 1;
  if (!up) {
    for (let a = 0; a < v; a++) {
      const ax = rays[a * 3], ay = rays[a * 3 + 1], az = rays[a * 3 + 2];
      for (let b = a + 1; b < v; b++) {
        const d = ax * rays[b * 3] + ay * rays[b * 3 + 1] + az * rays[b * 3 + 2];
        if (d < minDot) { minDot = d; ba = a; bb = b; }
      }
    }
    least[0] = minDot;
    pair[0] = ids[ba]; pair[1] = ids[bb];
    return;
  }
  const m = steep, mx = rays[m * 3], my = rays[m * 3 + 1], mz = rays[m * 3 + 2], sm2 = Math.max(0, 1 - mz * mz);
  const seeded = sa >= 0 && sb >= 0;
  if (seeded) {
    minDot = rays[sa * 3] * rays[sb * 3] + rays[sa * 3 + 1] * rays[sb * 3 + 1] + rays[sa * 3 + 2] * rays[sb * 3 + 2];
    ba = sa; bb = sb;
  } else {
    // unseeded: each ray against the steepest first, for a minimum to leave rays out by
    for (let b = 0; b < v; b++) {
      if (b === m) continue;
      const d = mx * rays[b * 3] + my * rays[b * 3 + 1] + mz * rays[b * 3 + 2];
      if (d < minDot) { minDot = d; ba = m; bb = b; }
    }
  }
  // rays left out where cos θa cos θm − sin θa sin θm > the minimum (with a hair for rounding), tested squared
  // where both sides are positive, so only the steepest ray's sine is taken; seeded, the steepest is tested too
  // (its pairs are not read yet: left out where cos 2θm is above the minimum, so no pair of it gives less)
  const t = minDot + 1e-12;
  let nk = 0;
  for (let b = 0; b < v; b++) {
    if (b === m && !seeded) continue;
    const bz = rays[b * 3 + 2], l = bz * mz - t;
    if (!(l > 0 && l * l > Math.max(0, 1 - bz * bz) * sm2)) kept[nk++] = b;
  }
  for (let p = 0; p < nk; p++) {
    const a = kept[p], ax = rays[a * 3], ay = rays[a * 3 + 1], az = rays[a * 3 + 2];
    for (let q = p + 1; q < nk; q++) {
      const b = kept[q];
      const d = ax * rays[b * 3] + ay * rays[b * 3 + 1] + az * rays[b * 3 + 2];
      if (d < minDot) { minDot = d; ba = a; bb = b; }
    }
  }
  least[0] = minDot;
  pair[0] = ids[ba]; pair[1] = ids[bb];
}

/** One cell, counting views only: `sure` views decided for its whole block and those of the other photos picked for the block that see its ground point (small: it is inlined into the pass). */
function countViews(c: CellPass, list: Int32Array, i: number, k: number, picks: Int32Array, codes: Uint8Array, at: number, picked: number, sure: number): void {
  const pz = c.cells.z[i];
  if (!(pz === pz)) { c.views[i] = 0; return; }
  const pt = c.pt;
  pt[0] = c.px[k]; pt[1] = c.py[k]; pt[2] = pz;
  let count = sure;
  for (let e = 0; e < picked; e++) {
    const j = list[picks[at + e]], code = codes[at + e];
    if ((code & 3) !== IN && !seenAt(c, j)) continue;
    const enc = code >> 2;
    if (enc !== IN && (enc === OUT || !heldAt(c, j))) continue;
    count++;
  }
  c.views[i] = count;
}

/** Per block of the full pass: its cells' numbers and the sums each gathers over its views (BLOCK² slots each; `blockScratch`). */
interface BlockScratch {
  /** Cell index, local position and height, ground normal (3 each), and near the surface with its steepest nearby rise (`nearSlopes`). */
  cell: Int32Array; x: Float64Array; y: Float64Array; z: Float64Array; normal: Float64Array; near: Uint8Array; rise: Float64Array;
  /** Views as planned and counted, at the spec's GSD, the steepest ray's slot, whether every ray points up. */
  planned: Int32Array; v: Int32Array; atSpec: Int32Array; steep: Int32Array;
  /** The slots of the seed pair's two photos among the cell's views (-1: not among them; `minRayDot`). */
  seedA: Int32Array; seedB: Int32Array;
  /** The steepest ray's z (the least cosine from the vertical; every ray points up where it is above 0). */
  lowZ: Float64Array;
  /** The finest GSD so far and its square less a hair; the normal matrix's six numbers. */
  finest: Float64Array; finestSq: Float64Array; normal6: Float64Array;
  /** Each slot's unit rays (3 numbers a view) and their photos, `longest` views each. */
  rays: Float64Array[]; ids: Int32Array[];
  /** The same rays and photos end to end (slot q from q · `longest` views). */
  all: Float64Array; allIds: Int32Array;
}

/** Scratch for `visitBlock`, sized for tiles of at most `longest` photos. */
export function blockScratch(longest: number): BlockScratch {
  const S = BLOCK * BLOCK, L = Math.max(1, longest);
  const rays = new Float64Array(S * L * 3), ids = new Int32Array(S * L);
  return {
    cell: new Int32Array(S), x: new Float64Array(S), y: new Float64Array(S), z: new Float64Array(S), normal: new Float64Array(3 * S), near: new Uint8Array(S), rise: new Float64Array(S),
    planned: new Int32Array(S), v: new Int32Array(S), seedA: new Int32Array(S), seedB: new Int32Array(S), atSpec: new Int32Array(S), steep: new Int32Array(S), lowZ: new Float64Array(S),
    finest: new Float64Array(S), finestSq: new Float64Array(S), normal6: new Float64Array(6 * S),
    all: rays, allIds: ids, rays: Array.from({ length: S }, (_, q) => rays.subarray(q * L * 3, (q + 1) * L * 3)), ids: Array.from({ length: S }, (_, q) => ids.subarray(q * L, (q + 1) * L)),
  };
}

/**
 * The cells of one block (rows br..r1 − 1, columns bc..c1 − 1; the tile's corner r0, c0): the photos picked for it
 * that see each cell's ground point, and the figures from them. Photo by photo in the outer loop, so a photo's
 * numbers are read once for the block's cells; each cell meets its photos in the order of the tile list, as it
 * would alone.
 */
function visitBlock(c: CellPass, list: Int32Array, slopes: Float64Array, br: number, bc: number, r1: number, c1: number, r0: number, c0: number, picks: Int32Array, codes: Uint8Array, at: number, picked: number): void {
  const { cells, views, viewsPlanned, viewsAtSpecGsd, pos, rotAll, optics, lattice, hStep, N, useOcclusion, tol, spec, finestGsdCm, maxRayAngleDeg, sig, sigmaHorizontalM, sigmaVerticalM, width, inside } = c;
  const B = c.block, z = cells.z, around = c.around, pt = c.pt;
  // the block's cells with a known height: position, ground normal, whether the lattice's surface is at the point
  let nq = 0;
  for (let r = br; r < r1; r++) {
    for (let col = bc; col < c1; col++) {
      const i = r * width + col;
      if (!inside[i]) continue;
      const pz = z[i];
      if (!(pz === pz)) { views[i] = 0; viewsPlanned[i] = 0; viewsAtSpecGsd[i] = 0; continue; }
      const k = (r - r0) * TILE + (col - c0);
      const px = c.px[k], py = c.py[k];
      // ground normal from the lattice (central differences); level where unknown
      around[0] = px; around[1] = py; around[2] = hStep;
      heightsAround(lattice, around);
      let gx = (around[3] - around[4]) / (2 * hStep);
      let gy = (around[5] - around[6]) / (2 * hStep);
      if (!(gx === gx)) gx = 0;
      if (!(gy === gy)) gy = 0;
      const nl = Math.sqrt(gx * gx + gy * gy + 1);
      B.normal[nq * 3] = -gx / nl; B.normal[nq * 3 + 1] = -gy / nl; B.normal[nq * 3 + 2] = 1 / nl;
      // the lattice's surface at the point against the cell's own height: a ray leaving the surface and rising
      // faster than any ground it crosses can rise cannot meet that ground (occlusion.ts blockSlope)
      const nearSurface = around[7] - pz <= tol;
      B.near[nq] = nearSurface ? 1 : 0;
      if (nearSurface && useOcclusion) {
        // the steepest ground near the point (`nearSlopes`), off the lattice none proven (FAR_SQ written out: a
        // ternary that mixes a module's named constant with a number read here boxes that number)
        const fi = Math.floor((px - lattice.x0) / hStep), fj = Math.floor((py - lattice.y0) / hStep);
        B.rise[nq] = fi >= 0 && fj >= 0 && fi < lattice.nx && fj < lattice.ny ? c.near[fj * lattice.nx + fi] : 1e300;
      }
      B.cell[nq] = i; B.x[nq] = px; B.y[nq] = py; B.z[nq] = pz;
      B.seedA[nq] = -1; B.seedB[nq] = -1;
      B.planned[nq] = 0; B.v[nq] = 0; B.atSpec[nq] = 0; B.steep[nq] = 0; B.lowZ[nq] = Infinity; B.finest[nq] = Infinity; B.finestSq[nq] = FAR_SQ;
      for (let m = 0; m < 6; m++) B.normal6[nq * 6 + m] = 0;
      nq++;
    }
  }
  if (nq === 0) return;
  const ifx2 = optics[0], ify2 = optics[1], fxs = optics[2], fys = optics[3], specLoSq = optics[4], specHiSq = optics[5];
  const bn = B.normal, acc = B.normal6, bX = B.x, bY = B.y, bZ = B.z, bNear = B.near, bRise = B.rise, bPlanned = B.planned, bFinest = B.finest, bFinestSq = B.finestSq, bAtSpec = B.atSpec, bV = B.v, bLowZ = B.lowZ, bSteep = B.steep, bSa = B.seedA, bSb = B.seedB, allRays = B.all, allIds = B.allIds, L = c.longest > 0 ? c.longest : 1;
  // the widest pair of the cell visited last (minRayDot's seed): where each cell's views hold its two photos
  const pa = c.pair[0], pb = c.pair[1];
  for (let e = 0; e < picked; e++) {
    const li = picks[at + e], code = codes[at + e];
    const j = list[li];
    const mixed = (code & 3) !== IN, enc = code >> 2;
    const ox = pos[j * 3], oy = pos[j * 3 + 1], oz = pos[j * 3 + 2];
    const ro = j * 9;
    const r0_ = rotAll[ro], r1_ = rotAll[ro + 1], r2 = rotAll[ro + 2], r3 = rotAll[ro + 3], r4 = rotAll[ro + 4], r5 = rotAll[ro + 5], r6 = rotAll[ro + 6], r7 = rotAll[ro + 7], r8 = rotAll[ro + 8];
    const sl = slopes.length > 0 ? slopes[li] : 0, sl2 = sl * sl;
    // whether this photo is one of the seed pair's (its view's slot is then noted for minRayDot)
    const seedA = j === pa, seedB = j === pb;
    // no sample of this photo's rays has hidden a cell of the block yet
    c.ray[10] = 0;
    for (let q = 0; q < nq; q++) {
      const px = bX[q], py = bY[q], pz = bZ[q];
      if (mixed) {
        pt[0] = px; pt[1] = py; pt[2] = pz;
        if (!seenAt(c, j)) continue;
      }
      const dx = px - ox, dy = py - oy, dz = pz - oz;
      const R2 = dx * dx + dy * dy + dz * dz, R = Math.sqrt(R2);
      const nx = bn[q * 3], ny = bn[q * 3 + 1], nz = bn[q * 3 + 2];
      // n·d = R·(n·r̂): the incidence test −n·r̂ < MIN_COS_INCIDENCE without dividing
      const nd = nx * dx + ny * dy + nz * dz;
      if (-nd < MIN_COS_INCIDENCE * R) continue;
      // the slope bound (occlusion.ts blockSlope) squared: −dz ≥ slope · horizontal distance
      const near = bNear[q] === 1;
      if (useOcclusion && !(near && dz <= 0 && dz * dz >= sl2 * (dx * dx + dy * dy))) {
        pt[0] = px; pt[1] = py; pt[2] = pz;
        c.nearRise[0] = bRise[q];
        const bins = marchNeeded(c, li, j, near);
        if (bins !== 0 && hiddenFrom(c, j, li, bins)) continue;
      }
      bPlanned[q]++;
      if (enc !== IN) {
        if (enc === OUT) continue;
        pt[0] = px; pt[1] = py; pt[2] = pz;
        if (!heldAt(c, j)) continue;
      }
      // viewGsdCm and addView written out here (a call boxes every number it passes), with their divisions
      // shared: R·cos α = qz (the depth along the axis) and r̂·(n·e)/(n·r̂) = d·(n·e)/(n·d), so
      // GSD_e = qz / f_e · |e − d·k| · 100 with k = (n·e)/(n·d), and as e is a unit vector and e·d = q_e,
      // |e − d·k|² = 1 − 2k·q_e + k²·R²
      const qx = r0_ * dx + r3 * dy + r6 * dz;
      const qy = r1_ * dx + r4 * dy + r7 * dz;
      const qz = r2 * dx + r5 * dy + r8 * dz;
      const ind = 1 / nd;
      const kx = (nx * r0_ + ny * r3 + nz * r6) * ind;
      const ky = (nx * r1_ + ny * r4 + nz * r7) * ind;
      const ex = (1 + kx * (kx * R2 - 2 * qx)) * ifx2, ey = (1 + ky * (ky * R2 - 2 * qy)) * ify2;
      // GSD = qz·√ee·100 (ee the larger of ex, ey): its square decides against the finest so far and the spec where
      // it is clearly apart from them (a relative hair far above the rounding of either), and the root is taken
      // only where it is not
      const ee = ex > ey ? ex : ey;
      const g2 = qz * qz * ee * 1e4;
      if (g2 < bFinestSq[q] || (g2 >= specLoSq && g2 <= specHiSq)) {
        const g = qz * Math.sqrt(ee) * 100;
        if (g < bFinest[q]) { bFinest[q] = g; bFinestSq[q] = g * g * (1 + 1e-9); }
        if (g <= spec) bAtSpec[q]++;
      } else if (g2 < specLoSq) bAtSpec[q]++;
      const v = bV[q], w = q * L + v;
      const iR = 1 / R;
      const cz = -dz * iR;
      allRays[w * 3] = -dx * iR; allRays[w * 3 + 1] = -dy * iR; allRays[w * 3 + 2] = cz;
      allIds[w] = j;
      if (seedA) bSa[q] = v; else if (seedB) bSb[q] = v;
      // for minRayDot: whether every ray points up, the steepest
      if (cz < bLowZ[q]) { bLowZ[q] = cz; bSteep[q] = v; }
      const iq = 1 / qz;
      const xn = qx * iq, yn = qy * iq;
      const sx = fxs * iq, sy = fys * iq;
      const ax = (r0_ - xn * r2) * sx, ay = (r3 - xn * r5) * sx, az = (r6 - xn * r8) * sx;
      const bx = (r1_ - yn * r2) * sy, by = (r4 - yn * r5) * sy, bz = (r7 - yn * r8) * sy;
      const o = q * 6;
      acc[o] += ax * ax + bx * bx;
      acc[o + 1] += ax * ay + bx * by;
      acc[o + 2] += ax * az + bx * bz;
      acc[o + 3] += ay * ay + by * by;
      acc[o + 4] += ay * az + by * bz;
      acc[o + 5] += az * az + bz * bz;
      bV[q] = v + 1;
    }
  }
  const pair = c.pair;
  for (let q = 0; q < nq; q++) {
    const i = B.cell[q], v = B.v[q], rays = B.rays[q], ids = B.ids[q];
    views[i] = v;
    viewsPlanned[i] = B.planned[q];
    viewsAtSpecGsd[i] = B.atSpec[q];
    if (v > 0) finestGsdCm[i] = B.finest[q];
    if (c.directionGap) c.directionGap[i] = directionGapDeg(rays, v, c.cosOblique, c.azimuths);
    if (v > 1) {
      // seeded by the widest pair of the cell visited last: its slots were noted with the views while it is the
      // block's seed, and are looked for among them once it is not
      let sa = B.seedA[q], sb = B.seedB[q];
      const qa = pair[0], qb = pair[1];
      if (qa !== pa || qb !== pb) {
        sa = -1; sb = -1;
        for (let w = 0; w < v; w++) { const j = ids[w]; if (j === qa) sa = w; else if (j === qb) sb = w; }
      }
      minRayDot(rays, v, ids, B.steep[q], B.lowZ[q] > 0, sa, sb, pair, c.least, c.kept);
      const minDot = c.least[0];
      maxRayAngleDeg[i] = (Math.acos(Math.max(-1, Math.min(1, minDot))) * 180) / Math.PI;
      const o = q * 6;
      N[0] = acc[o]; N[1] = acc[o + 1]; N[2] = acc[o + 2]; N[3] = acc[o + 3]; N[4] = acc[o + 4]; N[5] = acc[o + 5];
      sigmaFromNormal(N, 0, sig);
      sigmaHorizontalM[i] = sig[0];
      sigmaVerticalM[i] = sig[1];
    }
  }
}

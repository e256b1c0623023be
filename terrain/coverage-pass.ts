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
  rays: Float64Array; sig: Float64Array;
  /** The widest gap between oblique view directions (`view-directions.ts`), when the spec asks for views from all round; null otherwise. */
  directionGap: Float32Array | null; cosOblique: number; azimuths: Float64Array;
  /** Where the planned image and the envelope's shrunk image hold a whole box of ground points (`image-bounds.ts`). */
  bounds: NormalisedBounds; envBounds: NormalisedBounds;
  /** Test every candidate photo at every cell, deciding no block at once (the reference the block decisions are checked against). */
  exact: boolean;
  /** Scratch: the cell's ground point, the ray handed to the occlusion march, the heights around the point, a box against a photo (`classifyBox`). */
  pt: Float64Array; ray: Float64Array; around: Float64Array; q: Float64Array;
  /** Scratch: the photo of each ray in `rays`, the minimum `minRayDot` writes, and the rays it keeps. */
  rayIds: Int32Array; least: Float64Array; kept: Int32Array;
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
 * -1. Cells are visited in the same order with or without block decisions (tile by tile in `order`, row by row in a
 * tile), so `stop` sees the same first cell either way. A cell's figures depend on
 * its own ground point and the photos alone, so the order changes none of them.
 */
export function fillCells(c: CellPass): number {
  const { th, tw, tileLists, tileSlopes, width, height, inside, stop, cells, longest } = c;
  const z = cells.z;
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
    for (let r = r0; r < r1; r++) {
      for (let col = c0; col < c1; col++) {
        const i = r * width + col;
        if (!inside[i]) continue;
        const k = (r - r0) * TILE + (col - c0);
        const b = Math.floor((r - r0) / BLOCK) * nb + Math.floor((col - c0) / BLOCK);
        if (c.viewsOnly) countViews(c, list, i, k, picks, codes, b * longest, picked[b], sure[b]);
        else visitCell(c, list, slopes, i, k, picks, codes, b * longest, picked[b], sure[b]);
        if (stop !== null && stop(i)) return i;
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
    clearanceProfile(c.lattice, c.maxRuns, c.tileBox, c.tile * TILE_BOX, pos[j * 3], pos[j * 3 + 1], pos[j * 3 + 2], c.tol, c.binM, prof, base);
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
 * sphere), so once the steepest ray m (`steep`, the caller's) has been paired with every other, a ray a with
 * cos(θa + θm) above the minimum so far meets no ray that gives less (θb ≤ θm for every b). The minimum is then
 * among the pairs of the rays left (`kept`, scratch), each pair read once. The fewer left the better, so the pair that gave the minimum at the cell before (`pair`,
 * its two photos; neighbouring cells see much the same views) is read first when both its photos see this cell
 * (at `sa` and `sb`, else -1), and `pair` is then set to this cell's. Applies while every ray points up (`up`:
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
  if (sa >= 0 && sb >= 0) {
    minDot = rays[sa * 3] * rays[sb * 3] + rays[sa * 3 + 1] * rays[sb * 3 + 1] + rays[sa * 3 + 2] * rays[sb * 3 + 2];
    ba = sa; bb = sb;
  }
  // each ray against the steepest, then left out where cos θa cos θm − sin θa sin θm > the minimum (with a hair
  // for rounding), tested squared where both sides are positive, so only the steepest ray's sine is taken
  const m = steep, mx = rays[m * 3], my = rays[m * 3 + 1], mz = rays[m * 3 + 2], sm2 = Math.max(0, 1 - mz * mz);
  for (let b = 0; b < v; b++) {
    if (b === m) continue;
    const d = mx * rays[b * 3] + my * rays[b * 3 + 1] + mz * rays[b * 3 + 2];
    if (d < minDot) { minDot = d; ba = m; bb = b; }
  }
  const t = minDot + 1e-12;
  let nk = 0;
  for (let b = 0; b < v; b++) {
    if (b === m) continue;
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

/** One cell: the photos of its block that see its ground point, and the figures from them (small, so it is optimised early). */
function visitCell(c: CellPass, list: Int32Array, slopes: Float64Array, i: number, k: number, picks: Int32Array, codes: Uint8Array, at: number, picked: number, sure: number): void {
  const { cells, views, viewsPlanned, viewsAtSpecGsd, pos, rotAll, optics, lattice, hStep, N, useOcclusion, tol, spec, rays, finestGsdCm, maxRayAngleDeg, sig, sigmaHorizontalM, sigmaVerticalM, rayIds } = c;
  const pz = cells.z[i];
  if (!(pz === pz)) { views[i] = 0; viewsPlanned[i] = 0; viewsAtSpecGsd[i] = 0; return; }
  const pt = c.pt, px = c.px[k], py = c.py[k];
  pt[0] = px; pt[1] = py; pt[2] = pz;
  // ground normal from the lattice (central differences); level where unknown
  const around = c.around;
  around[0] = px; around[1] = py; around[2] = hStep;
  heightsAround(lattice, around);
  let gx = (around[3] - around[4]) / (2 * hStep);
  let gy = (around[5] - around[6]) / (2 * hStep);
  if (!(gx === gx)) gx = 0;
  if (!(gy === gy)) gy = 0;
  const nl = Math.sqrt(gx * gx + gy * gy + 1);
  const nx = -gx / nl, ny = -gy / nl, nz = 1 / nl;
  // the lattice's surface at the point against the cell's own height: a ray leaving the surface and rising faster
  // than any ground it crosses can rise cannot meet that ground (occlusion.ts blockSlope)
  const lift = around[7] - pz;
  const nearSurface = lift <= tol;
  if (nearSurface && useOcclusion) {
    // the steepest ground near the point (`nearSlopes`), off the lattice none proven
    const fi = Math.floor((px - lattice.x0) / hStep), fj = Math.floor((py - lattice.y0) / hStep);
    c.nearRise[0] = fi >= 0 && fj >= 0 && fi < lattice.nx && fj < lattice.ny ? c.near[fj * lattice.nx + fi] : FAR_SQ;
  }
  let planned = 0, v = 0, atSpec = 0, finest = Infinity, finestSq = FAR_SQ;
  const pair = c.pair, pa = pair[0], pb = pair[1];
  let steep = 0, up = true, sa = -1, sb = -1;
  let n0 = 0, n1 = 0, n2 = 0, n3 = 0, n4 = 0, n5 = 0;
  const ifx2 = optics[0], ify2 = optics[1], fxs = optics[2], fys = optics[3], specLoSq = optics[4], specHiSq = optics[5];
  for (let e = 0; e < picked; e++) {
    const li = picks[at + e], code = codes[at + e];
    const j = list[li];
    if ((code & 3) !== IN && !seenAt(c, j)) continue;
    const ox = pos[j * 3], oy = pos[j * 3 + 1], oz = pos[j * 3 + 2];
    const dx = px - ox, dy = py - oy, dz = pz - oz;
    const R = Math.sqrt(dx * dx + dy * dy + dz * dz);
    // n·d = R·(n·r̂): the incidence test −n·r̂ < MIN_COS_INCIDENCE without dividing
    const nd = nx * dx + ny * dy + nz * dz;
    if (-nd < MIN_COS_INCIDENCE * R) continue;
    // the slope bound (occlusion.ts blockSlope) squared: −dz ≥ slope · horizontal distance
    const sl = slopes[li];
    if (useOcclusion && !(nearSurface && dz <= 0 && dz * dz >= sl * sl * (dx * dx + dy * dy))) {
      const bins = marchNeeded(c, li, j, nearSurface);
      if (bins !== 0 && hiddenFrom(c, j, li, bins)) continue;
    }
    planned++;
    const enc = code >> 2;
    if (enc !== IN && (enc === OUT || !heldAt(c, j))) continue;
    // viewGsdCm and addView written out here (the engine does not inline them into a function this size, and a
    // call boxes every number it passes), with their divisions shared: R·cos α = qz (the depth along the axis) and
    // r̂·(n·e)/(n·r̂) = d·(n·e)/(n·d), so GSD_e = qz / f_e · |e − d (n·e)/(n·d)| · 100
    const ro = j * 9;
    const r0 = rotAll[ro], r1 = rotAll[ro + 1], r2 = rotAll[ro + 2], r3 = rotAll[ro + 3], r4 = rotAll[ro + 4], r5 = rotAll[ro + 5], r6 = rotAll[ro + 6], r7 = rotAll[ro + 7], r8 = rotAll[ro + 8];
    const qx = r0 * dx + r3 * dy + r6 * dz;
    const qy = r1 * dx + r4 * dy + r7 * dz;
    const qz = r2 * dx + r5 * dy + r8 * dz;
    const ind = 1 / nd;
    const kx = (nx * r0 + ny * r3 + nz * r6) * ind;
    const gxx = r0 - dx * kx, gxy = r3 - dy * kx, gxz = r6 - dz * kx;
    const ky = (nx * r1 + ny * r4 + nz * r7) * ind;
    const gyx = r1 - dx * ky, gyy = r4 - dy * ky, gyz = r7 - dz * ky;
    const ex = (gxx * gxx + gxy * gxy + gxz * gxz) * ifx2, ey = (gyx * gyx + gyy * gyy + gyz * gyz) * ify2;
    // GSD = qz·√ee·100 (ee the larger of ex, ey): its square decides against the finest so far and the spec where it is clearly apart
    // from them (a relative hair far above the rounding of either), and the root is taken only where it is not
    const ee = ex > ey ? ex : ey;
    const g2 = qz * qz * ee * 1e4;
    if (g2 < finestSq || (g2 >= specLoSq && g2 <= specHiSq)) {
      const g = qz * Math.sqrt(ee) * 100;
      if (g < finest) { finest = g; finestSq = g * g * (1 + 1e-9); }
      if (g <= spec) atSpec++;
    } else if (g2 < specLoSq) atSpec++;
    const iR = 1 / R;
    const cz = -dz * iR;
    rays[v * 3] = -dx * iR; rays[v * 3 + 1] = -dy * iR; rays[v * 3 + 2] = cz;
    rayIds[v] = j;
    // for minRayDot: whether every ray points up, the steepest, where the last cell's widest pair is
    if (!(cz > 0)) up = false;
    if (cz < rays[steep * 3 + 2]) steep = v;
    if (j === pa) sa = v; else if (j === pb) sb = v;
    const iq = 1 / qz;
    const xn = qx * iq, yn = qy * iq;
    const sx = fxs * iq, sy = fys * iq;
    const ax = (r0 - xn * r2) * sx, ay = (r3 - xn * r5) * sx, az = (r6 - xn * r8) * sx;
    const bx = (r1 - yn * r2) * sy, by = (r4 - yn * r5) * sy, bz = (r7 - yn * r8) * sy;
    n0 += ax * ax + bx * bx;
    n1 += ax * ay + bx * by;
    n2 += ax * az + bx * bz;
    n3 += ay * ay + by * by;
    n4 += ay * az + by * bz;
    n5 += az * az + bz * bz;
    v++;
  }
  views[i] = v;
  viewsPlanned[i] = planned;
  viewsAtSpecGsd[i] = atSpec;
  if (v > 0) finestGsdCm[i] = finest;
  if (c.directionGap) c.directionGap[i] = directionGapDeg(rays, v, c.cosOblique, c.azimuths);
  if (v > 1) {
    minRayDot(rays, v, rayIds, steep, up, sa, sb, pair, c.least, c.kept);
    const minDot = c.least[0];
    maxRayAngleDeg[i] = (Math.acos(Math.max(-1, Math.min(1, minDot))) * 180) / Math.PI;
    N[0] = n0; N[1] = n1; N[2] = n2; N[3] = n3; N[4] = n4; N[5] = n5;
    sigmaFromNormal(N, 0, sig);
    sigmaHorizontalM[i] = sig[0];
    sigmaVerticalM[i] = sig[1];
  }
}

/** The coverage raster: for every ground cell of the survey area, the photos that see it and what they give (views, finest GSD, ray angles, advisory precision). */
import type { Camera } from './camera';
import { checkCamera, pixelRay } from './camera';
import type { Grid } from './grid';
import type { AreaPolygon } from './mission';
import type { LocalFrame } from './local-frame';
import { localHeights } from './local-frame';
import type { CameraPose } from './footprint';
import { cameraToLocal } from './footprint';
import { imageModel } from './pose';
import { blockScratch, fillCells, tileOrder, TILE, TILE_BOX } from './coverage-pass';
import { tileBoxes, tilePhotoLists } from './coverage-tiles';
import { CLEARANCE_STRIDE } from './ray-clearance';
import { envelopeSamples, type AttitudeEnvelope } from './attitude-envelope';
import { heightLattice, heightsAround, NEAR_CELLS, nearSlopes, slopeIn, type HeightLattice } from './occlusion';
import { latticeRange, maxRuns, rangeBlocks, type MaxRuns, type RangeBlocks } from './lattice-range';
import { columnBlend, coverageCells, gridCellM, rowPositions, type ColumnBlend, type CoverageCells } from './coverage-grid';
import { normalisedBounds } from './image-bounds';
import { check } from './errors';
import type { CoveragePhoto } from './coverage-photo';

export type { CoveragePhoto } from './coverage-photo';

/** Settings of one coverage computation. */
export interface CoverageOptions {
  /** Cell side, metres. */
  cellM: number;
  maxCells?: number;
  /** GSD the spec asks for at most (cm): views at or below it are counted. */
  specGsdCm: number;
  /**
   * Work out the widest gap between the compass directions of each cell's views at least this many degrees from the
   * vertical (`directionGapDeg`): given when the spec asks for views from all round; left out, the raster has none.
   */
  obliqueDeg?: number;
  /** Image measurement error for the predicted precision, pixels (default 0.5). */
  imageErrorPx?: number;
  /** When given, a view counts only if the point stays in the image at every attitude of the envelope. */
  envelope?: AttitudeEnvelope | null;
  /** Test terrain occlusion along every viewing ray (default true). */
  occlusion?: boolean;
  /** Terrain must rise this far above a ray to hide the point (default 0.2 m: the height lattice differs from the grid's own interpolation by centimetres to decimetres on rough ground). */
  occlusionToleranceM?: number;
  /**
   * Count views only (inside the image, at the planned attitude and under the envelope): no occlusion, slope,
   * GSD, angle or σ; what a rasterisation of the footprints gives, for comparing with one. The other counts are 0
   * and the figures NaN (one shared array each: read them, do not write them).
   */
  viewsOnly?: boolean;
  /** Spacing of the height lattice the occlusion march runs on (default: the grid's pixel, at most 16 million nodes). */
  latticeStepM?: number;
  /**
   * Stop the pass at the first cell this says true for (called once a cell's figures are in `raster`): a yes/no
   * question such as "does any cell fall short?" is answered at the first cell that says no. Cells are visited
   * tile by tile (TILE x TILE cells, tiles in row order), row by row within a tile, every cell of the area once;
   * `stoppedAtCell` then names the first cell in that order the question said true for (not the first in plain
   * row order); cells of tiles not visited yet keep their initial values (0 views, NaN figures), while the tile it
   * stopped in is worked out whole (its figures are worked out block by block before any of its cells is asked).
   */
  stopAt?: (cell: number, raster: CoverageRaster) => boolean;
  /**
   * Cells whose tiles are visited first, in this order (then the other tiles in row order): where a `stopAt`
   * question is likely to say true (the cells an earlier plan fell short at), so it is answered sooner. Figures do
   * not depend on the order; `stoppedAtCell` is the first cell in the order visited.
   */
  firstCells?: ArrayLike<number>;
  /**
   * A whole raster of the same cells and options for these photos less the `fresh` ones (indices into `photos`):
   * only the tiles a fresh photo's box meets are worked out again, and every other cell's figures are copied from
   * it (a photo changes no cell outside its box). The solver checks spot photos added to a checked layout so. Not
   * with `stopAt` (a copied cell is not asked) nor `viewsOnly`.
   */
  adding?: { raster: CoverageRaster; fresh: ArrayLike<number> };
  /**
   * Project every cell into every candidate photo instead of deciding blocks of cells at once, and march every ray
   * the slope bound does not clear instead of proving parts of rays clear by tile (`ray-clearance.ts`): the same
   * figures, slower; the reference the tests hold the block decisions and the clearance proofs to.
   */
  exactPass?: boolean;
}

/** The coverage raster: the cell lattice and one value per cell and measure (counts 0 and figures NaN outside the area; NaN inside where a figure has no value). */
export interface CoverageRaster {
  cells: CoverageCells;
  /** Views that count (guaranteed ones when an envelope is given). */
  views: Uint16Array;
  /** Views as planned (inside the image at the planned attitude and not hidden). */
  viewsPlanned: Uint16Array;
  finestGsdCm: Float32Array;
  viewsAtSpecGsd: Uint16Array;
  maxRayAngleDeg: Float32Array;
  sigmaVerticalM: Float32Array;
  sigmaHorizontalM: Float32Array;
  /** Widest gap between the compass directions of the oblique views, degrees (360: fewer than two); only when asked (`obliqueDeg`). */
  directionGapDeg?: Float32Array;
  /** Whether `views` and the figures from them are the guaranteed ones. */
  guaranteed: boolean;
  /** Safety margin the envelope test keeps from the image edges, pixels (0 without an envelope). */
  envelopeMarginPx: number;
  imageErrorPx: number;
  /** The cell the pass stopped at (`stopAt`); absent when every cell was visited. */
  stoppedAtCell?: number;
}


/** Camera-frame rays (normalised x, y) through 17 points of each image edge, distortion included: the same for every photo. */
function edgeRays(camera: Camera): Float64Array {
  const W = camera.imageWidthPx, H = camera.imageHeightPx, N = 16;
  const out = new Float64Array((N + 1) * 8);
  let at = 0;
  for (let k = 0; k <= N; k++) {
    for (let e = 0; e < 4; e++) {
      const u = e < 2 ? (W * k) / N : e === 2 ? 0 : W, v = e === 0 ? 0 : e === 1 ? H : (H * k) / N;
      const [xn, yn] = pixelRay(camera, u, v);
      out[at++] = xn; out[at++] = yn;
    }
  }
  return out;
}

/** Horizontal bounding box of everything a photo can see between the lowest and highest ground (border rays through distortion). */
function photoBox(pose: CameraPose, edge: Float64Array, rot: Float64Array, zLow: number, zHigh: number, oriented?: Float64Array, at = 0): [number, number, number, number] {
  let x0 = pose.xM, x1 = pose.xM, y0 = pose.yM, y1 = pose.yM;
  // the same box in the photo's heading frame (along = sin ψ·dx + cos ψ·dy, across = cos ψ·dx − sin ψ·dy, from the camera)
  const sp = Math.sin((pose.yawDeg * Math.PI) / 180), cp = Math.cos((pose.yawDeg * Math.PI) / 180);
  let a0 = 0, a1 = 0, c0 = 0, c1 = 0;
  for (let k = 0; k < edge.length; k += 2) {
    {
      const xn = edge[k], yn = edge[k + 1];
      const dx = rot[0] * xn + rot[1] * yn + rot[2], dy = rot[3] * xn + rot[4] * yn + rot[5], dz = rot[6] * xn + rot[7] * yn + rot[8];
      if (!(dz < -1e-9)) {
        if (oriented) oriented.set([0, 1, -Infinity, Infinity, -Infinity, Infinity], at);
        return [-Infinity, -Infinity, Infinity, Infinity];
      }
      for (let zi = 0; zi < 2; zi++) {
        const z = zi === 0 ? zLow : Math.min(zHigh, pose.altitudeM);
        const t = (z - pose.altitudeM) / dz;
        const x = pose.xM + t * dx, y = pose.yM + t * dy;
        if (x < x0) x0 = x; if (x > x1) x1 = x; if (y < y0) y0 = y; if (y > y1) y1 = y;
        const a = sp * t * dx + cp * t * dy, c = cp * t * dx - sp * t * dy;
        if (a < a0) a0 = a; if (a > a1) a1 = a; if (c < c0) c0 = c; if (c > c1) c1 = c;
      }
    }
  }
  if (oriented) oriented.set([sp, cp, a0, a1, c0, c1], at);
  return [x0, y0, x1, y1];
}

/**
 * A rise (metres up per metre along the ground) that a ray from a tile's ground point to a camera can have, at
 * the least, and still be proven clear of the terrain without the march, when the point is on the lattice's
 * surface (within the tolerance): `slope` bounds the ground between the whole tile and the camera, but the march
 * stops once the ray is above `top` (the highest ground around the photo) by the tolerance, which a ray rising at
 * ρ from a height ≥ `zLow` reaches within L = (top + tol − zLow) / ρ. So ρ ≥ max(ρ1, steepest ground within L1 of
 * the tile) proves it for any ρ1; a few ρ1 below `slope` are tried and the least such bound kept.
 */
function riseNeeded(L: HeightLattice, around: readonly [number, number, number, number], tile: readonly [number, number, number, number], zLow: number, top: number, tol: number, pb: number, slope: number, scratch: [number, number, number, number]): number {
  let best = slope;
  if (!(zLow <= top + tol) || !(slope > 0)) return best;
  for (let k = 1; k <= 4; k++) {
    const rho = slope / 2 ** k;
    const reach = (top + tol - zLow) / rho + pb;
    scratch[0] = Math.max(around[0], tile[0] - reach); scratch[1] = Math.max(around[1], tile[1] - reach);
    scratch[2] = Math.min(around[2], tile[2] + reach); scratch[3] = Math.min(around[3], tile[3] + reach);
    const g = slopeIn(L, scratch);
    const bound = Math.max(rho, Math.min(g, slope));
    if (bound < best) best = bound;
    if (g > rho) break; // smaller ρ1 reach farther: no better
  }
  return best;
}

/** Heights of the grid on a lattice of the local frame covering the cells and the cameras (the occlusion march runs on it). */
function buildLattice(grid: Grid, frame: LocalFrame, cellBox: readonly [number, number, number, number], photos: readonly CoveragePhoto[], stepM: number): HeightLattice {
  let [x0, y0, x1, y1] = cellBox;
  for (const p of photos) { x0 = Math.min(x0, p.xM); x1 = Math.max(x1, p.xM); y0 = Math.min(y0, p.yM); y1 = Math.max(y1, p.yM); }
  let step = stepM;
  const span = (x1 - x0 + 4 * step) * (y1 - y0 + 4 * step);
  if (span / (step * step) > 16_000_000) step = Math.sqrt(span / 16_000_000);
  // nodes on the cells' own lattice (a whole number of steps from their corner), however far the cameras reach:
  // a cell's ground normal, so its GSD, must not move with photos elsewhere in the plan
  x0 = cellBox[0] - Math.ceil((cellBox[0] - x0) / step + 2) * step;
  y0 = cellBox[1] - Math.ceil((cellBox[1] - y0) / step + 2) * step;
  const nx = Math.ceil((x1 + 2 * step - x0) / step) + 1, ny = Math.ceil((y1 + 2 * step - y0) / step) + 1;
  // the same grid, frame and nodes give the same lattice: a run of rasters over one site (the solver's checks)
  // samples it once
  const key = `${x0} ${y0} ${step} ${nx} ${ny}`;
  const byFrame = latticeCache.get(grid) ?? new WeakMap<LocalFrame, { key: string; lattice: HeightLattice }>();
  latticeCache.set(grid, byFrame);
  const kept = byFrame.get(frame);
  if (kept && kept.key === key) return kept.lattice;
  const xs = new Float64Array(nx * ny), ys = new Float64Array(nx * ny), hs = new Float64Array(nx * ny);
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) { xs[j * nx + i] = x0 + i * step; ys[j * nx + i] = y0 + j * step; }
  localHeights(grid, frame).sampleMany(xs, ys, hs);
  const lattice = heightLattice(x0, y0, step, nx, ny, Float32Array.from(hs));
  byFrame.set(frame, { key, lattice });
  return lattice;
}

/** No occlusion: no slope bound is read. */
const noSlopes = new Float64Array(0);
/** A tile not worked out: no photos to bound slopes to. */
const noPhotos = new Int32Array(0);

/** Per tile, 1 where a fresh photo's box meets it (its cells are worked out again when photos are added to a raster). */
function touchedTiles(adding: NonNullable<CoverageOptions['adding']>, tileLists: readonly Int32Array[], P: number, width: number, height: number, opts: CoverageOptions, viewsOnly: boolean): Uint8Array {
  const base = adding.raster;
  check(!opts.stopAt && !viewsOnly, 'adding photos to a raster works out every cell a fresh photo may see: not with stopAt or viewsOnly.');
  check(base.cells.width === width && base.cells.height === height && base.stoppedAtCell === undefined, `adding photos needs a whole raster of the same ${width} x ${height} cells.`);
  const fresh = new Uint8Array(P);
  for (let k = 0; k < adding.fresh.length; k++) {
    const j = adding.fresh[k];
    check(Number.isInteger(j) && j >= 0 && j < P, `adding: ${j} is not a photo of these ${P}.`);
    fresh[j] = 1;
  }
  const touched = new Uint8Array(tileLists.length);
  tileLists.forEach((l, t) => { for (let k = 0; k < l.length; k++) if (fresh[l[k]]) { touched[t] = 1; break; } });
  return touched;
}

/** Every band of `base` into `out`, and the cells of the touched tiles back to their initial values (0 views, NaN figures). */
function copyUntouched(base: CoverageRaster, out: CoverageRaster, touched: Uint8Array, tw: number): void {
  check(!!base.directionGapDeg === !!out.directionGapDeg, 'adding photos needs a raster with the same bands (directions or none).');
  const counts = [[base.views, out.views], [base.viewsPlanned, out.viewsPlanned], [base.viewsAtSpecGsd, out.viewsAtSpecGsd]] as const;
  const figures = [[base.finestGsdCm, out.finestGsdCm], [base.maxRayAngleDeg, out.maxRayAngleDeg], [base.sigmaVerticalM, out.sigmaVerticalM], [base.sigmaHorizontalM, out.sigmaHorizontalM], ...(base.directionGapDeg && out.directionGapDeg ? [[base.directionGapDeg, out.directionGapDeg] as const] : [])];
  for (const [a, b] of counts) b.set(a);
  for (const [a, b] of figures) b.set(a);
  const { width, height } = out.cells;
  for (let t = 0; t < touched.length; t++) {
    if (!touched[t]) continue;
    const ty = Math.floor(t / tw), tx = t - ty * tw;
    for (let r = ty * TILE; r < Math.min(height, (ty + 1) * TILE); r++) for (let col = tx * TILE; col < Math.min(width, (tx + 1) * TILE); col++) {
      const i = r * width + col;
      for (const [, b] of counts) b[i] = 0;
      for (const [, b] of figures) b[i] = NaN;
    }
  }
}

/** Per tile, parallel to its photo list: the steepest ground a ray from the tile's cells to that camera crosses (`riseNeeded`). */
function slopesToPhotos(lattice: HeightLattice, tileBox: Float64Array, tileLists: readonly Int32Array[], pos: Float64Array, boxTop: Float64Array, boxSlope: Float64Array, tol: number, pb: number): Float64Array[] {
  // boxes reused from pair to pair (slopeIn reads them at once)
  const around: [number, number, number, number] = [0, 0, 0, 0], tile: [number, number, number, number] = [0, 0, 0, 0], scratch: [number, number, number, number] = [0, 0, 0, 0];
  return tileLists.map((list, t) => {
    const o = t * TILE_BOX, x0 = tileBox[o], y0 = tileBox[o + 1], x1 = tileBox[o + 2], y1 = tileBox[o + 3], zLow = tileBox[o + 4];
    tile[0] = x0; tile[1] = y0; tile[2] = x1; tile[3] = y1;
    const out = new Float64Array(list.length);
    for (let li = 0; li < list.length; li++) {
      const j = list[li];
      around[0] = Math.min(x0, pos[j * 3]) - pb; around[1] = Math.min(y0, pos[j * 3 + 1]) - pb;
      around[2] = Math.max(x1, pos[j * 3]) + pb; around[3] = Math.max(y1, pos[j * 3 + 1]) + pb;
      out[li] = riseNeeded(lattice, around, tile, zLow, boxTop[j], tol, pb, Math.min(boxSlope[j], slopeIn(lattice, around)), scratch);
    }
    return out;
  });
}

const rangesOf = new WeakMap<HeightLattice, RangeBlocks>();
const maxesOf = new WeakMap<HeightLattice, MaxRuns>();

/** The lattice's block maxima (`maxRuns`), kept with the lattice. */
function maxRunsOf(lattice: HeightLattice): MaxRuns {
  let m = maxesOf.get(lattice);
  if (!m) { m = maxRuns(lattice); maxesOf.set(lattice, m); }
  return m;
}

/** A raster's cells with their column blend and tile boxes (`cellsOf`). */
interface CellSet { cells: CoverageCells; cb: ColumnBlend; tileBox: Float64Array }

/** The last cells laid out per area (of one grid and frame), with the cell size and limit they were laid out for. */
type CellsByArea = WeakMap<AreaPolygon, { cellM: number; maxCells: number | undefined; set: CellSet }>;
/** Those per grid and frame (dropped with the grid, the frame or the area). */
const cellsCache = new WeakMap<Grid, WeakMap<LocalFrame, CellsByArea>>();

/**
 * The cells over `area` (`coverageCells`), their column blend and their tiles' boxes: the same grid, frame, area
 * and cell size give the same cells, so a run of rasters over one site (the solver's checks, a bench's rounds) lays
 * them out once. Every raster shares them: they are read, never written.
 */
function cellsOf(grid: Grid, frame: LocalFrame, area: AreaPolygon, cellM: number, maxCells: number | undefined): CellSet {
  const byFrame = cellsCache.get(grid) ?? new WeakMap<LocalFrame, CellsByArea>();
  cellsCache.set(grid, byFrame);
  const byArea: CellsByArea = byFrame.get(frame) ?? new WeakMap();
  byFrame.set(frame, byArea);
  const kept = byArea.get(area);
  if (kept && kept.cellM === cellM && kept.maxCells === maxCells) return kept.set;
  const cells = coverageCells(grid, frame, area, cellM, maxCells);
  const cb = columnBlend(cells.nodes, cells.width);
  const set = { cells, cb, tileBox: tileBoxes(cells, cb, Math.ceil(cells.width / TILE), Math.ceil(cells.height / TILE)) };
  byArea.set(area, { cellM, maxCells, set });
  return set;
}

/** The last lattice built per grid and frame (read only once built; dropped with the grid or the frame). */
const latticeCache = new WeakMap<Grid, WeakMap<LocalFrame, { key: string; lattice: HeightLattice }>>();

/**
 * The coverage raster of `photos` over `area`: for each cell's ground point, the photos whose image holds it
 * (after distortion) and whose ray to it no terrain hides; from those the view count, the finest GSD and the
 * number of views at or below the spec's GSD (`view-gsd.ts`), the largest angle between two viewing rays and the
 * advisory precision of a least-squares intersection of the rays (`ray-intersection.ts`). With an envelope only
 * the views that hold at every attitude in it count (`attitude-envelope.ts`). Work is bounded by each photo's
 * ground box: cells are visited tile by tile against the photos whose box meets the tile, and each 4 x 4 block of
 * a tile is decided against each photo at once where its whole box of ground points lands inside or outside the
 * image (`coverage-blocks.ts`); only cells of blocks on a footprint's edge are projected one by one. A ray that
 * the tile's slope bound does not clear is marched only over the part its tile's clearance profile for that camera
 * does not prove clear (`ray-clearance.ts`). The figures are exactly those of projecting every cell and marching
 * every such ray in full (`exactPass`, which the tests compare cell for cell).
 */
export function computeCoverage(grid: Grid, frame: LocalFrame, area: AreaPolygon, camera: Camera, photos: readonly CoveragePhoto[], opts: CoverageOptions): CoverageRaster {
  checkCamera(camera);
  const sigmaPx = opts.imageErrorPx ?? 0.5;
  check(Number.isFinite(sigmaPx) && sigmaPx > 0 && sigmaPx <= 100, `the image measurement error must be a number of pixels in (0, 100], got ${opts.imageErrorPx}.`);
  check(Number.isFinite(opts.specGsdCm) && opts.specGsdCm > 0, `the spec's GSD must be a positive number of centimetres, got ${opts.specGsdCm}.`);
  const { cells, cb, tileBox } = cellsOf(grid, frame, area, opts.cellM, opts.maxCells);
  const { width, height, inside } = cells;
  const n = width * height;
  const tol = opts.occlusionToleranceM ?? 0.2;
  const viewsOnly = opts.viewsOnly ?? false;
  const useOcclusion = !viewsOnly && (opts.occlusion ?? true);
  const lat = area.coordinates[0][0][1];
  // each tile's box of cell positions (and its lowest ground): the cells' box is their union
  const tw = Math.ceil(width / TILE), th = Math.ceil(height / TILE);
  const cellBox: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity];
  for (let t = 0; t < tw * th; t++) {
    cellBox[0] = Math.min(cellBox[0], tileBox[t * TILE_BOX]); cellBox[1] = Math.min(cellBox[1], tileBox[t * TILE_BOX + 1]);
    cellBox[2] = Math.max(cellBox[2], tileBox[t * TILE_BOX + 2]); cellBox[3] = Math.max(cellBox[3], tileBox[t * TILE_BOX + 3]);
  }
  const lattice = buildLattice(grid, frame, cellBox, photos, opts.latticeStepM ?? gridCellM(grid, lat));
  const model = imageModel(camera);
  const env = opts.envelope ?? null;
  // per photo: rotation, position, ground box, envelope rotations
  const P = photos.length;
  const rots: Float64Array[] = [], boxes = new Float64Array(P * 4), obox = new Float64Array(P * 6), pos = new Float64Array(P * 3), boxTop = new Float64Array(P), boxSlope = new Float64Array(P), envRots: Float64Array[] = [], envCount = new Int32Array(P);
  let marginPx = 0;
  const envByAngles = new Map<string, ReturnType<typeof envelopeSamples>>();
  // the lattice is kept across runs over one site (buildLattice), and so are its row ranges
  let ranges = rangesOf.get(lattice);
  if (!ranges) { ranges = rangeBlocks(lattice); rangesOf.set(lattice, ranges); }
  const edge = edgeRays(camera);
  for (let j = 0; j < P; j++) {
    const p = photos[j];
    check(Number.isFinite(p.xM) && Number.isFinite(p.yM) && Number.isFinite(p.altitudeM) && Number.isFinite(p.yawDeg), `photo ${j + 1} needs a finite position, altitude and yaw, got ${JSON.stringify(p)}.`);
    const rot = cameraToLocal(camera, p);
    rots.push(rot);
    // the box between the lowest and highest ground of the whole lattice, then again between the lowest and
    // highest ground inside that box (tighter where the relief is in another part of the area)
    let b = photoBox(p, edge, rot, lattice.minM, lattice.maxM);
    for (let pass = 0; pass < 2 && Number.isFinite(b[0]); pass++) {
      const [lo, hi] = latticeRange(lattice, ranges, b);
      if (!(lo <= hi)) break;
      b = photoBox(p, edge, rot, lo, hi);
    }
    const [oLo, oHi] = Number.isFinite(b[0]) ? latticeRange(lattice, ranges, b) : [lattice.minM, lattice.maxM];
    photoBox(p, edge, rot, oLo, oHi, obox, j * 6);
    // the highest ground in the box: a ray from a point in it to the camera (also in it) never meets higher ground
    const pb = 4 * Math.max(opts.cellM, lattice.stepM);
    if (!useOcclusion) boxTop[j] = oHi;
    else boxTop[j] = Number.isFinite(b[0]) ? latticeRange(lattice, ranges, [b[0] - pb, b[1] - pb, b[2] + pb, b[3] + pb])[1] : oHi;
    // the steepest ground any ray from the box to the camera crosses (the box and the camera's own position)
    if (!useOcclusion) boxSlope[j] = Infinity;
    else boxSlope[j] = Number.isFinite(b[0]) ? slopeIn(lattice, [Math.min(b[0], p.xM) - pb, Math.min(b[1], p.yM) - pb, Math.max(b[2], p.xM) + pb, Math.max(b[3], p.yM) + pb]) : Infinity;
    const padO = 2 * opts.cellM;
    obox[j * 6 + 2] -= padO; obox[j * 6 + 3] += padO; obox[j * 6 + 4] -= padO; obox[j * 6 + 5] += padO;
    pos[j * 3] = p.xM; pos[j * 3 + 1] = p.yM; pos[j * 3 + 2] = p.altitudeM;
    const pad = 2 * opts.cellM;
    boxes[j * 4] = b[0] - pad; boxes[j * 4 + 1] = b[1] - pad; boxes[j * 4 + 2] = b[2] + pad; boxes[j * 4 + 3] = b[3] + pad;
    if (env) {
      // the attitudes depend on the photo's angles only (not its position): one set per line heading
      const key = `${p.yawDeg}|${p.pitchDeg ?? 0}|${p.rollDeg ?? 0}|${p.mountTiltDeg ?? 0}|${p.crabDeg ?? 0}`;
      let s = envByAngles.get(key);
      if (!s) { s = envelopeSamples(camera, p, env, p.crabDeg ?? 0); envByAngles.set(key, s); }
      envRots.push(s.rotations); envCount[j] = s.count; marginPx = Math.max(marginPx, s.marginPx);
    }
  }
  // tiles of cells and the photos whose box meets each tile
  const tileLists = tilePhotoLists(tileBox, tw * th, boxes, obox, pos, P);
  let longest = 0;
  for (const l of tileLists) if (l.length > longest) longest = l.length;
  // adding photos to a raster: the tiles a fresh photo's box meets (the only ones worked out)
  const adding = opts.adding;
  const touched = adding ? touchedTiles(adding, tileLists, P, width, height, opts, viewsOnly) : null;
  const slopeLists = touched ? tileLists.map((l, t) => (touched[t] ? l : noPhotos)) : tileLists;
  const tileSlopes = useOcclusion ? slopesToPhotos(lattice, tileBox, slopeLists, pos, boxTop, boxSlope, tol, 4 * Math.max(opts.cellM, lattice.stepM)) : tileLists.map(() => noSlopes);
  // counts are whole numbers (0 outside the area: the mask says where the area is); counting views only, no other
  // measure is worked out, and one array of zeros and one of NaN stand for the other counts and the figures (a
  // fresh array costs its first writes: tens of milliseconds for the four figure bands of a large raster)
  const views = new Uint16Array(n), viewsPlanned = new Uint16Array(n);
  const viewsAtSpecGsd = viewsOnly ? viewsPlanned : new Uint16Array(n);
  const finestGsdCm = new Float32Array(n).fill(NaN);
  const maxRayAngleDeg = viewsOnly ? finestGsdCm : new Float32Array(n).fill(NaN);
  const sigmaVerticalM = viewsOnly ? finestGsdCm : new Float32Array(n).fill(NaN);
  const sigmaHorizontalM = viewsOnly ? finestGsdCm : new Float32Array(n).fill(NaN);
  // scratch, allocated once: normal matrix, outputs
  const N = new Float64Array(6);
  const uv = new Float64Array(2);
  const sig = new Float64Array(2);
  const spec = opts.specGsdCm * (1 + 1e-9);
  const hStep = lattice.stepM;
  const oblique = opts.obliqueDeg;
  check(oblique === undefined || (Number.isFinite(oblique) && oblique >= 0 && oblique < 90), `the least angle from the vertical of an oblique view must be from 0 to 90 degrees, got ${oblique}.`);
  const directionGap = oblique === undefined || viewsOnly ? null : new Float32Array(n).fill(NaN);
  const raster: CoverageRaster = { cells, views, viewsPlanned, finestGsdCm, viewsAtSpecGsd, maxRayAngleDeg, sigmaVerticalM, sigmaHorizontalM, guaranteed: env !== null, envelopeMarginPx: marginPx, imageErrorPx: sigmaPx };
  if (directionGap) raster.directionGapDeg = directionGap;
  if (adding && touched) copyUntouched(adding.raster, raster, touched, tw);
  const stopAt = opts.stopAt;
  const bounds = normalisedBounds(model), envBounds = normalisedBounds(model, marginPx);
  const rotAll = new Float64Array(9 * P);
  for (let j = 0; j < P; j++) rotAll.set(rots[j], 9 * j);
  const optics = Float64Array.of(1 / (model.fxPx * model.fxPx), 1 / (model.fyPx * model.fyPx), model.fxPx / sigmaPx, model.fyPx / sigmaPx, spec * spec * (1 - 1e-9), spec * spec * (1 + 1e-9));
  const firstCells = opts.firstCells ?? [];
  const firstTiles = new Int32Array(firstCells.length);
  for (let k = 0; k < firstCells.length; k++) {
    const i = firstCells[k];
    check(Number.isInteger(i) && i >= 0 && i < width * height, `firstCells: ${i} is not a cell of this ${width} x ${height} raster.`);
    firstTiles[k] = Math.floor(Math.floor(i / width) / TILE) * tw + Math.floor((i % width) / TILE);
  }
  const order = touched ? tileOrder(tw * th, firstTiles).filter((t) => touched[t] === 1) : tileOrder(tw * th, firstTiles);
  const stopped = fillCells({ order, rotAll, optics, cb, tileBox, tile: 0, maxRuns: maxRunsOf(lattice), profiles: new Float64Array(CLEARANCE_STRIDE * Math.max(1, longest)), binM: 4 * lattice.stepM, block: blockScratch(longest), pair: new Int32Array([-1, -1]), least: new Float64Array(1), kept: new Int32Array(Math.max(1, longest)), pt: new Float64Array(3), q: new Float64Array(6), ray: new Float64Array(11), near: useOcclusion ? nearSlopes(lattice) : new Float32Array(0), nearM: NEAR_CELLS * lattice.stepM, nearRise: new Float64Array(1), around: new Float64Array(8), px: new Float64Array(TILE * TILE), py: new Float64Array(TILE * TILE), bounds, envBounds, exact: opts.exactPass ?? false, longest, th, tw, tileLists, tileSlopes, width, height, inside, cells, views, viewsPlanned, viewsAtSpecGsd, viewsOnly, boxes, obox, pos, model, rots, uv, env, envCount, envRots, boxTop, boxSlope, marginPx, lattice, hStep, N, useOcclusion, tol, spec, finestGsdCm, maxRayAngleDeg, sig, sigmaHorizontalM, sigmaVerticalM, directionGap, cosOblique: Math.cos(((oblique ?? 0) * Math.PI) / 180), azimuths: new Float64Array(Math.max(1, longest)), stop: stopAt ? (i) => stopAt(i, raster) : null });
  if (stopped >= 0) raster.stoppedAtCell = stopped;
  return raster;
}


/**
 * Each cell's ground slope (degrees; NaN outside the area) as the raster's GSD sees it: the normal from central
 * differences on the same height lattice at its own spacing (`visitCell` in coverage-pass.ts), level where the
 * ground is unknown. The lattice's nodes are anchored on the cells (buildLattice), so this is the slope every
 * raster over these cells uses, whatever its photos. The solver's reach test reads it, so a cell it calls
 * reachable is judged on the ground the raster judges it on.
 */
export function cellSlopesDeg(grid: Grid, frame: LocalFrame, area: AreaPolygon, cellM: number, maxCells?: number, latticeStepM?: number): Float32Array {
  const cells = coverageCells(grid, frame, area, cellM, maxCells);
  const { width, height, inside } = cells;
  const cb = columnBlend(cells.nodes, width);
  const xs = new Float64Array(width * height), ys = new Float64Array(width * height);
  const box: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity];
  for (let r = 0; r < height; r++) {
    rowPositions(cells.nodes, cb, r, 0, width, xs, ys, r * width);
    for (let c = 0; c < width; c++) {
      const i = r * width + c;
      if (inside[i] === 0) continue;
      if (xs[i] < box[0]) box[0] = xs[i]; if (ys[i] < box[1]) box[1] = ys[i];
      if (xs[i] > box[2]) box[2] = xs[i]; if (ys[i] > box[3]) box[3] = ys[i];
    }
  }
  const out = new Float32Array(width * height).fill(NaN);
  if (!(box[0] <= box[2])) return out;
  const lattice = buildLattice(grid, frame, box, [], latticeStepM ?? gridCellM(grid, area.coordinates[0][0][1]));
  const h = lattice.stepM, a = new Float64Array(8);
  for (let i = 0; i < width * height; i++) {
    if (inside[i] === 0) continue;
    a[0] = xs[i]; a[1] = ys[i]; a[2] = h;
    heightsAround(lattice, a);
    let gx = (a[3] - a[4]) / (2 * h), gy = (a[5] - a[6]) / (2 * h);
    if (!(gx === gx)) gx = 0;
    if (!(gy === gy)) gy = 0;
    out[i] = (Math.atan(Math.sqrt(gx * gx + gy * gy)) * 180) / Math.PI;
  }
  return out;
}

/** The coverage raster's cells: a north-up lattice in the elevation grid's CRS over the survey area, its area mask, and each cell's ground point in the local frame. */
import type { GeoTransform, Grid, GridCrs } from './grid';
import type { AreaPolygon } from './mission';
import type { LocalFrame } from './local-frame';
import { WGS84, createTransform } from './crs';
import { metresPerUnit } from './dem-header';
import { sampleGridCoords } from './sample';
import { TerrainError, check } from './errors';

/** Default most cells one coverage raster may have (80 MB of five Float32 bands). */
export const DEFAULT_MAX_COVERAGE_CELLS = 4_000_000;

/** The cell lattice of a coverage raster and each cell's ground point. */
export interface CoverageCells {
  width: number;
  height: number;
  /** GDAL geotransform of the raster, in the grid's CRS (north up). */
  transform: GeoTransform;
  crs: GridCrs;
  /** Cell side in metres as asked (the CRS unit size may differ for geographic or foot grids). */
  cellM: number;
  /** Ground area of one cell, m² (horizontal, in the local frame). */
  cellAreaM2: number;
  /** 1 where the cell centre lies inside the survey area. */
  inside: Uint8Array;
  /**
   * The grid's ground height at each cell centre (NaN unknown). The centre's position in the local frame is not
   * stored per cell: `cellX` / `cellY` interpolate it from exact positions at nodes every `nodeStep` cells (see
   * `CellNodes`), which keeps the raster's memory near its bands'.
   */
  z: Float32Array;
  nodes: CellNodes;
  insideCount: number;
}

/**
 * Exact local-frame positions (x east, y north, metres) of the cell centres at rows and columns 0, S, 2S, …
 * (S = `step`; the last node row and column may lie past the raster's edge), row-major, `cols` nodes per row.
 * Between nodes a cell's position is the bilinear blend of its four nodes: the grid's CRS maps to the local frame
 * by a smooth transform that is all but affine over a node span of at most `NODE_SPAN_M` (the tests bound the
 * blend's error against the exact transform).
 */
interface CellNodes { step: number; cols: number; rows: number; x: Float64Array; y: Float64Array }

/** Widest ground span between two position nodes, metres (the blend's error grows with its square). */
const NODE_SPAN_M = 32;
/** Most cells between two position nodes (a tile of the coverage pass is a multiple of it). */
const NODE_STEP_MAX = 16;

/** Node spacing in cells for a cell size: at most NODE_STEP_MAX cells and NODE_SPAN_M metres, a power of two. */
function nodeStepFor(cellM: number): number {
  let s = NODE_STEP_MAX;
  while (s > 1 && s * cellM > NODE_SPAN_M) s /= 2;
  return s;
}

/** Local-frame x of cell `i` (bilinear between its nodes). */
export function cellX(cells: CoverageCells, i: number): number {
  return blend(cells.nodes, cells.nodes.x, Math.floor(i / cells.width), i % cells.width);
}

/** Local-frame y of cell `i` (bilinear between its nodes). */
export function cellY(cells: CoverageCells, i: number): number {
  return blend(cells.nodes, cells.nodes.y, Math.floor(i / cells.width), i % cells.width);
}

/** The blend of one coordinate at cell row r, column c. */
function blend(n: CellNodes, v: Float64Array, r: number, c: number): number {
  let kr = Math.floor(r / n.step), kc = Math.floor(c / n.step);
  if (kr > n.rows - 2) kr = n.rows - 2;
  if (kc > n.cols - 2) kc = n.cols - 2;
  const tr = (r - kr * n.step) / n.step, tc = (c - kc * n.step) / n.step;
  const o = kr * n.cols + kc;
  const top = v[o] + (v[o + 1] - v[o]) * tc, bottom = v[o + n.cols] + (v[o + n.cols + 1] - v[o + n.cols]) * tc;
  return top + (bottom - top) * tr;
}

/** Per raster column: its node column and its share of the way to the next (as `blend` works them out). */
export interface ColumnBlend { k: Int32Array; t: Float64Array }

export function columnBlend(n: CellNodes, width: number): ColumnBlend {
  const k = new Int32Array(width), t = new Float64Array(width);
  for (let c = 0; c < width; c++) {
    let kc = Math.floor(c / n.step);
    if (kc > n.cols - 2) kc = n.cols - 2;
    k[c] = kc;
    t[c] = (c - kc * n.step) / n.step;
  }
  return { k, t };
}

/** The positions of row r's cells c0..c1 − 1 into xs, ys from index `at`: bit for bit `blend`, without its per-cell divisions. */
export function rowPositions(n: CellNodes, cb: ColumnBlend, r: number, c0: number, c1: number, xs: Float64Array, ys: Float64Array, at: number): void {
  let kr = Math.floor(r / n.step);
  if (kr > n.rows - 2) kr = n.rows - 2;
  const tr = (r - kr * n.step) / n.step;
  const vx = n.x, vy = n.y, cols = n.cols, base = kr * cols;
  for (let c = c0; c < c1; c++) {
    const o = base + cb.k[c], tc = cb.t[c], d = o + cols;
    const tx = vx[o] + (vx[o + 1] - vx[o]) * tc, bx = vx[d] + (vx[d + 1] - vx[d]) * tc;
    const ty = vy[o] + (vy[o + 1] - vy[o]) * tc, by = vy[d] + (vy[d + 1] - vy[d]) * tc;
    xs[at + c - c0] = tx + (bx - tx) * tr;
    ys[at + c - c0] = ty + (by - ty) * tr;
  }
}

/** 12345 -> "12,345". */
function thousands(n: number): string {
  return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

/** The cell size of the grid itself in metres (the smaller pixel side; for geographic grids at latitude `latDeg`). */
export function gridCellM(grid: Grid, latDeg: number): number {
  const t = grid.transform;
  let dx = Math.abs(t[1]), dy = Math.abs(t[5]);
  if (grid.crs.geographic) { dx *= 111_320 * Math.cos((latDeg * Math.PI) / 180); dy *= 110_574; }
  else { const k = metresPerUnit(grid.crs.horizontalUnit); dx *= k; dy *= k; }
  return Math.min(dx, dy);
}

/**
 * The cells over `area` (WGS 84), aligned with the grid's pixel edges where the cell size is the grid's own,
 * at most `maxCells` cells over the area's bounding box; beyond that a `too-large` error names the limit and
 * the smallest cell size that fits.
 */
export function coverageLayout(grid: Grid, area: AreaPolygon, cellM: number, maxCells = DEFAULT_MAX_COVERAGE_CELLS): { width: number; height: number; transform: GeoTransform; rings: Array<Array<[number, number]>> } {
  const t = grid.transform;
  check(t[2] === 0 && t[4] === 0, 'The elevation grid is rotated (its geotransform has rotation terms); coverage rasters need a north-up grid. Warp it north up (gdalwarp) and upload it again.');
  check(Number.isFinite(cellM) && cellM > 0, `the coverage cell size must be a positive number of metres, got ${cellM}.`);
  const toGrid = createTransform(WGS84, grid.crs);
  const rings = area.coordinates.map((ring) => ring.map(([lon, lat]) => toGrid.forward(lon, lat)));
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity, latSum = 0;
  for (const [x, y] of rings[0]) { minX = Math.min(minX, x); maxX = Math.max(maxX, x); minY = Math.min(minY, y); maxY = Math.max(maxY, y); }
  for (const p of area.coordinates[0]) latSum += p[1];
  const lat = latSum / area.coordinates[0].length;
  // cell size in CRS units
  let sx: number, sy: number;
  if (grid.crs.geographic) { sx = cellM / (111_320 * Math.cos((lat * Math.PI) / 180)); sy = cellM / 110_574; }
  else { const k = metresPerUnit(grid.crs.horizontalUnit); sx = cellM / k; sy = sx; }
  // snap the raster's corner to the grid's pixel edges (a multiple of the cell size away from the grid origin)
  const x0 = t[0] + Math.floor((minX - t[0]) / sx) * sx;
  const yTop = t[3] - Math.floor((t[3] - maxY) / sy) * sy;
  const width = Math.max(1, Math.ceil((maxX - x0) / sx - 1e-9));
  const height = Math.max(1, Math.ceil((yTop - minY) / sy - 1e-9));
  const n = width * height;
  if (n > maxCells) {
    const fit = Math.ceil(cellM * Math.sqrt(n / maxCells) * 100) / 100;
    throw new TerrainError('too-large', `The coverage raster would have ${thousands(n)} cells (${width} x ${height} at ${cellM} m), more than the limit of ${thousands(maxCells)}; use a cell size of at least ${fit} m or a smaller area.`);
  }
  return { width, height, transform: [x0, sx, 0, yTop, 0, -sy], rings };
}

/** 1 where a cell centre lies inside the rings (scanlines at the cell centres, even-odd rule over every ring, so holes stay out). */
function areaMask(rings: Array<Array<[number, number]>>, width: number, height: number, x0: number, sx: number, yTop: number, sy: number): { inside: Uint8Array; insideCount: number } {
  const inside = new Uint8Array(width * height);
  const xs: number[] = [];
  let insideCount = 0;
  for (let r = 0; r < height; r++) {
    const yc = yTop - (r + 0.5) * sy;
    xs.length = 0;
    for (const ring of rings) {
      for (let i = 0; i + 1 < ring.length; i++) {
        const [ax, ay] = ring[i], [bx, by] = ring[i + 1];
        if ((ay > yc) !== (by > yc)) xs.push(ax + ((yc - ay) * (bx - ax)) / (by - ay));
      }
    }
    xs.sort((a, b) => a - b);
    for (let k = 0; k + 1 < xs.length; k += 2) {
      const c0 = Math.max(0, Math.ceil((xs[k] - x0) / sx - 0.5));
      const c1 = Math.min(width - 1, Math.floor((xs[k + 1] - x0) / sx - 0.5));
      for (let c = c0; c <= c1; c++) { if (!inside[r * width + c]) insideCount++; inside[r * width + c] = 1; }
    }
  }
  return { inside, insideCount };
}

/**
 * The grid's heights at the cell centres, one row at a time (sampled into doubles, as every other caller of the
 * sampler does, then stored as Float32).
 */
function cellHeights(grid: Grid, width: number, height: number, x0: number, sx: number, yTop: number, sy: number): Float32Array {
  const z = new Float32Array(width * height);
  const gx = new Float64Array(width), gy = new Float64Array(width), row = new Float64Array(width);
  for (let c = 0; c < width; c++) gx[c] = x0 + (c + 0.5) * sx;
  for (let r = 0; r < height; r++) {
    gy.fill(yTop - (r + 0.5) * sy);
    sampleGridCoords(grid, gx, gy, row);
    z.set(row, r * width);
  }
  return z;
}

/** The cells of `coverageLayout` with the area mask and each cell's ground point in the local frame. */
export function coverageCells(grid: Grid, frame: LocalFrame, area: AreaPolygon, cellM: number, maxCells = DEFAULT_MAX_COVERAGE_CELLS): CoverageCells {
  const { width, height, transform, rings } = coverageLayout(grid, area, cellM, maxCells);
  const [x0, sx, , yTop, , negSy] = transform;
  const sy = -negSy;
  const { inside, insideCount } = areaMask(rings, width, height, x0, sx, yTop, sy);
  const z = cellHeights(grid, width, height, x0, sx, yTop, sy);
  // positions in the local frame at the nodes (exact), in between blended
  const step = nodeStepFor(cellM);
  const cols = Math.max(1, Math.ceil((width - 1) / step)) + 1, rows = Math.max(1, Math.ceil((height - 1) / step)) + 1;
  const nxs = new Float64Array(cols * rows), nys = new Float64Array(cols * rows);
  for (let r = 0; r < rows; r++) for (let c = 0; c < cols; c++) { nxs[r * cols + c] = x0 + (c * step + 0.5) * sx; nys[r * cols + c] = yTop - (r * step + 0.5) * sy; }
  createTransform(grid.crs, frame.crs).forwardArrays(nxs, nys);
  const k = frame.scale;
  for (let i = 0; i < nxs.length; i++) { nxs[i] = (nxs[i] - frame.originE) / k; nys[i] = (nys[i] - frame.originN) / k; }
  const nodes: CellNodes = { step, cols, rows, x: nxs, y: nys };
  // one cell's ground area from the local positions of its neighbours near the area's middle
  const mr = Math.floor(height / 2), mc = Math.floor(width / 2);
  let cellAreaM2 = cellM * cellM;
  if (width > 1 && height > 1) {
    const px = blend(nodes, nxs, mr, mc), py = blend(nodes, nys, mr, mc);
    const ax = blend(nodes, nxs, mr, mc + 1) - px, ay = blend(nodes, nys, mr, mc + 1) - py;
    const bx = blend(nodes, nxs, mr + 1, mc) - px, by = blend(nodes, nys, mr + 1, mc) - py;
    cellAreaM2 = Math.abs(ax * by - ay * bx);
  }
  return { width, height, transform, crs: grid.crs, cellM, cellAreaM2, inside, z, nodes, insideCount };
}

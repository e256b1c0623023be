/** Sampling a grid at points given in any CRS, and along WGS 84 polylines at a fixed geodesic ground step. */
import type { Grid, GridCrs } from './grid';
import { sampleBilinear, sampleNearest } from './grid';
import { WGS84, createTransform } from './crs';
import { TerrainError, check } from './errors';
import { lineStations } from './geodesic-line';

/** How a height is read between pixel centres. */
export type SampleMethod = 'bilinear' | 'nearest';

/** Options for point sampling: the CRS of the given points (default WGS 84 lon/lat) and the method (default bilinear). */
interface SampleOptions {
  crs?: GridCrs;
  method?: SampleMethod;
}

function checkMethod(method: unknown): SampleMethod {
  if (method === undefined) return 'bilinear';
  check(method === 'bilinear' || method === 'nearest', `method must be "bilinear" or "nearest", got ${JSON.stringify(method)}.`);
  return method;
}

/** Height (metres) at one point, or null when the point is outside the grid or on nodata. */
export function sampleAt(grid: Grid, x: number, y: number, opts: SampleOptions = {}): number | null {
  check(Number.isFinite(x) && Number.isFinite(y), `A sample point needs two finite coordinates, got (${x}, ${y}).`);
  const method = checkMethod(opts.method);
  const [gx, gy] = createTransform(opts.crs ?? WGS84, grid.crs).forward(x, y);
  const v = method === 'nearest' ? sampleNearest(grid, gx, gy) : sampleBilinear(grid, gx, gy);
  return Number.isNaN(v) ? null : v;
}

/** Heights at many points (one transform set-up for all); unknown ones are null and counted. */
export function samplePoints(
  grid: Grid,
  points: ReadonlyArray<readonly [number, number]>,
  opts: SampleOptions = {},
): { values: Array<number | null>; unknownCount: number } {
  check(Array.isArray(points), 'points must be an array of [x, y] pairs.');
  const method = checkMethod(opts.method);
  const n = points.length;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const p = points[i];
    check(Array.isArray(p) && Number.isFinite(p[0]) && Number.isFinite(p[1]), `Point ${i} must be [x, y] with finite numbers, got ${JSON.stringify(p)}.`);
    xs[i] = p[0];
    ys[i] = p[1];
  }
  createTransform(opts.crs ?? WGS84, grid.crs).forwardArrays(xs, ys);
  const out = new Float64Array(n);
  const unknownCount = sampleGridCoords(grid, xs, ys, out, method);
  const values: Array<number | null> = new Array(n);
  for (let i = 0; i < n; i++) values[i] = Number.isNaN(out[i]) ? null : out[i];
  return { values, unknownCount };
}

/**
 * The sampling hot loop: heights at grid-CRS coordinates into `out` (NaN = unknown); returns the unknown count.
 * Bilinear between the four surrounding pixel centres, edge pixels clamped within half a pixel of the border,
 * exactly as `sampleBilinear` in grid.ts (that function is the reference the tests compare this loop with);
 * the right and bottom outer edges are off the grid, as GDAL says.
 */
export function sampleGridCoords(grid: Grid, xs: ArrayLike<number>, ys: ArrayLike<number>, out: Float64Array | Float32Array, method: SampleMethod = 'bilinear'): number {
  const t = grid.transform;
  const det = t[1] * t[5] - t[2] * t[4];
  if (det === 0) throw new TerrainError('no-georeference', 'The grid transform has a zero pixel size; the georeference is broken.');
  // inverse affine, precomputed once: col = a0 + a1*x + a2*y; row = b0 + b1*x + b2*y (corner-based pixels)
  const a1 = t[5] / det, a2 = -t[2] / det, b1 = -t[4] / det, b2 = t[1] / det;
  const a0 = -(a1 * t[0] + a2 * t[3]), b0 = -(b1 * t[0] + b2 * t[3]);
  return method === 'nearest' ? nearestLoop(grid, xs, ys, out, a0, a1, a2, b0, b1, b2) : bilinearLoop(grid, xs, ys, out, a0, a1, a2, b0, b1, b2);
}

function bilinearLoop(grid: Grid, xs: ArrayLike<number>, ys: ArrayLike<number>, out: Float64Array | Float32Array, a0: number, a1: number, a2: number, b0: number, b1: number, b2: number): number {
  const { width, height, data } = grid;
  const wMax = width - 1, hMax = height - 1;
  // pixel-centre coordinates: fx = col - 0.5, fy = row - 0.5
  const c0f = a0 - 0.5, r0f = b0 - 0.5;
  let unknown = 0;
  const n = out.length;
  for (let i = 0; i < n; i++) {
    const x = xs[i], y = ys[i];
    let fx = c0f + a1 * x + a2 * y;
    let fy = r0f + b1 * x + b2 * y;
    let v: number;
    if (fx >= 0 && fy >= 0 && fx < wMax && fy < hMax) {
      // interior: four neighbours exist, no clamping (the hot path)
      const c = fx | 0, r = fy | 0;
      const tx = fx - c, ty = fy - r;
      const o = r * width + c;
      const v00 = data[o], v10 = data[o + 1], v01 = data[o + width], v11 = data[o + width + 1];
      const top = v00 + (v10 - v00) * tx;
      v = top + (v01 + (v11 - v01) * tx - top) * ty;
    } else if (fx >= -0.5 && fy >= -0.5 && fx < wMax + 0.5 && fy < hMax + 0.5) {
      // within half a pixel of the edge: clamp to the edge pixels
      if (fx < 0) fx = 0; else if (fx > wMax) fx = wMax;
      if (fy < 0) fy = 0; else if (fy > hMax) fy = hMax;
      const c = fx | 0, r = fy | 0;
      const c1 = c < wMax ? c + 1 : c;
      const o0 = r * width, o1 = r < hMax ? o0 + width : o0;
      const tx = fx - c, ty = fy - r;
      const v00 = data[o0 + c], v10 = data[o0 + c1], v01 = data[o1 + c], v11 = data[o1 + c1];
      const top = v00 + (v10 - v00) * tx;
      v = top + (v01 + (v11 - v01) * tx - top) * ty;
    } else v = NaN;
    out[i] = v;
    if (v !== v) unknown++;
  }
  return unknown;
}

function nearestLoop(grid: Grid, xs: ArrayLike<number>, ys: ArrayLike<number>, out: Float64Array | Float32Array, a0: number, a1: number, a2: number, b0: number, b1: number, b2: number): number {
  const { width, height, data } = grid;
  let unknown = 0;
  const n = out.length;
  for (let i = 0; i < n; i++) {
    const x = xs[i], y = ys[i];
    const pc = a0 + a1 * x + a2 * y;
    const pr = b0 + b1 * x + b2 * y;
    let v = NaN;
    if (pc >= 0 && pr >= 0 && pc < width && pr < height) v = data[(pr | 0) * width + (pc | 0)]; // GDAL: far edges are off
    out[i] = v;
    if (v !== v) unknown++;
  }
  return unknown;
}

/** Geodesic positions every `stepM` metres along a WGS 84 polyline (plus its end point), distances exact. */
export function densifyLine(lineLonLat: ReadonlyArray<readonly [number, number]>, stepM: number): { lon: Float64Array; lat: Float64Array; distanceM: Float64Array } {
  const { lon, lat, distanceM } = lineStations(lineLonLat, stepM);
  return { lon, lat, distanceM };
}

/**
 * Heights every `stepM` metres of geodesic distance along a WGS 84 [lon, lat] polyline (GeographicLib geodesics,
 * Karney 2013). Positions and grid coordinates come exact at 25 m knots and linear between them (see
 * geodesic-line.ts for the error bound), then one sampling pass; elevationM is NaN where unknown.
 */
export function sampleAlongLine(
  grid: Grid,
  lineLonLat: ReadonlyArray<readonly [number, number]>,
  opts: { stepM: number; method?: SampleMethod },
): { lon: Float64Array; lat: Float64Array; distanceM: Float64Array; elevationM: Float64Array; unknownCount: number } {
  check(opts !== null && typeof opts === 'object', 'sampleAlongLine needs options { stepM }.');
  const method = checkMethod(opts.method);
  const { lon, lat, distanceM, x, y } = lineStations(lineLonLat, opts.stepM, grid.crs);
  const elevationM = new Float64Array(lon.length);
  const unknownCount = sampleGridCoords(grid, x as Float64Array, y as Float64Array, elevationM, method);
  return { lon, lat, distanceM, elevationM, unknownCount };
}

/** Grid statistics for a site: size, resolution, CRS, bounds (grid CRS and WGS 84), elevation range, nodata share. */
import type { GeoTransform, Grid, LengthUnit } from './grid';
import { pixelToMap } from './grid';
import { WGS84, createTransform } from './crs';

/** What Loftline shows and stores about an uploaded grid. */
export interface GridMetadata {
  width: number;
  height: number;
  crs: { epsg: number | null; proj4: string; name: string };
  /** Pixel size [dx, dy] in CRS units, both positive (for rotated grids, the length of each pixel side). */
  resolution: [number, number];
  /** [minx, miny, maxx, maxy] in the grid CRS. */
  bounds: [number, number, number, number];
  /** [minLon, minLat, maxLon, maxLat] of the grid outline (edges followed, not just corners). */
  boundsWgs84: [number, number, number, number];
  /** Metres, over known pixels; null only if every pixel is unknown. */
  elevation: { min: number | null; max: number | null; mean: number | null };
  /** Fraction 0..1 of pixels without a height. */
  nodataShare: number;
  /** Unit the file stored heights in (values are converted to metres). */
  verticalUnit: LengthUnit;
}

/** Bounds of the pixel rectangle [c0, c1] x [r0, r1] under `t`, in the transform's CRS. */
function pixelBounds(t: GeoTransform, c0: number, r0: number, c1: number, r1: number): [number, number, number, number] {
  const corners = [pixelToMap(t, c0, r0), pixelToMap(t, c1, r0), pixelToMap(t, c0, r1), pixelToMap(t, c1, r1)];
  const xs = corners.map((p) => p[0]);
  const ys = corners.map((p) => p[1]);
  return [Math.min(...xs), Math.min(...ys), Math.max(...xs), Math.max(...ys)];
}

/** WGS 84 bounds of a pixel rectangle, following its edges (a projected rectangle is curved in lon/lat). */
export function pixelBoundsWgs84(grid: Pick<Grid, 'transform' | 'crs'>, c0: number, r0: number, c1: number, r1: number): [number, number, number, number] {
  const tr = createTransform(grid.crs, WGS84);
  const N = 32;
  let minLon = Infinity, minLat = Infinity, maxLon = -Infinity, maxLat = -Infinity;
  for (let k = 0; k <= N; k++) {
    const f = k / N;
    const c = c0 + f * (c1 - c0), r = r0 + f * (r1 - r0);
    for (const [pc, pr] of [[c, r0], [c, r1], [c0, r], [c1, r]]) {
      const [x, y] = pixelToMap(grid.transform, pc, pr);
      const [lon, lat] = tr.forward(x, y);
      if (!Number.isFinite(lon) || !Number.isFinite(lat)) continue;
      minLon = Math.min(minLon, lon); maxLon = Math.max(maxLon, lon);
      minLat = Math.min(minLat, lat); maxLat = Math.max(maxLat, lat);
    }
  }
  return [minLon, minLat, maxLon, maxLat];
}

/** Running height statistics over a grid read in pieces, in row-major order (the same sum as one pass). */
export class HeightStats {
  min = Infinity;
  max = -Infinity;
  sum = 0;
  known = 0;
  count = 0;
  add(data: ArrayLike<number>): void {
    let { min, max, sum, known } = this;
    for (let i = 0; i < data.length; i++) {
      const v = data[i];
      if (v !== v) continue;
      if (v < min) min = v;
      if (v > max) max = v;
      sum += v;
      known++;
    }
    this.min = min; this.max = max; this.sum = sum; this.known = known;
    this.count += data.length;
  }
}

/** The metadata of a grid from its facts and the statistics of all its heights. */
export function gridMetadata(grid: Pick<Grid, 'width' | 'height' | 'transform' | 'crs' | 'sourceVerticalUnit'>, stats: HeightStats): GridMetadata {
  const { width, height, transform: t } = grid;
  const { min, max, sum, known, count } = stats;
  const round = (v: number) => Math.round(v * 1000) / 1000; // millimetres: no false precision in reports
  return {
    width,
    height,
    crs: { epsg: grid.crs.epsg, proj4: grid.crs.proj4, name: grid.crs.name },
    resolution: [Math.hypot(t[1], t[4]), Math.hypot(t[2], t[5])],
    bounds: pixelBounds(t, 0, 0, width, height),
    boundsWgs84: pixelBoundsWgs84(grid, 0, 0, width, height),
    elevation: known ? { min: round(min), max: round(max), mean: round(sum / known) } : { min: null, max: null, mean: null },
    nodataShare: (count - known) / count,
    verticalUnit: grid.sourceVerticalUnit,
  };
}

/** Describe a grid in one pass over its heights (the double-precision sum stays exact to well below a millimetre). */
export function describeGrid(grid: Grid): GridMetadata {
  const stats = new HeightStats();
  stats.add(grid.data);
  return gridMetadata(grid, stats);
}

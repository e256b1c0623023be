/** The one elevation-grid type of Loftline, and the pixel <-> map arithmetic every module shares. */

/**
 * Affine georeference in GDAL's geotransform order, pixel-is-area:
 * x = t[0] + col * t[1] + row * t[2];  y = t[3] + col * t[4] + row * t[5],
 * where (col, row) = (0, 0) is the outer corner of the first pixel and pixel centres sit at +0.5.
 */
export type GeoTransform = readonly [number, number, number, number, number, number];

/** Horizontal/vertical length units a grid can carry; values in `Grid.data` are always metres. */
export type LengthUnit = 'metre' | 'foot' | 'us-survey-foot' | 'degree';

/** Coordinate reference system of a grid: EPSG code where known, always a proj4 definition. */
export interface GridCrs {
  epsg: number | null;
  proj4: string;
  /** True for longitude/latitude systems (axis order here is always x = lon, y = lat). */
  geographic: boolean;
  horizontalUnit: LengthUnit;
  /** Human-readable name, e.g. "WGS 84 / UTM zone 33N". */
  name: string;
}

/** An elevation grid: row-major Float32Array (index = row * width + col), heights in metres, NaN where unknown. */
export interface Grid {
  width: number;
  height: number;
  data: Float32Array;
  transform: GeoTransform;
  crs: GridCrs;
  /** The nodata value as stored in the file (data already holds NaN there), or null when the file declares none. */
  nodata: number | null;
  /** Unit the file stored heights in before conversion to metres. */
  sourceVerticalUnit: LengthUnit;
}

/** Pixel coordinates (col, row, corner-based, fractional) of a map point. */
export function mapToPixel(t: GeoTransform, x: number, y: number): [number, number] {
  const det = t[1] * t[5] - t[2] * t[4];
  if (det === 0) throw new Error('Grid transform is singular (pixel size 0): the georeference is broken.');
  const dx = x - t[0];
  const dy = y - t[3];
  return [(t[5] * dx - t[2] * dy) / det, (t[1] * dy - t[4] * dx) / det];
}

/** Map coordinates of a fractional corner-based pixel position. */
export function pixelToMap(t: GeoTransform, col: number, row: number): [number, number] {
  return [t[0] + col * t[1] + row * t[2], t[3] + col * t[4] + row * t[5]];
}

/**
 * Bilinear height at map point (x, y) in the grid's CRS, between the four surrounding pixel centres.
 * Returns NaN outside the grid or when any of the four neighbours is nodata (never a silent 0).
 * Points within half a pixel of the edge use the edge pixels (clamped), as GDAL's sampler does. A point is on the
 * grid when 0 <= col < width and 0 <= row < height (GDAL 3.6.2 gdallocationinfo: the pixel is floor(col),
 * floor(row)), so the left and top outer edges are on the grid and the right and bottom ones are off it.
 */
export function sampleBilinear(grid: Grid, x: number, y: number): number {
  const [pc, pr] = mapToPixel(grid.transform, x, y);
  const { width, height, data } = grid;
  if (!(pc >= 0 && pr >= 0 && pc < width && pr < height)) return NaN;
  let fx = pc - 0.5;
  let fy = pr - 0.5;
  if (fx < 0) fx = 0; else if (fx > width - 1) fx = width - 1;
  if (fy < 0) fy = 0; else if (fy > height - 1) fy = height - 1;
  const c0 = Math.floor(fx);
  const r0 = Math.floor(fy);
  const c1 = c0 + 1 < width ? c0 + 1 : c0;
  const r1 = r0 + 1 < height ? r0 + 1 : r0;
  const tx = fx - c0;
  const ty = fy - r0;
  const v00 = data[r0 * width + c0];
  const v10 = data[r0 * width + c1];
  const v01 = data[r1 * width + c0];
  const v11 = data[r1 * width + c1];
  const top = v00 + (v10 - v00) * tx;
  const bottom = v01 + (v11 - v01) * tx;
  return top + (bottom - top) * ty; // NaN propagates from any nodata neighbour
}

/** Nearest-pixel height at map point (x, y) (the pixel that contains it, as gdallocationinfo reads); NaN off the grid or on nodata. */
export function sampleNearest(grid: Grid, x: number, y: number): number {
  const [pc, pr] = mapToPixel(grid.transform, x, y);
  // the same "on the grid" rule as sampleBilinear: the right and bottom outer edges are off it (GDAL)
  if (!(pc >= 0 && pr >= 0 && pc < grid.width && pr < grid.height)) return NaN;
  return grid.data[Math.floor(pr) * grid.width + Math.floor(pc)];
}

/** Build a grid from plain values (tests, synthetic demo terrain); validates sizes. */
export function createGrid(opts: {
  width: number;
  height: number;
  data: Float32Array;
  transform: GeoTransform;
  crs: GridCrs;
  nodata?: number | null;
  sourceVerticalUnit?: LengthUnit;
}): Grid {
  const { width, height, data } = opts;
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 1 || height < 1) {
    throw new Error(`Grid size must be positive whole numbers, got ${width} x ${height}.`);
  }
  if (data.length !== width * height) {
    throw new Error(`Grid data length ${data.length} does not match ${width} x ${height} = ${width * height}.`);
  }
  return {
    width,
    height,
    data,
    transform: opts.transform,
    crs: opts.crs,
    nodata: opts.nodata ?? null,
    sourceVerticalUnit: opts.sourceVerticalUnit ?? 'metre',
  };
}

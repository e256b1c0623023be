/** The coverage raster as a GeoTIFF: five Float32 bands in the grid's CRS (a sixth when the spec asks for views from all round), nodata outside the area. */
import type { CoverageRaster } from './coverage';
import { float32GeoTiffParts, writeFloat32GeoTiff, type Float32GeoTiff } from './geotiff-write';
import { writeCloudOptimisedGeoTiff } from './geotiff-cog';
import { check } from './errors';

/** Nodata value of the file's cells outside the survey area. */
export const COVERAGE_NODATA = -9999;

/** The band descriptions, in band order. */
export function coverageBandNames(r: CoverageRaster): string[] {
  const basis = r.guaranteed ? 'guaranteed' : 'planned';
  return [
    `views (${basis})`,
    'finest GSD, cm',
    'views at or below the spec GSD',
    'largest angle between viewing rays, degrees',
    `predicted vertical sigma, m (advisory, ${r.imageErrorPx} px image error)`,
    // only when the spec asks for views from all round
    ...(r.directionGapDeg ? ['widest gap between the directions of the oblique views, degrees'] : []),
  ];
}

/** The runs of cells outside the area (0 in the mask), as start and end (exclusive) pairs in cell order. */
function outsideRuns(inside: Uint8Array): Int32Array {
  const out: number[] = [];
  let i = 0;
  const n = inside.length;
  while (i < n) {
    i = inside.indexOf(0, i);
    if (i < 0) break;
    let e = inside.indexOf(1, i);
    if (e < 0) e = n;
    out.push(i, e);
    i = e;
  }
  return Int32Array.from(out);
}

/** A band's values (counts exact in Float32) from cell `from` on, as many as `out` holds, with nodata over the cells outside the area. */
function fillBand(out: Float32Array, values: Uint16Array | Float32Array, outside: Int32Array, from = 0): void {
  const to = from + out.length;
  out.set(from === 0 && to === values.length ? values : values.subarray(from, to));
  for (let k = 0; k < outside.length; k += 2) {
    const a = outside[k], b = outside[k + 1];
    if (b <= from) continue;
    if (a >= to) break;
    out.fill(COVERAGE_NODATA, Math.max(a, from) - from, Math.min(b, to) - from);
  }
}

/**
 * Band 1 views, 2 finest GSD (cm), 3 views at or below the spec's GSD, 4 largest angle between rays (degrees),
 * 5 predicted vertical σ (m), 6 (when the spec asks for it) the widest gap between oblique view directions
 * (degrees); -9999 outside the area, NaN inside where a measure has no value.
 */
function coverageBands(r: CoverageRaster): Float32GeoTiff {
  const { cells } = r;
  check(cells.crs.epsg !== null, `the grid's CRS (${cells.crs.name}) has no EPSG code to write into the raster.`);
  const n = cells.width * cells.height;
  const runs = outsideRuns(cells.inside);
  const band = (b: Uint16Array | Float32Array) => { const out = new Float32Array(n); fillBand(out, b, runs); return out; };
  const bands = [band(r.views), band(r.finestGsdCm), band(r.viewsAtSpecGsd), band(r.maxRayAngleDeg), band(r.sigmaVerticalM), ...(r.directionGapDeg ? [band(r.directionGapDeg)] : [])];
  return {
    width: cells.width, height: cells.height, bands, bandNames: coverageBandNames(r), transform: cells.transform,
    epsg: cells.crs.epsg!, geographic: cells.crs.geographic, nodata: COVERAGE_NODATA,
  };
}

export function coverageGeoTiff(r: CoverageRaster): Uint8Array {
  return writeFloat32GeoTiff(coverageBandWriters(r));
}

/**
 * The same file in parts to write one after the other (`float32GeoTiffParts`: each part good until the next is
 * asked for): the way to write a large raster without holding the whole file.
 */
export function coverageGeoTiffParts(r: CoverageRaster, chunkValues?: number): Generator<Uint8Array> {
  return float32GeoTiffParts(coverageBandWriters(r), chunkValues);
}

/** The file's description with each band as a writer of its values (nodata outside the area). */
function coverageBandWriters(r: CoverageRaster): Parameters<typeof writeFloat32GeoTiff>[0] {
  const { cells } = r;
  check(cells.crs.epsg !== null, `the grid's CRS (${cells.crs.name}) has no EPSG code to write into the raster.`);
  // each band written straight into the file: the values copied and converted by the engine in one call, then
  // nodata over the runs of cells outside the area (a few per row), not a test per cell
  const runs = outsideRuns(cells.inside);
  // one writer per distinct array: a views-only raster's measures share arrays (`viewsOnly`), and the file then
  // holds each once
  const writers = new Map<Uint16Array | Float32Array, (out: Float32Array, from: number) => void>();
  const band = (b: Uint16Array | Float32Array) => {
    let w = writers.get(b);
    if (!w) { w = (out: Float32Array, from: number) => fillBand(out, b, runs, from); writers.set(b, w); }
    return w;
  };
  return {
    width: cells.width, height: cells.height, bandNames: coverageBandNames(r), transform: cells.transform,
    epsg: cells.crs.epsg!, geographic: cells.crs.geographic, nodata: COVERAGE_NODATA,
    bands: [band(r.views), band(r.finestGsdCm), band(r.viewsAtSpecGsd), band(r.maxRayAngleDeg), band(r.sigmaVerticalM), ...(r.directionGapDeg ? [band(r.directionGapDeg)] : [])],
  };
}

/** The same bands as a Cloud-Optimised GeoTIFF (tiled, with overviews), for downloads a GIS may read in parts. */
export function coverageCog(r: CoverageRaster): Uint8Array {
  return writeCloudOptimisedGeoTiff(coverageBands(r));
}

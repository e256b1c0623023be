/** The coverage raster as a GeoTIFF: five Float32 bands in the grid's CRS, nodata outside the area. */
import type { CoverageRaster } from './coverage';
import { writeFloat32GeoTiff, type Float32GeoTiff } from './geotiff-write';
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
  ];
}

/**
 * Band 1 views, 2 finest GSD (cm), 3 views at or below the spec's GSD, 4 largest angle between rays (degrees),
 * 5 predicted vertical σ (m); -9999 outside the area, NaN inside where a measure has no value.
 */
function coverageBands(r: CoverageRaster): Float32GeoTiff {
  const { cells } = r;
  check(cells.crs.epsg !== null, `the grid's CRS (${cells.crs.name}) has no EPSG code to write into the raster.`);
  const n = cells.width * cells.height;
  // one loop per array type, so each stays monomorphic
  const counts = (b: Uint16Array) => {
    const out = new Float32Array(n), inside = cells.inside;
    for (let i = 0; i < n; i++) out[i] = inside[i] === 0 ? COVERAGE_NODATA : b[i];
    return out;
  };
  const figures = (b: Float32Array) => {
    const out = new Float32Array(n), inside = cells.inside;
    for (let i = 0; i < n; i++) out[i] = inside[i] === 0 ? COVERAGE_NODATA : b[i];
    return out;
  };
  const bands = [counts(r.views), figures(r.finestGsdCm), counts(r.viewsAtSpecGsd), figures(r.maxRayAngleDeg), figures(r.sigmaVerticalM)];
  return {
    width: cells.width, height: cells.height, bands, bandNames: coverageBandNames(r), transform: cells.transform,
    epsg: cells.crs.epsg!, geographic: cells.crs.geographic, nodata: COVERAGE_NODATA,
  };
}

export function coverageGeoTiff(r: CoverageRaster): Uint8Array {
  const { cells } = r;
  check(cells.crs.epsg !== null, `the grid's CRS (${cells.crs.name}) has no EPSG code to write into the raster.`);
  const inside = cells.inside, n = cells.width * cells.height;
  // each band written straight into the file (one loop per array type, so each stays monomorphic)
  const counts = (b: Uint16Array) => (out: Float32Array) => { for (let i = 0; i < n; i++) out[i] = inside[i] === 0 ? COVERAGE_NODATA : b[i]; };
  const figures = (b: Float32Array) => (out: Float32Array) => { for (let i = 0; i < n; i++) out[i] = inside[i] === 0 ? COVERAGE_NODATA : b[i]; };
  return writeFloat32GeoTiff({
    width: cells.width, height: cells.height, bandNames: coverageBandNames(r), transform: cells.transform,
    epsg: cells.crs.epsg!, geographic: cells.crs.geographic, nodata: COVERAGE_NODATA,
    bands: [counts(r.views), figures(r.finestGsdCm), counts(r.viewsAtSpecGsd), figures(r.maxRayAngleDeg), figures(r.sigmaVerticalM)],
  });
}

/** The same bands as a Cloud-Optimised GeoTIFF (tiled, with overviews), for downloads a GIS may read in parts. */
export function coverageCog(r: CoverageRaster): Uint8Array {
  return writeCloudOptimisedGeoTiff(coverageBands(r));
}

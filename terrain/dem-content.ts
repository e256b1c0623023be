/**
 * What a GeoTIFF must be to be read as elevation, beyond decoding: one value per pixel (no colour image),
 * a predictor that fits its samples, and a georeference that puts it somewhere on Earth. Checked on the
 * header, before any pixel is decoded; GDAL 3.6.2's verdicts on the same files are recorded in
 * tests/fixtures/grid-trust/reference.json.
 */
import type { GeoTransform, GridCrs } from './grid';
import { WGS84, createTransform } from './crs';
import { TerrainError } from './errors';
import type { SampleType } from './dem-decoders';

/** TIFF 6.0 PhotometricInterpretation values that mean colour, not a measured quantity. */
const COLOUR_PHOTOMETRICS: Record<number, string> = {
  2: 'an RGB colour image',
  3: 'a palette (colour-mapped) image',
  5: 'a CMYK (separated) colour image',
  6: 'a YCbCr colour image',
  8: 'a CIE L*a*b* colour image',
  9: 'a CIE L*a*b* colour image',
  10: 'a CIE L*a*b* colour image',
};

/** The header facts the content checks need. */
interface ContentFacts {
  photometric: number | undefined;
  hasColorMap: boolean;
  sampleType: SampleType;
  predictor: number;
}

/**
 * Refuse colour images (palette, RGB, CMYK, YCbCr, CIELab: `not-elevation`) and a floating-point predictor on
 * integer samples (`unsupported`; libtiff refuses it too: "Floating point Predictor not supported").
 */
export function checkElevationContent(f: ContentFacts): void {
  const colour = f.photometric !== undefined ? COLOUR_PHOTOMETRICS[f.photometric] : undefined;
  if (colour || f.hasColorMap) {
    throw new TerrainError('not-elevation', `The file is ${colour ?? 'a palette (colour-mapped) image'}, not an elevation grid: its pixels are colours, not heights. Export the DEM itself (one band of heights, e.g. Float32) from your GIS.`);
  }
  if (f.predictor === 3 && !f.sampleType.startsWith('float')) {
    throw new TerrainError('unsupported', `The file declares the floating-point predictor (Predictor 3) on ${f.sampleType} samples, which is not valid TIFF (GDAL refuses it too); re-export it with PREDICTOR=2 or none.`);
  }
}

/**
 * Refuse a georeference that does not put the grid on Earth: non-finite corners (a pixel size like 1e308) or
 * corners that cannot be placed in WGS 84 (a pixel size like 1e300 m; GDAL: "Point outside of projection domain").
 */
export function checkPlacement(t: GeoTransform, width: number, height: number, crs: GridCrs): void {
  const corners: Array<[number, number]> = [[0, 0], [width, 0], [0, height], [width, height]].map(([c, r]) => [t[0] + c * t[1] + r * t[2], t[3] + c * t[4] + r * t[5]]);
  const pixel = `${t[1]} x ${t[5]}`;
  if (!corners.every(([x, y]) => Number.isFinite(x) && Number.isFinite(y))) {
    throw new TerrainError('no-georeference', `The georeference puts the grid's corners at infinity (pixel size ${pixel}); it is broken, so re-export the grid from your GIS.`);
  }
  if (crs.geographic) {
    // degrees: a little past the poles is the half pixel of a pixel-is-point global grid, more is not Earth
    const bad = corners.find(([x, y]) => Math.abs(y) > 91 || Math.abs(x) > 720);
    if (bad) throw new TerrainError('no-georeference', `The georeference puts a corner of the grid at longitude ${bad[0]}, latitude ${bad[1]}, which is not on Earth (pixel size ${pixel}); the georeference is broken, so re-export the grid from your GIS.`);
    return;
  }
  let tr;
  try {
    tr = createTransform(crs, WGS84);
  } catch {
    return; // the CRS itself is checked (and refused) elsewhere
  }
  for (const [x, y] of corners) {
    let lonLat: [number, number] | undefined;
    try {
      lonLat = tr.forward(x, y) as [number, number];
    } catch {
      lonLat = undefined;
    }
    // proj4 returns out-of-domain points as non-finite or as latitudes past the poles
    if (!lonLat || !Number.isFinite(lonLat[0]) || !Number.isFinite(lonLat[1]) || Math.abs(lonLat[1]) > 91) {
      throw new TerrainError('no-georeference', `The georeference puts a corner of the grid at (${x}, ${y}) in ${crs.name}, which is not on Earth (pixel size ${pixel}); the georeference is broken, so re-export the grid from your GIS.`);
    }
  }
}

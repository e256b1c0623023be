/** Where the coverage raster lies on the hillshade image. */
import { mapToPixel, type GeoTransform } from '../../terrain/grid';

/**
 * Where the raster lies on the hillshade image, [x, y, width, height] in image pixels: both geotransforms are in
 * the grid's CRS, so the corners map linearly. Null when the hillshade has no geotransform (older sites).
 */
export function rasterRect(rasterTransform: readonly number[], width: number, height: number, hillshadeTransform: readonly number[] | null | undefined): [number, number, number, number] | null {
  if (!hillshadeTransform || hillshadeTransform.length !== 6) return null;
  const hs = hillshadeTransform as unknown as GeoTransform;
  const t = rasterTransform;
  const [x0, y0] = mapToPixel(hs, t[0], t[3]);
  const [x1, y1] = mapToPixel(hs, t[0] + width * t[1], t[3] + height * t[5]);
  return [Math.min(x0, x1), Math.min(y0, y1), Math.abs(x1 - x0), Math.abs(y1 - y0)];
}

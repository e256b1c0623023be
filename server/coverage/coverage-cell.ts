/**
 * The figures of one coverage cell under a point, read from the stored raster (a COG) with geotiff.js: only the
 * tile holding the cell is decoded. The last few rasters read stay parsed in memory, so tapping around a map
 * does not read the file again.
 */
import { fromArrayBuffer, type GeoTIFF } from 'geotiff';
import type { CoverageCell, CoverageDocument } from '../../contracts/coverage';
import { WGS84, createTransform, crsFromEpsg } from '../../terrain/crs';

const cache = new Map<string, Promise<GeoTIFF>>();
const CACHE_SIZE = 4;

/** The parsed raster of `key`, loading it with `load` on a miss (least recently used out first). */
function parsed(key: string, load: () => Promise<Buffer>): Promise<GeoTIFF> {
  let p = cache.get(key);
  if (p) { cache.delete(key); cache.set(key, p); return p; }
  p = load().then((b) => fromArrayBuffer(b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength) as ArrayBuffer));
  p.catch(() => cache.delete(key));
  cache.set(key, p);
  while (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value as string);
  return p;
}

const value = (v: number, nodata: number) => (v === nodata || !Number.isFinite(v) ? null : v);

/** The cell at WGS 84 `lon`, `lat` of the raster stored under `key`, with the spec items it fails. */
export async function coverageCellAt(key: string, load: () => Promise<Buffer>, doc: CoverageDocument, lon: number, lat: number): Promise<CoverageCell> {
  const { raster, spec } = doc;
  const crs = crsFromEpsg(raster.crs.epsg!);
  const [x, y] = createTransform(WGS84, crs).forward(lon, lat);
  const t = raster.geotransform;
  const col = Math.floor((x - t[0]) / t[1]);
  const row = Math.floor((y - t[3]) / t[5]);
  const empty: CoverageCell = { lon, lat, inside: false, views: null, finestGsdCm: null, viewsAtSpecGsd: null, maxRayAngleDeg: null, sigmaVerticalM: null, fails: [] };
  if (col < 0 || row < 0 || col >= raster.width || row >= raster.height) return empty;
  const tiff = await parsed(key, load);
  const image = await tiff.getImage(0);
  const bands = (await image.readRasters({ window: [col, row, col + 1, row + 1] })) as unknown as ArrayLike<number>[];
  const [views, gsd, atSpec, angle, sigma] = bands.map((b) => b[0]);
  if (views === raster.nodata) return empty;
  const fails: string[] = [];
  const g = value(gsd, raster.nodata);
  const s = value(sigma, raster.nodata);
  if (g === null || !(g <= spec.maxGsdCm)) fails.push(`no view at or finer than ${spec.maxGsdCm} cm`);
  if (views < spec.minViews) fails.push(`fewer than ${spec.minViews} views`);
  if (spec.maxSigmaVerticalM !== null && (s === null || !(s <= spec.maxSigmaVerticalM))) fails.push(`predicted vertical σ above ${spec.maxSigmaVerticalM} m (advisory)`);
  return { lon, lat, inside: true, views, finestGsdCm: g, viewsAtSpecGsd: value(atSpec, raster.nodata), maxRayAngleDeg: value(angle, raster.nodata), sigmaVerticalM: s, fails };
}

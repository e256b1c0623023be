/**
 * A Cloud-Optimised GeoTIFF writer for Float32 rasters (bytes out, no I/O): tiled, with reduced-resolution
 * overviews, every directory before any pixel data and the smallest overview's tiles first, so a reader can fetch
 * the header and one tile with two range requests. The layout rules are those GDAL's
 * `validate_cloud_optimized_geotiff.py` (GDAL 3.6.2, python3-gdal) checks: main IFD at byte 8, IFDs in order of
 * decreasing size, tile data after the IFDs, overview data before the full-resolution data.
 */
import type { Float32GeoTiff } from './geotiff-write';
import { check } from './errors';

const SHORT = 3, LONG = 4, DOUBLE = 12, ASCII = 2;
const TYPE_BYTES: Record<number, number> = { [SHORT]: 2, [LONG]: 4, [DOUBLE]: 8, [ASCII]: 1 };

interface Entry { tag: number; type: number; values: number[] | string }

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

interface Level { width: number; height: number; bands: Float32Array[] }

/**
 * Halve a level by taking each 2 x 2 block's top-left cell (nearest neighbour): the measures are counts and
 * worst-case figures, which an average would blur into values no cell has.
 */
function halve(l: Level): Level {
  const width = Math.ceil(l.width / 2), height = Math.ceil(l.height / 2);
  const bands = l.bands.map((b) => {
    const out = new Float32Array(width * height);
    for (let r = 0; r < height; r++) for (let c = 0; c < width; c++) out[r * width + c] = b[2 * r * l.width + 2 * c];
    return out;
  });
  return { width, height, bands };
}

/** Options: tile side (a multiple of 16, TIFF 6.0 section 15). */
interface CogOptions { tilePx?: number }

/** The raster as a COG: band-separate tiles of `tilePx` (default 256), overviews by halving until one tile holds it. */
export function writeCloudOptimisedGeoTiff(r: Float32GeoTiff, opts: CogOptions = {}): Uint8Array {
  const tile = opts.tilePx ?? 256;
  check(Number.isInteger(tile) && tile >= 16 && tile % 16 === 0, `the tile side must be a multiple of 16 pixels, got ${tile}.`);
  const nb = r.bands.length;
  check(nb >= 1 && r.bandNames.length === nb, `a GeoTIFF needs at least one band and one name per band, got ${nb} bands and ${r.bandNames.length} names.`);
  check(r.transform[2] === 0 && r.transform[4] === 0, 'the raster must be north up (no rotation terms) to be written.');
  for (const b of r.bands) check(b.length === r.width * r.height, `every band must hold ${r.width} x ${r.height} values, got ${b.length}.`);
  const levels: Level[] = [{ width: r.width, height: r.height, bands: r.bands }];
  while (levels[levels.length - 1].width > tile || levels[levels.length - 1].height > tile) levels.push(halve(levels[levels.length - 1]));

  const t = r.transform;
  const meta = `<GDALMetadata>${r.bandNames.map((name, i) => `<Item name="DESCRIPTION" sample="${i}" role="description">${esc(name)}</Item>`).join('')}</GDALMetadata>`;
  const keys = r.geographic
    ? [[1024, 0, 1, 2], [1025, 0, 1, 1], [2048, 0, 1, r.epsg], [2054, 0, 1, 9102]]
    : [[1024, 0, 1, 1], [1025, 0, 1, 1], [3072, 0, 1, r.epsg]];
  const tileBytes = tile * tile * 4;
  const tilesOf = (l: Level) => Math.ceil(l.width / tile) * Math.ceil(l.height / tile);

  // one directory per level, tags in ascending order (TIFF 6.0 section 2)
  const ifds: Entry[][] = levels.map((l, k) => {
    const nTiles = tilesOf(l) * nb;
    const e: Entry[] = [];
    if (k > 0) e.push({ tag: 254, type: LONG, values: [1] }); // NewSubfileType: reduced-resolution image
    e.push(
      { tag: 256, type: LONG, values: [l.width] },
      { tag: 257, type: LONG, values: [l.height] },
      { tag: 258, type: SHORT, values: new Array(nb).fill(32) },
      { tag: 259, type: SHORT, values: [1] },
      { tag: 262, type: SHORT, values: [1] },
      { tag: 277, type: SHORT, values: [nb] },
      { tag: 284, type: SHORT, values: [2] },
      { tag: 322, type: SHORT, values: [tile] },
      { tag: 323, type: SHORT, values: [tile] },
      { tag: 324, type: LONG, values: new Array(nTiles).fill(0) },
      { tag: 325, type: LONG, values: new Array(nTiles).fill(tileBytes) },
    );
    if (nb > 1) e.push({ tag: 338, type: SHORT, values: new Array(nb - 1).fill(0) });
    e.push({ tag: 339, type: SHORT, values: new Array(nb).fill(3) });
    if (k === 0) {
      e.push(
        { tag: 33550, type: DOUBLE, values: [t[1], -t[5], 0] },
        { tag: 33922, type: DOUBLE, values: [0, 0, 0, t[0], t[3], 0] },
        { tag: 34735, type: SHORT, values: [1, 1, 0, keys.length, ...keys.flat()] },
        { tag: 42112, type: ASCII, values: `${meta}\0` },
      );
    }
    e.push({ tag: 42113, type: ASCII, values: `${r.nodata}\0` });
    return e;
  });

  const count = (e: Entry) => e.values.length;
  // directories and their out-of-line values first, in level order
  let at = 8;
  const ifdAt: number[] = [];
  const extraAt: Array<Map<number, number>> = [];
  for (const entries of ifds) {
    at += at % 2;
    ifdAt.push(at);
    at += 2 + entries.length * 12 + 4;
    const m = new Map<number, number>();
    for (const e of entries) {
      const bytes = count(e) * TYPE_BYTES[e.type];
      if (bytes > 4) { at += at % 2; m.set(e.tag, at); at += bytes; }
    }
    extraAt.push(m);
  }
  // then the tiles: smallest overview first, full resolution last; each band's tiles in row-major order
  let dataAt = at + ((8 - (at % 8)) % 8);
  for (let k = levels.length - 1; k >= 0; k--) {
    const offsets = ifds[k].find((e) => e.tag === 324)!.values as number[];
    for (let i = 0; i < offsets.length; i++) { offsets[i] = dataAt; dataAt += tileBytes; }
  }
  check(dataAt < 2 ** 32, 'the raster is too large for a classic TIFF (4 GiB); use larger cells.');
  const out = new Uint8Array(dataAt);
  const dv = new DataView(out.buffer);
  out.set([0x49, 0x49, 42, 0]);
  dv.setUint32(4, ifdAt[0], true);
  const put = (p: number, e: Entry) => {
    if (typeof e.values === 'string') { for (let i = 0; i < e.values.length; i++) out[p + i] = e.values.charCodeAt(i) & 0x7f; return; }
    e.values.forEach((v, i) => {
      if (e.type === SHORT) dv.setUint16(p + 2 * i, v, true);
      else if (e.type === LONG) dv.setUint32(p + 4 * i, v, true);
      else dv.setFloat64(p + 8 * i, v, true);
    });
  };
  ifds.forEach((entries, k) => {
    const base = ifdAt[k];
    dv.setUint16(base, entries.length, true);
    entries.forEach((e, j) => {
      const p = base + 2 + j * 12;
      dv.setUint16(p, e.tag, true);
      dv.setUint16(p + 2, e.type, true);
      dv.setUint32(p + 4, count(e), true);
      const ext = extraAt[k].get(e.tag);
      if (ext === undefined) put(p + 8, e);
      else { dv.setUint32(p + 8, ext, true); put(ext, e); }
    });
    dv.setUint32(base + 2 + entries.length * 12, k + 1 < ifds.length ? ifdAt[k + 1] : 0, true);
  });
  // tile pixels; cells past the raster's edge in the last row and column of tiles hold nodata
  levels.forEach((l, k) => {
    const offsets = ifds[k].find((e) => e.tag === 324)!.values as number[];
    const across = Math.ceil(l.width / tile), down = Math.ceil(l.height / tile);
    let n = 0;
    for (let b = 0; b < nb; b++) {
      const band = l.bands[b];
      for (let ty = 0; ty < down; ty++) {
        for (let tx = 0; tx < across; tx++) {
          const base = offsets[n++];
          for (let y = 0; y < tile; y++) {
            const row = ty * tile + y;
            for (let x = 0; x < tile; x++) {
              const col = tx * tile + x;
              const v = row < l.height && col < l.width ? band[row * l.width + col] : r.nodata;
              dv.setFloat32(base + 4 * (y * tile + x), v, true);
            }
          }
        }
      }
    }
  });
  return out;
}

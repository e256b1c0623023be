/** A small GeoTIFF writer for Float32 rasters: band-separate strips, north-up geotransform, EPSG CRS, GDAL nodata and band names (bytes out, no I/O). */
import type { GeoTransform } from './grid';
import { check } from './errors';

/** What `writeFloat32GeoTiff` writes. */
export interface Float32GeoTiff {
  width: number;
  height: number;
  bands: Float32Array[];
  /** Band descriptions GDAL shows (GDAL_METADATA "DESCRIPTION" items). */
  bandNames: string[];
  transform: GeoTransform;
  epsg: number;
  geographic: boolean;
  /** The value declared as nodata (GDAL_NODATA); the bands must already hold it where there is no data. */
  nodata: number;
}

/**
 * A band's values, or a function that writes them into the array it is given, from value `from` of the band on
 * (as many as the array holds): where the host is little-endian that array is the file's own bytes, or a piece of
 * them (`float32GeoTiffParts`), so a large raster is not held twice.
 */
type BandSource = Float32Array | ((out: Float32Array, from: number) => void);

const SHORT = 3, LONG = 4, DOUBLE = 12, ASCII = 2;
const TYPE_BYTES: Record<number, number> = { [SHORT]: 2, [LONG]: 4, [DOUBLE]: 8, [ASCII]: 1 };

interface Entry { tag: number; type: number; values: number[] | string }

const LITTLE_ENDIAN_HOST = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

/**
 * A baseline little-endian TIFF (TIFF 6.0: PlanarConfiguration 2, one uncompressed strip per band, SampleFormat 3
 * IEEE float) with the GeoTIFF 1.1 tags GDAL reads: ModelPixelScale, ModelTiepoint (pixel-is-area corner) and a
 * GeoKeyDirectory naming the EPSG CRS (ProjectedCSTypeGeoKey or GeographicTypeGeoKey), plus GDAL's own
 * GDAL_NODATA (42113) and GDAL_METADATA (42112) tags. Refuses rotated transforms (no ModelTransformation here).
 * Bands given by the very same source (the same array or function) are written once, their strips pointing at the
 * same bytes (TIFF 6.0 asks only that each strip offset point at its strip's data).
 */
export function writeFloat32GeoTiff(r: Omit<Float32GeoTiff, 'bands'> & { bands: readonly BandSource[] }): Uint8Array {
  const { head, offsets, firstOf, bandBytes, total } = layout(r);
  const out = new Uint8Array(total);
  out.set(head);
  const dv = new DataView(out.buffer);
  for (let b = 0; b < r.bands.length; b++) {
    if (firstOf[b] !== b) continue;
    const source = r.bands[b];
    const at = offsets[b];
    if (typeof source === 'function' && LITTLE_ENDIAN_HOST && at % 4 === 0) { source(new Float32Array(out.buffer, at, r.width * r.height), 0); continue; }
    let band: Float32Array;
    if (typeof source === 'function') { band = new Float32Array(r.width * r.height); source(band, 0); } else band = source;
    if (LITTLE_ENDIAN_HOST) out.set(new Uint8Array(band.buffer, band.byteOffset, bandBytes), at);
    else for (let i = 0; i < band.length; i++) dv.setFloat32(at + 4 * i, band[i], true);
  }
  return out;
}

/**
 * The same file's bytes as `writeFloat32GeoTiff`, in parts to be written one after the other: the header, then each
 * band in pieces of at most `chunkValues` values, laid out in one scratch array reused from piece to piece. A part
 * holds its bytes only until the next is asked for, so write (or copy) each before going on. A writer that streams
 * the parts never holds the whole file, and a large raster costs one piece of fresh memory instead of the file's
 * size (fresh memory is slow to touch the first time: about 2.6 ms a megabyte on the 2-core machine the benchmarks
 * run on, 40 ms for the demo's coverage raster).
 */
export function* float32GeoTiffParts(r: Omit<Float32GeoTiff, 'bands'> & { bands: readonly BandSource[] }, chunkValues = 1 << 18): Generator<Uint8Array> {
  check(Number.isInteger(chunkValues) && chunkValues >= 1, `a piece must hold a whole number of values (1 or more), got ${chunkValues}.`);
  const { head, firstOf } = layout(r);
  yield head;
  const n = r.width * r.height;
  const scratch = new Float32Array(Math.min(n, chunkValues));
  const bytes = new Uint8Array(scratch.buffer);
  const dv = new DataView(scratch.buffer);
  for (let b = 0; b < r.bands.length; b++) {
    if (firstOf[b] !== b) continue;
    const source = r.bands[b];
    for (let from = 0; from < n; from += scratch.length) {
      const len = Math.min(scratch.length, n - from);
      const piece = len === scratch.length ? scratch : scratch.subarray(0, len);
      if (typeof source === 'function') source(piece, from);
      else piece.set(source.subarray(from, from + len));
      // the file is little-endian: a big-endian host swaps each value in place
      if (!LITTLE_ENDIAN_HOST) for (let i = 0; i < len; i++) dv.setFloat32(4 * i, piece[i], true);
      yield bytes.subarray(0, 4 * len);
    }
  }
}

/** Where a file's parts go: its header (every byte before the first band), each band's offset, and the file's size. */
function layout(r: Omit<Float32GeoTiff, 'bands'> & { bands: readonly BandSource[] }): { head: Uint8Array; offsets: number[]; firstOf: number[]; bandBytes: number; total: number } {
  const nb = r.bands.length;
  check(nb >= 1 && r.bandNames.length === nb, `a GeoTIFF needs at least one band and one name per band, got ${nb} bands and ${r.bandNames.length} names.`);
  check(r.transform[2] === 0 && r.transform[4] === 0, 'the raster must be north up (no rotation terms) to be written.');
  for (const b of r.bands) if (typeof b !== 'function') check(b.length === r.width * r.height, `every band must hold ${r.width} x ${r.height} values, got ${b.length}.`);
  const bandBytes = r.width * r.height * 4;
  const meta = `<GDALMetadata>${r.bandNames.map((name, i) => `<Item name="DESCRIPTION" sample="${i}" role="description">${esc(name)}</Item>`).join('')}</GDALMetadata>`;
  const keys = r.geographic
    ? [[1024, 0, 1, 2], [1025, 0, 1, 1], [2048, 0, 1, r.epsg], [2054, 0, 1, 9102]]
    : [[1024, 0, 1, 1], [1025, 0, 1, 1], [3072, 0, 1, r.epsg]];
  const geoKeys = [1, 1, 0, keys.length, ...keys.flat()];
  const t = r.transform;
  const entries: Entry[] = [
    { tag: 256, type: LONG, values: [r.width] },
    { tag: 257, type: LONG, values: [r.height] },
    { tag: 258, type: SHORT, values: new Array(nb).fill(32) },
    { tag: 259, type: SHORT, values: [1] },
    { tag: 262, type: SHORT, values: [1] },
    { tag: 273, type: LONG, values: new Array(nb).fill(0) }, // strip offsets, filled below
    { tag: 277, type: SHORT, values: [nb] },
    { tag: 278, type: LONG, values: [r.height] },
    { tag: 279, type: LONG, values: new Array(nb).fill(bandBytes) },
    { tag: 284, type: SHORT, values: [2] },
    ...(nb > 1 ? [{ tag: 338, type: SHORT, values: new Array(nb - 1).fill(0) }] : []),
    { tag: 339, type: SHORT, values: new Array(nb).fill(3) },
    { tag: 33550, type: DOUBLE, values: [t[1], -t[5], 0] },
    { tag: 33922, type: DOUBLE, values: [0, 0, 0, t[0], t[3], 0] },
    { tag: 34735, type: SHORT, values: geoKeys },
    { tag: 42112, type: ASCII, values: `${meta}\0` },
    { tag: 42113, type: ASCII, values: `${r.nodata}\0` },
  ];
  const count = (e: Entry) => (typeof e.values === 'string' ? e.values.length : e.values.length);
  const ifdBytes = 2 + entries.length * 12 + 4;
  let extra = 8 + ifdBytes;
  const extraAt = new Map<number, number>();
  for (const e of entries) {
    const bytes = count(e) * TYPE_BYTES[e.type];
    if (bytes > 4) { extra += extra % 2; extraAt.set(e.tag, extra); extra += bytes; }
  }
  const dataAt = extra + ((8 - (extra % 8)) % 8);
  const offsets = entries.find((e) => e.tag === 273)!.values as number[];
  // each distinct source once, in band order
  const firstOf = r.bands.map((s) => r.bands.indexOf(s));
  let stored = 0;
  for (let b = 0; b < nb; b++) offsets[b] = firstOf[b] === b ? dataAt + stored++ * bandBytes : offsets[firstOf[b]];
  check(dataAt + stored * bandBytes < 2 ** 32, 'the raster is too large for a classic TIFF (4 GiB); use larger cells.');
  const out = new Uint8Array(dataAt);
  const dv = new DataView(out.buffer);
  out.set([0x49, 0x49, 42, 0]);
  dv.setUint32(4, 8, true);
  dv.setUint16(8, entries.length, true);
  const put = (at: number, e: Entry) => {
    if (typeof e.values === 'string') { for (let i = 0; i < e.values.length; i++) out[at + i] = e.values.charCodeAt(i) & 0x7f; return; }
    e.values.forEach((v, i) => {
      if (e.type === SHORT) dv.setUint16(at + 2 * i, v, true);
      else if (e.type === LONG) dv.setUint32(at + 4 * i, v, true);
      else dv.setFloat64(at + 8 * i, v, true);
    });
  };
  entries.forEach((e, k) => {
    const at = 10 + k * 12;
    dv.setUint16(at, e.tag, true);
    dv.setUint16(at + 2, e.type, true);
    dv.setUint32(at + 4, count(e), true);
    const ext = extraAt.get(e.tag);
    if (ext === undefined) put(at + 8, e);
    else { dv.setUint32(at + 8, ext, true); put(ext, e); }
  });
  dv.setUint32(10 + entries.length * 12, 0, true);
  return { head: out, offsets, firstOf, bandBytes, total: dataAt + stored * bandBytes };
}

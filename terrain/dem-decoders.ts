/** TIFF block decoding for DEMs: decompression, predictor undo and sample conversion into Float32 rows. */
import { getDecoder } from 'geotiff';
import { TerrainError } from './errors';
import { JPEG, LERC, LZMA, type LercExtra, ZSTD, decodeLercBlob, decodeXz, decodeZstd, refusedCompression } from './dem-codecs';

/** A function that inflates a zlib (DEFLATE) stream, told the size to expect; the server injects node:zlib's inflateSync. */
export type InflateFn = (data: Uint8Array, expectedBytes: number) => Uint8Array;

/** Sample types Loftline reads, as TIFF SampleFormat + BitsPerSample. */
export type SampleType = 'uint8' | 'int8' | 'uint16' | 'int16' | 'uint32' | 'int32' | 'float16' | 'float32' | 'float64';

/** Compression names for TIFF Compression tag values Loftline reads. */
export const COMPRESSION_NAMES: Record<number, string> = { 1: 'none', 5: 'lzw', 8: 'deflate', 32946: 'deflate', 32773: 'packbits', [ZSTD]: 'zstd', [LERC]: 'lerc', [JPEG]: 'jpeg', [LZMA]: 'lzma' };

/** Byte size of one sample. */
export function sampleBytes(type: SampleType): number {
  return type === 'float64' ? 8 : type.endsWith('32') ? 4 : type.endsWith('16') ? 2 : 1;
}

/** PackBits run-length decoding (TIFF 6.0 section 9), into a buffer of the known block size. */
function unpackBits(src: Uint8Array, expected: number): Uint8Array {
  const out = new Uint8Array(expected);
  let i = 0;
  let o = 0;
  while (i < src.length && o < expected) {
    const h = (src[i++] << 24) >> 24;
    if (h >= 0) {
      const n = Math.min(h + 1, expected - o, src.length - i);
      out.set(src.subarray(i, i + n), o);
      i += n;
      o += n;
    } else if (h !== -128) {
      const n = Math.min(1 - h, expected - o);
      out.fill(src[i++], o, o + n);
      o += n;
    }
  }
  return out;
}

type BlockDecoder = (compressed: Uint8Array, expectedBytes: number) => Promise<Uint8Array> | Uint8Array;

/** What a LERC block decoder needs beyond the bytes: its additional compression, sample type, byte order, mask fill. */
export interface LercBlockInfo {
  extra: LercExtra;
  type: SampleType;
  littleEndian: boolean;
  /** Value for pixels the LERC mask leaves out: the nodata value, else NaN for floats, else null (refused). */
  maskFill: number | null;
}

function typedArrayOf(type: SampleType, n: number) {
  switch (type) {
    case 'uint8': return new Uint8Array(n);
    case 'int8': return new Int8Array(n);
    case 'uint16': return new Uint16Array(n);
    case 'int16': return new Int16Array(n);
    case 'uint32': return new Uint32Array(n);
    case 'int32': return new Int32Array(n);
    case 'float32': return new Float32Array(n);
    case 'float64': return new Float64Array(n);
    case 'float16': throw new TerrainError('unsupported', 'LERC blocks of 16-bit floats are not valid; re-save the grid as Float32.');
  }
}

/** What a JPEG block decoder needs beyond the bytes: the shared tables (JPEGTables tag) and the block size. */
export interface JpegBlockInfo {
  tables: Uint8Array | null;
  blockWidth: number;
  blockHeight: number;
}

/** A decoder for one TIFF compression code; DEFLATE uses the injected inflate when given, else geotiff.js's. */
export async function blockDecoderFor(compression: number, inflate?: InflateFn, lerc?: LercBlockInfo, jpeg?: JpegBlockInfo): Promise<BlockDecoder> {
  if (compression === 1) return (c) => c;
  if (compression === 32773) return unpackBits;
  if (compression === ZSTD) return (c) => decodeZstd(c);
  if (compression === LZMA && !refusedCompression(LZMA)) return (c) => decodeXz(c);
  if (compression === LERC) {
    if (!lerc) throw new TerrainError('unsupported', 'LERC blocks need the sample type to decode.');
    if (!lerc.littleEndian) throw new TerrainError('unsupported', 'The GeoTIFF is big-endian with LERC compression, which Loftline does not read; re-save it little-endian (gdal_translate -co ENDIANNESS=LITTLE).');
    const unzip = lerc.extra === 'none' ? null : lerc.extra === 'zstd' ? decodeZstd : await blockDecoderFor(8, inflate);
    const size = sampleBytes(lerc.type);
    return async (c, n) => {
      let blob = c;
      if (unzip) {
        const u = unzip(c, n * 2);
        blob = u instanceof Promise ? await u : u;
      }
      return decodeLercBlob(blob, typedArrayOf(lerc.type, n / size), lerc.maskFill);
    };
  }
  if (compression === JPEG) {
    // geotiff.js's baseline JPEG decoder (8-bit, as GDAL writes JPEG-in-TIFF for a single band); the last strip
    // may hold fewer rows than a block, and is padded to the block so that rows are found where the reader expects
    if (!jpeg) throw new TerrainError('unsupported', 'JPEG blocks need the block size to decode.');
    const dec = await getDecoder(JPEG, { tileWidth: jpeg.blockWidth, tileHeight: jpeg.blockHeight, predictor: 1, bitsPerSample: 8, planarConfiguration: 1, JPEGTables: jpeg.tables ?? undefined } as never);
    return async (c, n) => {
      let out: Uint8Array;
      try {
        out = new Uint8Array(await dec.decodeBlock(c.slice().buffer));
      } catch (err) {
        throw new TerrainError('damaged', `A JPEG block does not decode (${(err as Error)?.message ?? err}); the file is damaged, so export it again.`);
      }
      if (out.length === n) return out;
      if (out.length > n) return out.subarray(0, n);
      const padded = new Uint8Array(n);
      padded.set(out);
      return padded;
    };
  }
  const refused = refusedCompression(compression);
  if (refused) throw new TerrainError('unsupported', refused);
  if ((compression === 8 || compression === 32946) && inflate) return (c, n) => inflate(c, n);
  if (compression === 5 || compression === 8 || compression === 32946) {
    // geotiff.js's own decoders; its predictor step is skipped (predictor 1) because ours is word-wise
    const dec = await getDecoder(compression, { tileWidth: 1, tileHeight: 1, predictor: 1, bitsPerSample: 8, planarConfiguration: 1 });
    return async (c) => new Uint8Array(await dec.decodeBlock(c.slice().buffer));
  }
  throw new TerrainError('unsupported', `The GeoTIFF uses compression ${compression}, which Loftline does not read; re-save it with DEFLATE, LZW or no compression (gdal_translate -co COMPRESS=DEFLATE).`);
}

/** Undo horizontal differencing (predictor 2, TIFF 6.0 section 14) in place on native-endian integer rows. */
export function undoIntegerPredictor(bytes: Uint8Array, type: SampleType, rowPx: number, rows: number, littleEndian: boolean): void {
  const size = sampleBytes(type);
  if (size === 1) {
    for (let r = 0; r < rows; r++) {
      const o = r * rowPx;
      for (let i = o + 1; i < o + rowPx; i++) bytes[i] = (bytes[i] + bytes[i - 1]) & 255;
    }
    return;
  }
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const aligned = littleEndian && bytes.byteOffset % size === 0;
  if (size === 2) {
    if (aligned) {
      const a = new Uint16Array(bytes.buffer, bytes.byteOffset, rowPx * rows);
      for (let r = 0; r < rows; r++) for (let i = r * rowPx + 1, e = (r + 1) * rowPx; i < e; i++) a[i] = a[i] + a[i - 1];
    } else {
      for (let r = 0; r < rows; r++) for (let i = 1; i < rowPx; i++) {
        const p = (r * rowPx + i) * 2;
        dv.setUint16(p, dv.getUint16(p, littleEndian) + dv.getUint16(p - 2, littleEndian), littleEndian);
      }
    }
  } else if (size === 4) {
    for (let r = 0; r < rows; r++) for (let i = 1; i < rowPx; i++) {
      const p = (r * rowPx + i) * 4;
      dv.setUint32(p, (dv.getUint32(p, littleEndian) + dv.getUint32(p - 4, littleEndian)) >>> 0, littleEndian);
    }
  } else {
    throw new TerrainError('unsupported', `Predictor 2 with ${size * 8}-bit samples is not valid TIFF; re-save the grid without a predictor.`);
  }
}

/** Undo the floating-point predictor (predictor 3, Adobe TIFF Technical Note 3) in place: byte prefix sums, then un-shuffle byte planes. */
export function undoFloatPredictorBytes(bytes: Uint8Array, size: number, rowPx: number, rows: number, littleEndian: boolean): void {
  const rowBytes = rowPx * size;
  const tmp = new Uint8Array(rowBytes);
  for (let r = 0; r < rows; r++) {
    const o = r * rowBytes;
    let acc = 0;
    for (let i = 0; i < rowBytes; i++) tmp[i] = acc = (acc + bytes[o + i]) & 255;
    // plane k holds byte k counted from the most significant end
    for (let i = 0; i < rowPx; i++) {
      for (let k = 0; k < size; k++) {
        bytes[o + i * size + (littleEndian ? size - 1 - k : k)] = tmp[k * rowPx + i];
      }
    }
  }
}

/**
 * The float32 fast path of predictor 3, word-wise: (1) the byte prefix sum of each row, four bytes per step
 * (SWAR: even and odd bytes in 16-bit lanes, so no carry crosses a byte), in place; (2) a 4 x 4 byte transpose
 * from the four byte planes into whole little-endian words in the destination, nodata turned to NaN on the way.
 * `bytes` is changed (it is a freshly decoded block). Falls back to bytes when rows are not word-aligned.
 */
export function float32PredictorRows(
  bytes: Uint8Array, rowPx: number, _rows: number,
  dest: Uint32Array, destOffset: number, destStride: number, colFrom: number, colTo: number, rowFrom: number, rowTo: number,
  nodataBits: number | null,
): void {
  const w = rowPx;
  if (bytes.byteOffset % 4 !== 0 || w % 4 !== 0) {
    float32PredictorRowsBytewise(bytes, w, dest, destOffset, destStride, colFrom, colTo, rowFrom, rowTo, nodataBits);
    return;
  }
  // Int32 views keep every value a small integer in V8's optimised code (no uint32 -> double conversions)
  const words = new Int32Array(bytes.buffer, bytes.byteOffset, bytes.byteLength >>> 2);
  const out = new Int32Array(dest.buffer, dest.byteOffset, dest.length);
  const NAN_BITS = 0x7fc00000;
  const nb = nodataBits === null ? 0x7fc00001 : nodataBits | 0; // 0x7fc00001: a NaN no writer emits as nodata
  const M = 0x00ff00ff;
  const q = w >>> 2;
  const full = colFrom === 0 && colTo === w;
  for (let r = rowFrom; r < rowTo; r++) {
    const wo = r * w; // a row of w float32 samples is w words
    let c = 0; // running byte sum; only its low 8 bits matter, and the only loop-carried step is c += ...
    for (let j = wo, e = wo + w; j < e; j++) {
      const x = words[j];
      const ev = x & M, od = (x >>> 8) & M;
      const sum = ev + od; // 16-bit lanes: d0 + d1, d2 + d3
      const oddL = sum + (sum << 16); // local prefix at bytes 1 and 3
      const evenL = ev + ((sum & 0xffff) << 16); // local prefix at bytes 0 and 2
      const c8 = c & 255;
      const cc = c8 | (c8 << 16);
      words[j] = ((evenL + cc) & M) | (((oddL + cc) & M) << 8);
      c += oddL >>> 16;
    }
    const d = destOffset + (r - rowFrom) * destStride - colFrom;
    for (let j = 0; j < q; j++) {
      // plane 0 holds the most significant bytes; byte n of each plane word is pixel 4j + n
      const a = words[wo + j], b = words[wo + q + j], cw = words[wo + 2 * q + j], e = words[wo + 3 * q + j];
      let v0 = (a << 24) | ((b & 255) << 16) | ((cw & 255) << 8) | (e & 255);
      let v1 = ((a >>> 8) << 24) | ((b & 0xff00) << 8) | (cw & 0xff00) | ((e >>> 8) & 255);
      let v2 = ((a >>> 16) << 24) | (b & 0xff0000) | ((cw >>> 8) & 0xff00) | ((e >>> 16) & 255);
      let v3 = (a & 0xff000000) | ((b >>> 8) & 0xff0000) | ((cw >>> 16) & 0xff00) | (e >>> 24);
      if (v0 === nb) v0 = NAN_BITS;
      if (v1 === nb) v1 = NAN_BITS;
      if (v2 === nb) v2 = NAN_BITS;
      if (v3 === nb) v3 = NAN_BITS;
      const k = 4 * j;
      if (full) {
        out[d + k] = v0; out[d + k + 1] = v1; out[d + k + 2] = v2; out[d + k + 3] = v3;
      } else {
        if (k >= colFrom && k < colTo) out[d + k] = v0;
        if (k + 1 >= colFrom && k + 1 < colTo) out[d + k + 1] = v1;
        if (k + 2 >= colFrom && k + 2 < colTo) out[d + k + 2] = v2;
        if (k + 3 >= colFrom && k + 3 < colTo) out[d + k + 3] = v3;
      }
    }
  }
}

/** Byte-by-byte predictor 3 for float32 rows that are not word-aligned (four running plane sums per pixel). */
function float32PredictorRowsBytewise(
  bytes: Uint8Array, w: number,
  dest: Uint32Array, destOffset: number, destStride: number, colFrom: number, colTo: number, rowFrom: number, rowTo: number,
  nodataBits: number | null,
): void {
  const NAN_BITS = 0x7fc00000;
  const nb = nodataBits === null ? -1 : nodataBits >>> 0;
  for (let r = rowFrom; r < rowTo; r++) {
    const o = r * w * 4;
    // byte sums of planes 0..2 give the running sum at the start of planes 1..3
    let s0 = 0, s1 = 0, s2 = 0;
    for (let i = 0; i < w; i++) { s0 += bytes[o + i]; s1 += bytes[o + w + i]; s2 += bytes[o + 2 * w + i]; }
    let a0 = 0, a1 = s0 & 255, a2 = (s0 + s1) & 255, a3 = (s0 + s1 + s2) & 255;
    const d = destOffset + (r - rowFrom) * destStride - colFrom;
    for (let i = 0; i < colTo; i++) {
      a0 = (a0 + bytes[o + i]) & 255;
      a1 = (a1 + bytes[o + w + i]) & 255;
      a2 = (a2 + bytes[o + 2 * w + i]) & 255;
      a3 = (a3 + bytes[o + 3 * w + i]) & 255;
      if (i >= colFrom) {
        const v = ((a0 << 24) | (a1 << 16) | (a2 << 8) | a3) >>> 0;
        dest[d + i] = v === nb ? NAN_BITS : v;
      }
    }
  }
}

/**
 * Copy decoded block rows [rowFrom, rowTo) and columns [colFrom, colTo) into a Float32 destination,
 * converting the sample type, mapping nodata to NaN and scaling to metres (`scale`, `offset`).
 */
export function copyRows(
  bytes: Uint8Array, type: SampleType, littleEndian: boolean, rowPx: number,
  dest: Float32Array, destOffset: number, destStride: number, colFrom: number, colTo: number, rowFrom: number, rowTo: number,
  nodata: number | null,
): void {
  const size = sampleBytes(type);
  const n = colTo - colFrom;
  const aligned = bytes.byteOffset % size === 0;
  // an uncompressed block inside the file may sit at any byte offset: copy each row to an aligned scratch
  const scratch = littleEndian && !aligned && type !== 'float32' ? new Uint8Array(n * size) : null;
  for (let r = rowFrom; r < rowTo; r++) {
    const srcPx = r * rowPx + colFrom;
    const d = destOffset + (r - rowFrom) * destStride;
    if (littleEndian && type === 'float32') {
      // same type: one byte copy straight into the destination, whatever the source alignment
      new Uint8Array(dest.buffer, dest.byteOffset + d * 4, n * 4).set(bytes.subarray(srcPx * 4, (srcPx + n) * 4));
    } else if (littleEndian && aligned) {
      dest.set(viewOf(bytes, type, srcPx, n), d); // typed-array set converts the type at memcpy-like speed
    } else if (scratch) {
      scratch.set(bytes.subarray(srcPx * size, (srcPx + n) * size));
      dest.set(viewOf(scratch, type, 0, n), d);
    } else {
      const dv = new DataView(bytes.buffer, bytes.byteOffset + srcPx * size, n * size);
      for (let i = 0; i < n; i++) dest[d + i] = readSample(dv, type, i * size, littleEndian);
    }
    if (nodata !== null) {
      const nd = type === 'float32' || type === 'float16' ? Math.fround(nodata) : nodata;
      for (let i = d, e = d + n; i < e; i++) if (dest[i] === nd) dest[i] = NaN;
    }
  }
}

function viewOf(bytes: Uint8Array, type: SampleType, px: number, n: number): ArrayLike<number> & { length: number } {
  const b = bytes.buffer, o = bytes.byteOffset;
  switch (type) {
    case 'uint8': return new Uint8Array(b, o + px, n);
    case 'int8': return new Int8Array(b, o + px, n);
    case 'uint16': return new Uint16Array(b, o + px * 2, n);
    case 'int16': return new Int16Array(b, o + px * 2, n);
    case 'uint32': return new Uint32Array(b, o + px * 4, n);
    case 'int32': return new Int32Array(b, o + px * 4, n);
    case 'float32': return new Float32Array(b, o + px * 4, n);
    case 'float64': return new Float64Array(b, o + px * 8, n);
    case 'float16': return halfView(new Uint16Array(b, o + px * 2, n));
  }
}

let HALF: Float32Array | null = null;

/** IEEE 754 binary16 -> float32 for all 65536 bit patterns (subnormals, infinities and NaN included), built once. */
function halfTable(): Float32Array {
  if (HALF) return HALF;
  const t = new Float32Array(65536);
  for (let h = 0; h < 65536; h++) {
    const s = h & 0x8000 ? -1 : 1, e = (h >> 10) & 31, m = h & 1023;
    t[h] = e === 0 ? s * m * 2 ** -24 : e === 31 ? (m ? NaN : s * Infinity) : s * (1 + m / 1024) * 2 ** (e - 15);
  }
  return (HALF = t);
}

/** Float16 samples as float32 values. */
function halfView(bits: Uint16Array): Float32Array {
  const table = halfTable();
  const out = new Float32Array(bits.length);
  for (let i = 0; i < bits.length; i++) out[i] = table[bits[i]];
  return out;
}

function readSample(dv: DataView, type: SampleType, p: number, le: boolean): number {
  switch (type) {
    case 'uint8': return dv.getUint8(p);
    case 'int8': return dv.getInt8(p);
    case 'uint16': return dv.getUint16(p, le);
    case 'int16': return dv.getInt16(p, le);
    case 'uint32': return dv.getUint32(p, le);
    case 'int32': return dv.getInt32(p, le);
    case 'float32': return dv.getFloat32(p, le);
    case 'float64': return dv.getFloat64(p, le);
    case 'float16': return halfTable()[dv.getUint16(p, le)];
  }
}

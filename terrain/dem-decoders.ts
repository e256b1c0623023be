/** TIFF block decoding for DEMs: decompression, predictor undo and sample conversion into Float32 rows. */
import { getDecoder } from 'geotiff';
import { TerrainError } from './errors';

/** A function that inflates a zlib (DEFLATE) stream; the server injects node:zlib's inflateSync. */
export type InflateFn = (data: Uint8Array) => Uint8Array;

/** Sample types Loftline reads, as TIFF SampleFormat + BitsPerSample. */
export type SampleType = 'uint8' | 'int8' | 'uint16' | 'int16' | 'uint32' | 'int32' | 'float32' | 'float64';

/** Compression names for TIFF Compression tag values Loftline reads. */
export const COMPRESSION_NAMES: Record<number, string> = { 1: 'none', 5: 'lzw', 8: 'deflate', 32946: 'deflate', 32773: 'packbits' };

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

/** A decoder for one TIFF compression code; DEFLATE uses the injected inflate when given, else geotiff.js's. */
export async function blockDecoderFor(compression: number, inflate?: InflateFn): Promise<BlockDecoder> {
  if (compression === 1) return (c) => c;
  if (compression === 32773) return unpackBits;
  if ((compression === 8 || compression === 32946) && inflate) return (c) => inflate(c);
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
 * The float32 fast path of predictor 3: one pass that keeps a running byte sum per plane and writes whole
 * little-endian words straight into the destination rows, converting nodata to NaN on the way.
 * Plane start sums come from a word-wise reduction of the earlier planes.
 */
export function float32PredictorRows(
  bytes: Uint8Array, rowPx: number, rows: number,
  dest: Uint32Array, destOffset: number, destStride: number, colFrom: number, colTo: number, rowFrom: number, rowTo: number,
  nodataBits: number | null,
): void {
  const w = rowPx;
  const wordsAligned = bytes.byteOffset % 4 === 0 && w % 4 === 0;
  const words = wordsAligned ? new Uint32Array(bytes.buffer, bytes.byteOffset, (bytes.byteLength >>> 2)) : null;
  const NAN_BITS = 0x7fc00000;
  const nb = nodataBits === null ? -1 : nodataBits >>> 0;
  for (let r = rowFrom; r < rowTo; r++) {
    const o = r * w * 4;
    // byte sums of planes 0..2, i.e. the running sum at the start of planes 1..3
    let s0 = 0, s1 = 0, s2 = 0;
    if (words) {
      s0 = planeSum(words, o >>> 2, w >>> 2);
      s1 = planeSum(words, (o + w) >>> 2, w >>> 2);
      s2 = planeSum(words, (o + 2 * w) >>> 2, w >>> 2);
    } else {
      for (let i = 0; i < w; i++) { s0 += bytes[o + i]; s1 += bytes[o + w + i]; s2 += bytes[o + 2 * w + i]; }
    }
    let a0 = 0, a1 = s0 & 255, a2 = (s0 + s1) & 255, a3 = (s0 + s1 + s2) & 255;
    const p0 = o, p1 = o + w, p2 = o + 2 * w, p3 = o + 3 * w;
    const d = destOffset + (r - rowFrom) * destStride - colFrom;
    for (let i = 0; i < colTo; i++) {
      a0 = (a0 + bytes[p0 + i]) & 255;
      a1 = (a1 + bytes[p1 + i]) & 255;
      a2 = (a2 + bytes[p2 + i]) & 255;
      a3 = (a3 + bytes[p3 + i]) & 255;
      if (i >= colFrom) {
        const v = ((a0 << 24) | (a1 << 16) | (a2 << 8) | a3) >>> 0;
        dest[d + i] = v === nb ? NAN_BITS : v;
      }
    }
  }
}

/** Sum of the bytes of `n` words from `start`, modulo 256, two byte lanes per 16 bits (folded before they overflow). */
function planeSum(words: Uint32Array, start: number, n: number): number {
  let total = 0;
  let acc = 0;
  let k = 0;
  for (let i = start, e = start + n; i < e; i++) {
    const v = words[i];
    acc += (v & 0x00ff00ff) + ((v >>> 8) & 0x00ff00ff);
    if (++k === 127) {
      total += (acc & 0xffff) + (acc >>> 16);
      acc = 0;
      k = 0;
    }
  }
  total += (acc & 0xffff) + (acc >>> 16);
  return total & 255;
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
  const scratch = littleEndian && !aligned ? new Uint8Array(n * size) : null;
  for (let r = rowFrom; r < rowTo; r++) {
    const srcPx = r * rowPx + colFrom;
    const d = destOffset + (r - rowFrom) * destStride;
    if (littleEndian && aligned) {
      dest.set(viewOf(bytes, type, srcPx, n), d); // typed-array set converts the type at memcpy-like speed
    } else if (scratch) {
      scratch.set(bytes.subarray(srcPx * size, (srcPx + n) * size));
      dest.set(viewOf(scratch, type, 0, n), d);
    } else {
      const dv = new DataView(bytes.buffer, bytes.byteOffset + srcPx * size, n * size);
      for (let i = 0; i < n; i++) dest[d + i] = readSample(dv, type, i * size, littleEndian);
    }
    if (nodata !== null) {
      const nd = type === 'float32' ? Math.fround(nodata) : nodata;
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
  }
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
  }
}

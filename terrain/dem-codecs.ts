/**
 * Block codecs beyond DEFLATE/LZW/PackBits for elevation GeoTIFFs: ZSTD (fzstd, pure JavaScript) and LERC (Esri's
 * JavaScript decoder, npm `lerc` 3, Lerc2 codec 2.5: reads the LERC_VERSION 2.4 blobs GDAL 3.6 writes), plus the
 * compressions refused with a reason. Both decoders are pure JS, so nothing needs injecting here. JPEG blocks go
 * through geotiff.js's own baseline JPEG decoder (dem-decoders.ts).
 */
import { decompress as zstdDecompress } from 'fzstd';
import Lerc from 'lerc';
import { TerrainError } from './errors';

/** TIFF Compression tag values (libtiff tiff.h; GDAL's GTiff driver). */
export const ZSTD = 50000;
export const LERC = 34887;
export const LZMA = 34925;
/** JPEG in TIFF (TIFF Technical Note 2); 6 is the old-style JPEG of TIFF 6.0, which GDAL does not write. */
export const JPEG = 7;
const OLD_JPEG = 6;

/** An .xz stream to its bytes (libtiff's LZMA blocks are whole .xz streams); given by the server or command line. */
type XzDecodeFn = (data: Uint8Array) => Uint8Array | Promise<Uint8Array>;
let xzDecode: XzDecodeFn | null = null;

/**
 * Give the reader an .xz decoder for LZMA-compressed blocks. There is no maintained pure-JavaScript xz decoder on
 * npm, so the server and the command line inject liblzma's (npm `lzma-native`), like the fast inflate.
 */
export function setXzDecoder(fn: XzDecodeFn | null): void {
  xzDecode = fn;
}

/** LZMA block (.xz stream) to bytes with the injected decoder. */
export async function decodeXz(data: Uint8Array): Promise<Uint8Array> {
  if (!xzDecode) throw new TerrainError('unsupported', LZMA_REFUSED);
  try {
    return await xzDecode(data);
  } catch (err) {
    throw new TerrainError('damaged', `An LZMA block does not decode (${(err as Error)?.message ?? err}); the file is damaged, so export it again.`);
  }
}

const LZMA_REFUSED = 'The GeoTIFF uses LZMA compression, and no LZMA decoder was given to this reader (the server and the command line give one); re-save it with ZSTD or DEFLATE (gdal_translate -co COMPRESS=ZSTD in.tif out.tif).';

/** Why a compression is refused, or null when it is read. */
export function refusedCompression(code: number): string | null {
  if (code === LZMA && !xzDecode) return LZMA_REFUSED;
  if (code === OLD_JPEG) {
    return 'The GeoTIFF uses old-style JPEG compression (TIFF 6.0), which Loftline does not read; re-save it with DEFLATE (gdal_translate -co COMPRESS=DEFLATE in.tif out.tif).';
  }
  return null;
}

/** ZSTD frame to bytes. */
export function decodeZstd(data: Uint8Array): Uint8Array {
  return zstdDecompress(data);
}

/** LercParameters tag (GDAL): [Lerc version, additional compression 0 none / 1 DEFLATE / 2 ZSTD]. */
export type LercExtra = 'none' | 'deflate' | 'zstd';

export function lercExtraOf(params: ArrayLike<number> | undefined): LercExtra {
  const extra = params && params.length > 1 ? params[1] : 0;
  if (extra === 0) return 'none';
  if (extra === 1) return 'deflate';
  if (extra === 2) return 'zstd';
  throw new TerrainError('unsupported', `The GeoTIFF's LERC blocks use an additional compression (${extra}) that Loftline does not know; re-save it with COMPRESS=LERC_DEFLATE or LERC_ZSTD.`);
}

type Typed = Float32Array | Float64Array | Int8Array | Uint8Array | Int16Array | Uint16Array | Int32Array | Uint32Array;

/**
 * Decode one LERC blob (after its additional compression) into little-endian samples of the file's type, masked
 * pixels set to `maskFill` (the nodata value, or NaN for floats).
 */
export function decodeLercBlob(blob: Uint8Array, out: Typed, maskFill: number | null): Uint8Array {
  // a copy unless the bytes fill their buffer (a Node Buffer may be a view into a shared pool; its slice() is no copy)
  const buf = blob.byteOffset === 0 && blob.byteLength === blob.buffer.byteLength ? blob.buffer : Uint8Array.prototype.slice.call(blob).buffer;
  const r = Lerc.decode(buf as ArrayBuffer, { returnPixelInterleavedDims: true }) as { width: number; height: number; pixels: ArrayLike<number>[]; mask?: Uint8Array | null };
  const px = r.pixels[0];
  if (!px || r.width * r.height !== out.length) {
    throw new TerrainError('truncated', `A LERC block decodes to ${r.width} x ${r.height} pixels where ${out.length} are needed; the file is damaged, so export it again.`);
  }
  out.set(px as ArrayLike<number>);
  const mask = r.mask;
  if (mask) {
    for (let i = 0; i < mask.length; i++) {
      if (mask[i] === 0) {
        if (maskFill === null) {
          throw new TerrainError('unsupported', 'The GeoTIFF\'s LERC blocks mask out pixels but the file states no nodata value for integer heights; re-save it with a nodata value (gdal_translate -a_nodata -9999).');
        }
        out[i] = maskFill;
      }
    }
  }
  return new Uint8Array(out.buffer, out.byteOffset, out.byteLength);
}

/**
 * Native block decoders the terrain engine cannot carry itself (it stays pure JavaScript): LZMA-compressed GeoTIFF
 * blocks are .xz streams with libtiff's delta filter before LZMA2 (tif_lzma.c), decoded by liblzma itself through
 * npm `lzma-native` (prebuilt for Node; pure-Rust xz decoders lack the delta filter) and injected once per process
 * and terrain thread, like the fast inflate.
 */
import lzma from 'lzma-native';
import zlib from 'node:zlib';
import { setXzDecoder } from '../../terrain/dem-codecs';
import { setPngDeflate } from '../../terrain/png-encode';

/** Give the terrain engine its native decoders (idempotent). */
export function installNodeCodecs(): void {
  // pngjs's settings before terrain/ encoded its own PNGs: deflate level 9, strategy 3 (Z_RLE)
  setPngDeflate((data) => {
    const out = zlib.deflateSync(data, { level: 9, strategy: zlib.constants.Z_RLE });
    return new Uint8Array(out.buffer, out.byteOffset, out.byteLength);
  });
  setXzDecoder(
    (data) =>
      new Promise<Uint8Array>((resolve, reject) => {
        lzma.decompress(Buffer.from(data.buffer, data.byteOffset, data.byteLength), {}, (out: Buffer, err?: Error) => {
          if (err || !out) reject(err ?? new Error('no output'));
          else resolve(new Uint8Array(out.buffer, out.byteOffset, out.byteLength));
        });
      }),
  );
}

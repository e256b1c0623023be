/**
 * Pixel-interleaved bands (TIFF PlanarConfiguration 1, SamplesPerPixel > 1): the predictors over whole interleaved
 * rows (TIFF 6.0 section 14; Adobe TIFF Technical Note 3, as libtiff's horAcc/fpAcc with stride = samples per pixel),
 * then band 1 taken out of each pixel. The elevation of a multi-band DEM is band 1, as GDAL reads it by default.
 */
import { TerrainError } from './errors';

/** Undo predictor 2 in place on rows of `rowPx` pixels of `spp` integer samples of `size` bytes. */
export function undoIntegerPredictorInterleaved(bytes: Uint8Array, size: number, rowPx: number, rows: number, spp: number, littleEndian: boolean): void {
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const n = rowPx * spp;
  for (let r = 0; r < rows; r++) {
    const o = r * n * size;
    for (let i = spp; i < n; i++) {
      const p = o + i * size, q = o + (i - spp) * size;
      if (size === 1) bytes[p] = (bytes[p] + bytes[q]) & 255;
      else if (size === 2) dv.setUint16(p, dv.getUint16(p, littleEndian) + dv.getUint16(q, littleEndian), littleEndian);
      else if (size === 4) dv.setUint32(p, (dv.getUint32(p, littleEndian) + dv.getUint32(q, littleEndian)) >>> 0, littleEndian);
      else throw new TerrainError('unsupported', `Predictor 2 with ${size * 8}-bit samples is not valid TIFF; re-save the grid without a predictor.`);
    }
  }
}

/** Undo predictor 3 in place on interleaved rows: byte sums with a stride of `spp`, then un-shuffle the byte planes. */
export function undoFloatPredictorInterleaved(bytes: Uint8Array, size: number, rowPx: number, rows: number, spp: number, littleEndian: boolean): void {
  const wc = rowPx * spp;
  const rowBytes = wc * size;
  const tmp = new Uint8Array(rowBytes);
  for (let r = 0; r < rows; r++) {
    const o = r * rowBytes;
    for (let i = spp; i < rowBytes; i++) bytes[o + i] = (bytes[o + i] + bytes[o + i - spp]) & 255;
    tmp.set(bytes.subarray(o, o + rowBytes));
    for (let k = 0; k < wc; k++) {
      for (let b = 0; b < size; b++) bytes[o + k * size + (littleEndian ? size - 1 - b : b)] = tmp[b * wc + k];
    }
  }
}

/** Band 1 of `pixels` interleaved pixels of `spp` samples of `size` bytes, as a compact block. */
export function firstBand(bytes: Uint8Array, size: number, spp: number, pixels: number): Uint8Array {
  const out = new Uint8Array(pixels * size);
  const stride = spp * size;
  for (let i = 0; i < pixels; i++) {
    const s = i * stride, d = i * size;
    for (let b = 0; b < size; b++) out[d + b] = bytes[s + b];
  }
  return out;
}

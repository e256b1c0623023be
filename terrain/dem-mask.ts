/**
 * GDAL's internal mask (a per-dataset mask band, written with GDAL_TIFF_INTERNAL_MASK=YES): a second TIFF image
 * of the same size with NewSubfileType = 4 (transparency mask, TIFF 6.0 section 8), PhotometricInterpretation 4,
 * one bit per pixel, rows padded to whole bytes, most significant bit first; 0 = masked (no data), 1 = valid.
 * GDAL's mask band (band.GetMaskBand()) reads masked pixels as 0; Loftline reads them as nodata.
 */
import { TerrainError } from './errors';

/** Where the blocks of the mask live (the same block grid as the heights). */
export interface MaskLayout {
  compressionCode: number;
  offsets: ArrayLike<number>;
  byteCounts: ArrayLike<number>;
}

interface TiffLike {
  getImageCount(): Promise<number>;
  getImage(i: number): Promise<{ fileDirectory: { loadValue(t: string): Promise<unknown> }; getWidth(): number; getHeight(): number; getTileWidth(): number; getTileHeight(): number; isTiled: boolean; getBitsPerSample(i?: number): number }>;
}

/**
 * The full-resolution internal mask of the first image, or null. A mask with another size, bit depth or block
 * grid than the heights is refused rather than ignored (ignoring it would read masked cells as heights).
 */
export async function findInternalMask(tiff: TiffLike, main: { width: number; height: number; tiled: boolean; blockWidth: number; blockHeight: number; blocks: number }): Promise<MaskLayout | null> {
  const count = await tiff.getImageCount();
  for (let i = 1; i < count; i++) {
    const img = await tiff.getImage(i);
    const fd = img.fileDirectory;
    const subfile = ((await fd.loadValue('NewSubfileType')) as number | undefined) ?? 0;
    // 4 = mask of the full-resolution image; 5 = mask of a reduced (overview) image, not ours
    if (subfile !== 4 || img.getWidth() !== main.width || img.getHeight() !== main.height) continue;
    const sameBlocks = img.isTiled === main.tiled && img.getTileWidth() === main.blockWidth && img.getTileHeight() === main.blockHeight;
    if (img.getBitsPerSample(0) !== 1 || !sameBlocks) {
      throw new TerrainError('unsupported', `The file has an internal mask (which cells hold no data) in a layout Loftline does not read (${img.getBitsPerSample(0)}-bit, ${img.getTileWidth()} x ${img.getTileHeight()} blocks); turn the mask into a nodata value: gdal_translate -a_nodata -9999 -b 1 -b mask in.tif out.tif, or gdalwarp -dstnodata -9999 in.tif out.tif.`);
    }
    const offsets = (await fd.loadValue(main.tiled ? 'TileOffsets' : 'StripOffsets')) as ArrayLike<number>;
    const byteCounts = (await fd.loadValue(main.tiled ? 'TileByteCounts' : 'StripByteCounts')) as ArrayLike<number>;
    if (!offsets || !byteCounts || offsets.length < main.blocks || byteCounts.length < main.blocks) {
      throw new TerrainError('damaged', `The file is damaged in its internal mask: it lists ${Math.min(offsets?.length ?? 0, byteCounts?.length ?? 0)} blocks where ${main.blocks} are needed; re-export it from your GIS.`);
    }
    const compressionCode = ((await fd.loadValue('Compression')) as number | undefined) ?? 1;
    return { compressionCode, offsets, byteCounts };
  }
  return null;
}

/** Bytes per row of a 1-bit mask block `blockWidth` pixels wide. */
export const maskRowBytes = (blockWidth: number): number => (blockWidth + 7) >> 3;

/** Set to NaN every destination cell whose mask bit is 0 (rows [rowFrom, rowTo), cols [colFrom, colTo), block-relative). */
export function applyMaskRows(bits: Uint8Array | null, blockWidth: number, dest: Float32Array, destOffset: number, destStride: number, colFrom: number, colTo: number, rowFrom: number, rowTo: number): void {
  const rowBytes = maskRowBytes(blockWidth);
  for (let r = rowFrom; r < rowTo; r++) {
    const d = destOffset + (r - rowFrom) * destStride - colFrom;
    if (!bits) { // an unwritten (sparse) mask block: nothing in it is known to be valid
      dest.fill(NaN, d + colFrom, d + colTo);
      continue;
    }
    const o = r * rowBytes;
    for (let c = colFrom; c < colTo; c++) if (((bits[o + (c >> 3)] >> (7 - (c & 7))) & 1) === 0) dest[d + c] = NaN;
  }
}

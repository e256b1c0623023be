/**
 * Naming the damaged part of a GeoTIFF: which block (tile or strip) and where it sits, in one message that says
 * what to do. Blocks are counted from 1 at the top left, row by row; GDAL's messages count the same blocks from 0
 * ("IReadBlock failed at X offset 3, Y offset 1" is tile 12, row 2, column 4 of a file 8 tiles across).
 */
import { TerrainError } from './errors';

/** The block layout a message needs. */
interface BlockLayout {
  tiled: boolean;
  blockHeight: number;
  blocksAcross: number;
  blocksDown: number;
}

/** "tile 12 of 24 (row 2, column 4)" or "strip 3 of 6 (image rows 5-6)", counted from 1. */
export function blockName(idx: number, layout: BlockLayout, imageHeight: number): string {
  const total = layout.blocksAcross * layout.blocksDown;
  if (layout.tiled) {
    const row = Math.floor(idx / layout.blocksAcross) + 1, col = (idx % layout.blocksAcross) + 1;
    return `tile ${idx + 1} of ${total} (row ${row}, column ${col})`;
  }
  const first = idx * layout.blockHeight + 1, last = Math.min(imageHeight, (idx + 1) * layout.blockHeight);
  return `strip ${idx + 1} of ${total} (image row${first === last ? ` ${first}` : `s ${first}-${last}`})`;
}

/** A block whose data does not decode: code `damaged`. */
export function damagedBlock(idx: number, layout: BlockLayout, imageHeight: number, why: string): TerrainError {
  return new TerrainError('damaged', `The file is damaged at ${blockName(idx, layout, imageHeight)}: ${why}; re-export it from your GIS.`);
}

/** A TIFF directory entry (e.g. the TileOffsets table) that cannot be read: code `damaged`. */
export function damagedDirectory(what: string, why: string): TerrainError {
  return new TerrainError('damaged', `The file is damaged in its ${what}: ${why}; re-export it from your GIS.`);
}

/**
 * Every block must lie inside the file. A file cut short (the blocks stored last run past its end) is
 * `truncated`; a block whose offset points past the end while blocks stored after it are whole is `damaged`.
 */
export function checkBlocksInFile(offsets: ArrayLike<number>, byteCounts: ArrayLike<number>, layout: BlockLayout, imageHeight: number, fileBytes: number): void {
  const n = layout.blocksAcross * layout.blocksDown;
  let lastWholeOffset = -1;
  for (let i = 0; i < n; i++) {
    const off = Number(offsets[i]), count = Number(byteCounts[i]);
    if (count > 0 && off + count <= fileBytes) lastWholeOffset = Math.max(lastWholeOffset, off);
  }
  for (let i = 0; i < n; i++) {
    const off = Number(offsets[i]), count = Number(byteCounts[i]);
    if (count === 0 || off + count <= fileBytes) continue; // a count of 0 is a sparse block (nodata)
    const where = blockName(i, layout, imageHeight);
    if (off < lastWholeOffset || off >= fileBytes) {
      throw new TerrainError('damaged', `The file is damaged at ${where}: its data is said to lie at bytes ${off}-${off + count}, past the end of the ${fileBytes}-byte file; re-export it from your GIS.`);
    }
    throw new TerrainError('truncated', `The file is cut short inside ${where}: its data runs to byte ${off + count} but the file has ${fileBytes} bytes; upload the complete file (or re-export it).`);
  }
}

/**
 * The upload's survey of a grid read band by band (terrain/dem-survey.ts) gives exactly the figures and the preview
 * of reading the grid whole (describeGrid + hillshadePng over readDem, whose heights are checked against GDAL 3.6.2
 * in dem.test.ts and dem-encodings.test.ts), for every test grid and for bands of a single block row.
 */
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { describeGrid, hillshadePng, readDem, surveyDem, TerrainError, type ByteRangeSource } from '../../terrain/index';

const dir = 'tests/fixtures/dem';
const grids = ['datasets/harrow-fell-dem.tif', ...fs.readdirSync(dir).filter((f) => f.endsWith('.tif')).map((f) => path.join(dir, f))];

/** A range source that keeps the largest single read, to show the survey never asks for the whole file. */
function source(bytes: Uint8Array) {
  let largest = 0;
  const src: ByteRangeSource = {
    byteLength: bytes.byteLength,
    async read(offset, length) {
      largest = Math.max(largest, length);
      return bytes.slice(offset, offset + length);
    },
  };
  return { src, largest: () => largest };
}

async function whole(bytes: Uint8Array, maxSizePx: number) {
  try {
    const grid = await readDem(bytes);
    return { metadata: describeGrid(grid), hillshade: hillshadePng(grid, { maxSizePx }) };
  } catch (err) {
    return { error: err as Error };
  }
}

async function banded(bytes: Uint8Array, maxSizePx: number, bandPixels: number) {
  try {
    return await surveyDem(source(bytes).src, { maxSizePx, bandPixels });
  } catch (err) {
    return { error: err as Error };
  }
}

describe('surveying a grid band by band', () => {
  for (const file of grids) {
    it(`matches reading ${path.basename(file)} whole`, async () => {
      const bytes = new Uint8Array(fs.readFileSync(file));
      // maxSizePx 1024 keeps small grids at full size (k = 1); 64 box-averages them (k > 1)
      for (const maxSizePx of [1024, 64]) {
        const a = await whole(bytes, maxSizePx);
        const b = await banded(bytes, maxSizePx, 1); // one row of blocks per band
        if ('error' in a) {
          expect('error' in b && b.error).toBeInstanceOf(TerrainError);
          expect((b as { error: TerrainError }).error.code).toBe((a.error as TerrainError).code);
          continue;
        }
        expect('error' in b ? b.error : null).toBeNull();
        const s = b as Exclude<typeof b, { error: Error }>;
        expect(s.metadata).toEqual(a.metadata);
        expect(s.hillshade.width).toBe(a.hillshade.width);
        expect(s.hillshade.transform).toEqual(a.hillshade.transform);
        expect(s.hillshade.boundsWgs84).toEqual(a.hillshade.boundsWgs84);
        expect(Buffer.from(s.hillshade.png).equals(Buffer.from(a.hillshade.png))).toBe(true);
      }
    });
  }

  it('reads the demo grid block by block, never the whole file at once', async () => {
    const bytes = new Uint8Array(fs.readFileSync('datasets/harrow-fell-dem.tif'));
    const c = source(bytes);
    const s = await surveyDem(c.src, { bandPixels: 1 });
    expect(s.metadata.width).toBe(1100);
    expect(c.largest()).toBeLessThan(bytes.byteLength / 8);
  });
});

/**
 * Reading a DEM by byte ranges (a stored grid on disk or in object storage) instead of whole: the same heights as
 * reading the bytes in memory (that path is checked against GDAL 3.6.2 in dem.test.ts and dem-encodings.test.ts),
 * while only the header, the block tables and the blocks under the window are fetched.
 */
import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { openDem, readDem, readDemHeader, type ByteRangeSource } from '../../terrain/index';

/** A range source over a file's bytes that records what was asked for. */
function countingSource(bytes: Uint8Array) {
  const reads: Array<[number, number]> = [];
  const src: ByteRangeSource = {
    byteLength: bytes.byteLength,
    async read(offset, length) {
      reads.push([offset, length]);
      return bytes.slice(offset, offset + length);
    },
  };
  return { src, reads, fetched: () => reads.reduce((n, [, l]) => n + l, 0) };
}

const demo = new Uint8Array(fs.readFileSync('datasets/harrow-fell-dem.tif')); // 1100 x 900 Float32, 256 x 256 DEFLATE tiles (gdalinfo 3.6.2)

describe('reading a DEM by byte ranges', () => {
  it('gives the same heights as the bytes in memory while fetching only the blocks under the window', async () => {
    const window = [300, 300, 340, 340] as const; // inside tile (1, 1)
    const whole = await readDem(demo, { pixelWindow: window });
    const c = countingSource(demo);
    const ranged = await readDem(c.src, { pixelWindow: window });
    expect(ranged.width).toBe(40);
    expect(Array.from(ranged.data)).toEqual(Array.from(whole.data));
    expect(ranged.transform).toEqual(whole.transform);
    // one tile of 20, plus the header and block tables: a small part of the 1.47 MB file
    const header = await readDemHeader(demo);
    expect(header.tiling).toMatchObject({ tiled: true, blockWidth: 256, blockHeight: 256 });
    expect(c.fetched()).toBeLessThan(demo.byteLength / 8);
    expect(c.reads.every(([o, l]) => o >= 0 && l > 0 && o < demo.byteLength)).toBe(true);
  });

  it('reads the whole grid the same way, and the header alone without any block', async () => {
    const c = countingSource(demo);
    const header = await readDemHeader(c.src);
    expect(header).toEqual(await readDemHeader(demo));
    expect(c.fetched()).toBeLessThan(4096); // directory, GeoKeys and block tables only
    const src = await openDem(countingSource(demo).src);
    expect(Array.from((await src.read()).data)).toEqual(Array.from((await readDem(demo)).data));
  });

  it('refuses a damaged file with the same words through ranges as in memory', async () => {
    const cut = new Uint8Array(fs.readFileSync('tests/fixtures/dem/truncated.tif'));
    const inMemory = await readDem(cut).then(() => null, (e: Error) => e.message);
    const byRanges = await readDem(countingSource(cut).src).then(() => null, (e: Error) => e.message);
    expect(inMemory).not.toBeNull();
    expect(byRanges).toBe(inMemory);
  });
});

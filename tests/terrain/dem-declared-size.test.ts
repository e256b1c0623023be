/**
 * How much a file may declare: blocks are held to what their compression can pack into their stored bytes, so a
 * tiny file cannot make the reader allocate gigabytes, while a real grid that packs as tightly as its compression
 * allows (a constant tile) still reads.
 */
import { readFileSync } from 'node:fs';
import { inflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { MAX_BYTES_PER_STORED_BYTE, parseDemHeader } from '../../terrain/dem-header';
import { readDem } from '../../terrain/dem';
import { TerrainError } from '../../terrain/errors';
import { setInt, TAG } from '../support/tiff-bytes';

const fixture = (name: string) => new Uint8Array(readFileSync(new URL(`../fixtures/dem/${name}`, import.meta.url)));
const inflate = (d: Uint8Array) => inflateSync(d);

describe('declared size against stored bytes', () => {
  it('reads a constant 2048 x 2048 float32 grid that DEFLATE packs about 940 to 1', async () => {
    // Made with GDAL 3.6.2 (Debian python3-gdal): Create('constant-deflate-tiled.tif', 2048, 2048, 1, GDT_Float32,
    // ['COMPRESS=DEFLATE', 'TILED=YES', 'BLOCKXSIZE=512', 'BLOCKYSIZE=512']), geotransform (500000, 1, 0, 5200000, 0, -1),
    // EPSG:32631, every cell 123.5; `gdallocationinfo -valonly constant-deflate-tiled.tif 1000 1000` prints 123.5.
    const bytes = fixture('constant-deflate-tiled.tif');
    expect((2048 * 2048 * 4) / bytes.byteLength).toBeGreaterThan(900);
    const grid = await readDem(bytes, { inflate });
    expect([grid.width, grid.height]).toEqual([2048, 2048]);
    expect(grid.data[1000 * 2048 + 1000]).toBe(123.5);
  });

  it('refuses a small file whose one strip declares 1 GiB of samples, naming the compression ceiling', async () => {
    const bytes = fixture('utm-f32-strips.tif');
    setInt(bytes, TAG.ImageWidth, 16384);
    setInt(bytes, TAG.ImageLength, 16384);
    setInt(bytes, TAG.RowsPerStrip, 16384);
    const err = await parseDemHeader(bytes).then(() => null, (e: unknown) => e);
    expect(err).toBeInstanceOf(TerrainError);
    expect((err as TerrainError).code).toBe('too-large');
    expect((err as TerrainError).message).toMatch(/1024 MiB of samples/);
  });

  it('bounds only the compressions that have a ceiling (DEFLATE, LZW, PackBits, none)', () => {
    expect(MAX_BYTES_PER_STORED_BYTE[8]).toBeGreaterThan(1032); // DEFLATE's own ceiling, RFC 1951
    expect(MAX_BYTES_PER_STORED_BYTE[32773]).toBe(64); // PackBits: 128 repeats in 2 bytes (TIFF 6.0, section 9)
    expect(MAX_BYTES_PER_STORED_BYTE[50000]).toBeUndefined(); // ZSTD
    expect(MAX_BYTES_PER_STORED_BYTE[34887]).toBeUndefined(); // LERC
  });
});

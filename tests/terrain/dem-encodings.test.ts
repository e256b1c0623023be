import { readFileSync } from 'node:fs';
import { inflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { openDem, readDem, readDemHeader } from '../../terrain/dem';
import type { TerrainError } from '../../terrain/errors';
import { setXzDecoder } from '../../terrain/dem-codecs';
import { installNodeCodecs } from '../../server/analysis/node-codecs';

// GeoTIFFs in the encodings GDAL writes for elevation, and band 1 as GDAL 3.6.2 decodes it (ReadAsArray, and
// gdallocationinfo -valonly at three pixels, commands recorded): tests/fixtures/dem/make-encoding-fixtures.py
const ref = JSON.parse(readFileSync(new URL('../fixtures/dem/enc-reference.json', import.meta.url), 'utf8')) as {
  tool: string;
  grids: Record<string, { file: string; made_by: string; width: number; height: number; bands: number; values: Array<Array<number | null>>; gdallocationinfo: Array<{ col: number; row: number; command: string; value: number }> }>;
};
const fixture = (name: string) => readFileSync(new URL(`../fixtures/dem/${name}`, import.meta.url));

async function codeOf(p: Promise<unknown>): Promise<string> {
  try {
    await p;
  } catch (e) {
    return (e as TerrainError).code;
  }
  return 'no error';
}

const READ = ['zstd-f32-pred3', 'zstd-i16-pred2', 'lerc-f32', 'lerc-deflate-f32', 'lerc-zstd-cog', 'float16', 'interleaved-i16', 'interleaved-f32'];

describe('encodings read as GDAL reads them', () => {
  for (const name of READ) {
    const g = ref.grids[name];
    it(`${g.file} (${g.made_by}) decodes band 1 to ${ref.tool}'s values`, async () => {
      const grid = await readDem(fixture(g.file), { inflate: (d) => inflateSync(d) });
      expect([grid.width, grid.height]).toEqual([g.width, g.height]);
      for (let r = 0; r < g.height; r++) {
        for (let c = 0; c < g.width; c++) {
          const e = g.values[r][c];
          const v = grid.data[r * g.width + c];
          if (e === null) expect(v, `pixel ${c},${r}`).toBeNaN();
          else expect(v, `pixel ${c},${r}`).toBe(Math.fround(e));
        }
      }
      for (const p of g.gdallocationinfo) expect(grid.data[p.row * g.width + p.col], p.command).toBe(Math.fround(p.value));
    });
  }

  // JPEG is lossy: GDAL 3.6.2 decodes with libjpeg-turbo, Loftline with geotiff.js's baseline decoder, and the two
  // inverse DCTs round differently, so a pixel may differ by one digital number (measured: 56 of 1,200 striped,
  // quality 75; the stored heights themselves carry the encoder's loss, which no decoder undoes)
  for (const name of ['jpeg', 'jpeg-tiled']) {
    const g = ref.grids[name];
    it(`${g.file} (${g.made_by}) decodes within 1 digital number of ${ref.tool}'s values`, async () => {
      const grid = await readDem(fixture(g.file));
      expect([grid.width, grid.height]).toEqual([g.width, g.height]);
      let exact = 0;
      for (let r = 0; r < g.height; r++) {
        for (let c = 0; c < g.width; c++) {
          const e = g.values[r][c];
          const v = grid.data[r * g.width + c];
          if (e === null) expect(v, `pixel ${c},${r}`).toBeNaN();
          else {
            expect(Math.abs(v - e), `pixel ${c},${r}: ${v} vs ${e}`).toBeLessThanOrEqual(1);
            if (v === e) exact++;
          }
        }
      }
      expect(exact).toBeGreaterThan(0.9 * g.width * g.height); // most pixels the same: the same image, not a shifted one
      for (const p of g.gdallocationinfo) expect(Math.abs(grid.data[p.row * g.width + p.col] - p.value), p.command).toBeLessThanOrEqual(1);
      expect((await readDemHeader(fixture(g.file))).compression).toBe('jpeg');
    });
  }

  it('reads the same pixels through a window as in whole (tiled ZSTD with the float predictor, LERC in a COG)', async () => {
    for (const name of ['zstd-f32-pred3', 'lerc-zstd-cog', 'interleaved-f32']) {
      const g = ref.grids[name];
      const src = await openDem(fixture(g.file));
      const win = await src.read({ pixelWindow: [13, 7, 29, 25] });
      for (let r = 7; r < 25; r++) for (let c = 13; c < 29; c++) expect(win.data[(r - 7) * 16 + (c - 13)]).toBe(Math.fround(g.values[r][c] as number));
    }
    // tiled JPEG: the window's pixels are the whole read's (same decoder), edge tiles included
    const whole = await readDem(fixture('enc/jpeg-tiled.tif'));
    const win = await (await openDem(fixture('enc/jpeg-tiled.tif'))).read({ pixelWindow: [13, 7, 40, 30] });
    for (let r = 7; r < 30; r++) for (let c = 13; c < 40; c++) expect(win.data[(r - 7) * 27 + (c - 13)]).toBe(whole.data[r * 40 + c]);
  });

  it('names the encoding in the header', async () => {
    expect((await readDemHeader(fixture('enc/zstd-i16-pred2.tif'))).compression).toBe('zstd');
    expect((await readDemHeader(fixture('enc/lerc-f32.tif'))).compression).toBe('lerc');
    expect((await readDemHeader(fixture('enc/float16.tif'))).sampleType).toBe('float16');
    expect((await readDemHeader(fixture('enc/interleaved-i16.tif'))).bands).toBe(3);
  });
});

describe('encodings refused with a reason', () => {
  it('refuses LZMA naming it and saying how to re-save while no LZMA decoder is given', async () => {
    setXzDecoder(null);
    expect(await codeOf(readDem(fixture('enc/lzma.tif')))).toBe('unsupported');
    await expect(readDemHeader(fixture('enc/lzma.tif'))).rejects.toThrow(/LZMA compression.*COMPRESS=ZSTD/);
  });

});

describe('LZMA with the decoder the server and command line inject (npm @napi-rs/lzma)', () => {
  it('decodes enc/lzma.tif exactly to GDAL 3.6.2\'s values', async () => {
    installNodeCodecs();
    const g = ref.grids.lzma;
    const grid = await readDem(fixture(g.file));
    expect((await readDemHeader(fixture(g.file))).compression).toBe('lzma');
    for (let r = 0; r < g.height; r++) {
      for (let c = 0; c < g.width; c++) {
        const e = g.values[r][c];
        const v = grid.data[r * g.width + c];
        if (e === null) expect(v, `pixel ${c},${r}`).toBeNaN();
        else expect(v, `pixel ${c},${r}`).toBe(Math.fround(e));
      }
    }
    for (const p of g.gdallocationinfo) expect(grid.data[p.row * g.width + p.col], p.command).toBe(Math.fround(p.value));
  });

  it('says a damaged LZMA block is damaged', async () => {
    installNodeCodecs();
    const bytes = new Uint8Array(fixture(ref.grids.lzma.file));
    const src = await readDemHeader(bytes);
    void src;
    // the first strip's .xz stream starts with its magic bytes FD 37 7A 58 5A 00: break the stream after them
    const at = bytes.findIndex((b, i) => b === 0xfd && bytes[i + 1] === 0x37 && bytes[i + 2] === 0x7a && bytes[i + 3] === 0x58);
    expect(at).toBeGreaterThan(0);
    bytes.fill(0x55, at + 12, at + 40);
    expect(await codeOf(readDem(bytes))).toBe('damaged');
  });
});

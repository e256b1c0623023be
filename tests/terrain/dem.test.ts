import { readFileSync } from 'node:fs';
import { inflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { fromArrayBuffer } from 'geotiff';
import { openDem, readDem, readDemHeader, windowToPixels } from '../../terrain/dem';
import { WGS84, createTransform } from '../../terrain/crs';
import type { TerrainError } from '../../terrain/errors';

const fixture = (name: string) => readFileSync(new URL(`../fixtures/dem/${name}`, import.meta.url));
// What GDAL 3.6.2 (Debian python3-gdal) decodes from each fixture: tests/fixtures/dem/make-fixtures.py
const ref = JSON.parse(readFileSync(new URL('../fixtures/dem/reference.json', import.meta.url), 'utf8'));
const METRES_PER: Record<string, number> = { feet: 0.3048, usFeet: 1200 / 3937 }; // exact unit definitions (NIST SP 811)

async function codeOf(p: Promise<unknown>): Promise<string> {
  try {
    await p;
  } catch (e) {
    return (e as TerrainError).code;
  }
  return 'no error';
}

describe('readDem against GDAL', () => {
  for (const [key, g] of Object.entries<any>(ref.grids)) {
    it(`decodes every pixel and the geotransform of ${g.file} as ${ref.tool} does`, async () => {
      const grid = await readDem(fixture(g.file));
      expect([grid.width, grid.height]).toEqual([g.width, g.height]);
      for (let i = 0; i < 6; i++) expect(grid.transform[i]).toBeCloseTo(g.geoTransform[i], 9);
      if (g.epsg !== null) expect(grid.crs.epsg).toBe(g.epsg);
      const f = METRES_PER[key] ?? 1;
      for (let r = 0; r < g.height; r++) {
        for (let c = 0; c < g.width; c++) {
          const v = grid.data[r * g.width + c];
          const e = g.values[r][c];
          if (e === null) expect(v, `pixel ${c},${r}`).toBeNaN();
          else expect(v, `pixel ${c},${r}`).toBe(Math.fround(Math.fround(e) * f));
        }
      }
    });
  }

  it('gives the same pixels with an injected node:zlib inflate as with the built-in one', async () => {
    for (const name of ['tiled-deflate-fp.tif', 'int16-deflate-utm55s.tif', 'nodata-hole.tif']) {
      const a = await readDem(fixture(name));
      const b = await readDem(fixture(name), { inflate: (d) => inflateSync(d) });
      expect(Array.from(b.data)).toEqual(Array.from(a.data));
    }
  });
});

describe('readDemHeader', () => {
  it('describes layout, CRS, nodata and units without decoding pixels', async () => {
    const h = await readDemHeader(fixture('tiled-deflate-fp.tif'));
    expect(h).toMatchObject({
      width: 37, height: 21, compression: 'deflate', predictor: 3, sampleType: 'float32', rasterType: 'pixel-is-area',
      tiling: { tiled: true, blockWidth: 16, blockHeight: 16, blocksAcross: 3, blocksDown: 2 },
      units: { horizontal: 'metre', vertical: 'metre' },
    });
    expect(h.crs.epsg).toBe(32633);
    expect((await readDemHeader(fixture('nodata-hole.tif'))).nodata).toBe(-9999);
  });

  it('reads vertical units from GDAL unit metadata and from a compound CRS', async () => {
    expect((await readDemHeader(fixture('feet-unittype.tif'))).units.vertical).toBe('foot');
    const us = await readDemHeader(fixture('usft-compound.tif'));
    expect(us.units).toEqual({ horizontal: 'us-survey-foot', vertical: 'us-survey-foot' });
    expect(us.verticalDatum?.epsg).toBe(6360);
  });

  it('shifts a PixelIsPoint georeference by half a pixel, as GDAL does', async () => {
    const bytes = fixture('pixel-is-point.tif');
    const h = await readDemHeader(bytes);
    expect(h.rasterType).toBe('pixel-is-point');
    // the file's tiepoint puts the centre of pixel (0, 0) at 500701, 5549899 ...
    const tiff = await fromArrayBuffer(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength));
    const tie = (await tiff.getImage()).fileDirectory.getValue('ModelTiepoint') as number[];
    expect([tie[3], tie[4]]).toEqual([500701, 5549899]);
    // ... so its outer corner is one half 2 m pixel up and left, the geotransform GDAL reports
    expect(h.transform.slice(0, 4)).toEqual([500700, 2, 0, 5549900]);
    expect(h.transform[0]).toBe(ref.grids.pixelIsPoint.geoTransform[0]);
  });

  it('reads big-endian files and rotated ModelTransformation georeferences', async () => {
    const h = await readDemHeader(fixture('rotated-bigendian.tif'));
    expect(h.byteOrder).toBe('big-endian');
    expect(h.transform).toEqual([500900, 1.8, 0.3, 5549950, 0.25, -1.9]);
  });

  it('reads a block the file leaves unwritten (sparse, byte count 0) as nodata', async () => {
    const grid = await readDem(fixture('sparse-tiles.tif'));
    expect(Number.isNaN(grid.data[0 * 32 + 20])).toBe(true); // inside the unwritten top-right 16 x 16 block
    expect(Number.isNaN(grid.data[17 * 32 + 20])).toBe(false);
  });

  it('does not mutate the bytes it is given', async () => {
    const bytes = fixture('int16-deflate-utm55s.tif');
    const copy = Buffer.from(bytes);
    await readDem(bytes);
    await readDem(fixture('lzw-u16.tif'));
    expect(bytes.equals(copy)).toBe(true);
  });
});

describe('bad files fail with a code and a message that says what to do', () => {
  const cases: Array<[string, string, RegExp]> = [
    ['not-a-tiff.tif', 'not-tiff', /not a TIFF.*upload a GeoTIFF/],
    ['no-georeference.tif', 'no-georeference', /no georeference/],
    ['truncated.tif', 'truncated', /cut short.*upload the complete file/],
    ['unknown-crs-laea.tif', 'unknown-crs', /user-defined projection.*reproject/],
    ['all-nodata.tif', 'all-nodata', /only nodata/],
  ];
  for (const [file, code, message] of cases) {
    it(`${file} -> ${code}`, async () => {
      expect(await codeOf(readDem(fixture(file)))).toBe(code);
      await expect(readDem(fixture(file))).rejects.toThrow(message);
    });
  }

  it('a grid above the pixel limit -> too-large', async () => {
    expect(await codeOf(readDem(fixture('utm-f32-strips.tif'), { maxPixels: 50 }))).toBe('too-large');
    await expect(readDem(fixture('utm-f32-strips.tif'), { maxPixels: 50 })).rejects.toThrow(/9 x 7 = 63 pixels, above the limit of 50/);
  });

  it('a window that misses the grid -> outside-grid', async () => {
    expect(await codeOf(readDem(fixture('utm-f32-strips.tif'), { window: { bbox: [0, 0, 10, 10] } }))).toBe('outside-grid');
  });

  it('an empty or odd input -> not-tiff or invalid-input', async () => {
    expect(await codeOf(readDem(new Uint8Array(0)))).toBe('not-tiff');
    expect(await codeOf(readDem('file.tif' as never))).toBe('invalid-input');
  });
});

describe('windowed reads', () => {
  it('return the window of the full grid with the window transform', async () => {
    const bytes = fixture('tiled-deflate-fp.tif');
    const full = await readDem(bytes);
    // map bbox over columns 17..21 and rows 3..8 (pixel-is-area, 1 m pixels from 612000, 4740000)
    const win = await readDem(bytes, { window: { bbox: [612017.2, 4739991.5, 612021.9, 4739996.1], marginPx: 0 } });
    expect([win.width, win.height]).toEqual([5, 6]);
    expect(win.transform[0]).toBe(612017);
    expect(win.transform[3]).toBe(4739997);
    for (let r = 0; r < win.height; r++) for (let c = 0; c < win.width; c++) {
      expect(win.data[r * win.width + c]).toBe(full.data[(r + 3) * full.width + c + 17]);
    }
  });

  it('decode only the tiles under the window', async () => {
    const src = await openDem(fixture('tiled-deflate-fp.tif'));
    await src.read({ window: { bbox: [612001, 4739990, 612005, 4739995] } });
    expect(src.stats.blocksDecoded).toBe(1); // the first 16 x 16 tile of 3 x 2
    await src.read({ window: { bbox: [612001, 4739990, 612005, 4739995] } });
    expect(src.stats.blocksDecoded).toBe(1); // second read served from the block cache
  });

  it('accept a bbox in WGS 84 and widen it by the margin', async () => {
    const bytes = fixture('utm-f32-strips.tif');
    const h = await readDemHeader(bytes);
    const inv = createTransform(h.crs, WGS84);
    const [lon0, lat0] = inv.forward(500006.5, 5549991.5);
    const [lon1, lat1] = inv.forward(500009.5, 5549994.5);
    // pixels 3..4 x 3..4 in UTM; the lon/lat box around them is a little larger (grid convergence), plus 1 px margin
    const [c0, r0, c1, r1] = windowToPixels(h, { bbox: [lon0, lat0, lon1, lat1], crs: WGS84, marginPx: 1 });
    expect(c0 <= 2 && r0 <= 2 && c1 >= 6 && r1 >= 6).toBe(true);
    expect(c0 >= 1 && r0 >= 1 && c1 <= 7 && r1 <= 7).toBe(true);
    const none = windowToPixels(h, { bbox: [lon0, lat0, lon1, lat1], crs: WGS84, marginPx: 0 });
    expect(none[2] - none[0]).toBe(c1 - c0 - 2);
  });

  it('return the same heights as the full read for every pixel of every window over the tiles', async () => {
    const bytes = fixture('int16-deflate-utm55s.tif');
    const full = await readDem(bytes);
    const src = await openDem(bytes, { cacheBytes: 0 });
    for (const [c0, r0, c1, r1] of [[0, 0, 19, 17], [15, 15, 17, 17], [3, 14, 18, 16], [16, 0, 19, 3]] as const) {
      const w = await src.read({ pixelWindow: [c0, r0, c1, r1] });
      for (let r = r0; r < r1; r++) for (let c = c0; c < c1; c++) expect(w.data[(r - r0) * w.width + c - c0]).toBe(full.data[r * full.width + c]);
    }
  });
});

describe('the demo grid', () => {
  it('holds exactly the heights datasets/make-demo-dem.ts generates', async () => {
    const { DEMO_DEM, demoGrid } = await import('../../datasets/make-demo-dem');
    const committed = readFileSync(new URL('../../datasets/harrow-fell-dem.tif', import.meta.url));
    const values = demoGrid();
    const grid = await readDem(committed, { inflate: (d) => inflateSync(d) });
    expect(grid.crs.epsg).toBe(32631);
    expect(grid.transform).toEqual([DEMO_DEM.originE, 2, 0, DEMO_DEM.originN, 0, -2]);
    let mismatches = 0;
    for (let i = 0; i < values.length; i++) {
      const ok = values[i] === DEMO_DEM.nodata ? Number.isNaN(grid.data[i]) : grid.data[i] === values[i];
      if (!ok) mismatches++;
    }
    expect(mismatches).toBe(0);
    expect((await readDemHeader(committed)).verticalDatum).toEqual({ epsg: 5773, name: 'EGM96 height' });
  });
});

describe('the floating-point predictor undo', () => {
  it('gives the same words word-wise (aligned rows) as byte-wise (unaligned rows), windows and nodata included', async () => {
    const { float32PredictorRows } = await import('../../terrain/dem-decoders');
    const w = 12, rows = 5;
    const raw = new Uint8Array(w * rows * 4).map((_, i) => (i * 2654435761) >>> 24);
    const aligned = raw.slice();
    const shifted = new Uint8Array(raw.length + 1).subarray(1);
    shifted.set(raw);
    const a = new Uint32Array(w * rows), b = new Uint32Array(w * rows);
    float32PredictorRows(aligned, w, rows, a, 0, w, 0, w, 0, rows, null);
    float32PredictorRows(shifted, w, rows, b, 0, w, 0, w, 0, rows, null);
    expect(Array.from(a)).toEqual(Array.from(b));
    const nd = a[7];
    const c = new Uint32Array(3 * 2), d = new Uint32Array(3 * 2);
    const s2 = new Uint8Array(raw.length + 1).subarray(1);
    s2.set(raw);
    float32PredictorRows(raw.slice(), w, rows, c, 0, 3, 5, 8, 0, 2, nd);
    float32PredictorRows(s2, w, rows, d, 0, 3, 5, 8, 0, 2, nd);
    expect(Array.from(c)).toEqual(Array.from(d));
    expect(c[2]).toBe(0x7fc00000); // row 0, column 7 was the nodata word
    expect(c[0]).toBe(a[5]);
  });
});

import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { openDem, readDem, readDemHeader } from '../../terrain/dem';
import { sampleAt } from '../../terrain/sample';
import { TerrainError } from '../../terrain/errors';

// GDAL 3.6.2's reading of files that are not plain elevation, of grids with an internal mask, and of broken
// predictors and pixel scales (tests/fixtures/grid-trust/make-fixtures.py, reference.json "content")
const ref = JSON.parse(readFileSync(new URL('../fixtures/grid-trust/reference.json', import.meta.url), 'utf8')).content.files;
const fixture = (name: string) => readFileSync(new URL(`../fixtures/grid-trust/${name}`, import.meta.url));

async function refusal(p: Promise<unknown>): Promise<TerrainError> {
  const err = await p.then(() => null, (e) => e);
  expect(err).toBeInstanceOf(TerrainError);
  return err as TerrainError;
}

describe('files that hold colours, not heights', () => {
  it.each([
    ['palette.tif', ['Palette'], /a palette \(colour-mapped\) image, not an elevation grid/],
    ['rgb-pixel.tif', ['Red', 'Green', 'Blue'], /an RGB colour image, not an elevation grid/],
    ['rgb-band.tif', ['Red', 'Green', 'Blue'], /an RGB colour image, not an elevation grid/],
  ])('refuses %s (GDAL: colour interpretation %j) as not-elevation before decoding', async (name, interp, message) => {
    expect(ref[name].colorInterpretation).toEqual(interp);
    const err = await refusal(readDemHeader(fixture(name)));
    expect(err.code).toBe('not-elevation');
    expect(err.message).toMatch(message);
    expect(err.message).toMatch(/Export the DEM itself/);
  });
});

describe('GDAL internal masks', () => {
  for (const name of ['masked-tiled.tif', 'masked-strips.tif']) {
    it(`reads the cells GDAL's mask band marks 0 as nodata, and every other cell as GDAL does (${name})`, async () => {
      const g = ref[name];
      expect(g.perDataset).toBe(true); // GMF_PER_DATASET: one mask for the dataset, stored in the file
      const header = await readDemHeader(fixture(name));
      expect(header.mask).toBe('internal');
      const grid = await readDem(fixture(name));
      let masked = 0;
      for (let r = 0; r < grid.height; r++) {
        for (let c = 0; c < grid.width; c++) {
          const v = grid.data[r * grid.width + c];
          if (g.mask[r][c] === 0) { expect(v, `cell ${c},${r}`).toBeNaN(); masked++; } else expect(v, `cell ${c},${r}`).toBe(Math.fround(g.values[r][c]));
        }
      }
      expect(masked).toBeGreaterThan(20);
    });

    it(`applies the mask to windows that cut blocks, and samples masked points as null (${name})`, async () => {
      const g = ref[name];
      const dem = await openDem(fixture(name));
      const win = await dem.read({ pixelWindow: [21, 7, 33, 14] });
      for (let r = 7; r < 14; r++) for (let c = 21; c < 33; c++) {
        const v = win.data[(r - 7) * 12 + (c - 21)];
        if (g.mask[r][c] === 0) expect(v).toBeNaN(); else expect(v).toBe(Math.fround(g.values[r][c]));
      }
      const grid = await readDem(fixture(name));
      for (const p of g.points) {
        const near = sampleAt(grid, p.x, p.y, { crs: grid.crs, method: 'nearest' });
        // gdallocationinfo 3.6.2 prints the stored value (0 here) even where the mask says no data; the mask band is GDAL's verdict
        if (p.gdalMask === 0) { expect(p.gdallocationinfo).toBe(0); expect(near).toBeNull(); } else expect(near).toBeCloseTo(p.gdallocationinfo, 9);
      }
    });
  }
});

describe('broken predictors and pixel scales', () => {
  it('refuses the floating-point predictor on integer samples, as libtiff does', async () => {
    expect(ref['int16-predictor3.tif'].gdalinfoChecksum.errors[0]).toMatch(/PredictorSetup:Floating point "Predictor" not supported/);
    const err = await refusal(readDemHeader(fixture('int16-predictor3.tif')));
    expect(err.code).toBe('unsupported');
    expect(err.message).toMatch(/floating-point predictor \(Predictor 3\) on int16 samples/);
  });

  it('refuses a 1e300 pixel scale, whose corners GDAL cannot place ("Point outside of projection domain")', async () => {
    expect(ref['scale-1e300.tif'].gdalinfo.errors).toContain('ERROR 1: Point outside of projection domain');
    const err = await refusal(readDemHeader(fixture('scale-1e300.tif')));
    expect(err.code).toBe('no-georeference');
    expect(err.message).toMatch(/not on Earth \(pixel size 1e\+300 x -1e\+300\)/);
  });

  it('refuses a 1e308 pixel scale, whose corners are at infinity', async () => {
    const err = await refusal(readDemHeader(fixture('scale-1e308.tif')));
    expect(err.code).toBe('no-georeference');
    expect(err.message).toMatch(/corners at infinity/);
  });
});

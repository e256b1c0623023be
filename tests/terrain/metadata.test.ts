import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { createGrid } from '../../terrain/grid';
import { WGS84, createTransform, crsFromEpsg } from '../../terrain/crs';
import { describeGrid } from '../../terrain/metadata';
import { readDem } from '../../terrain/dem';

const fixture = (name: string) => readFileSync(new URL(`../fixtures/dem/${name}`, import.meta.url));
// GDAL 3.6.2's decoded values of the same files (tests/fixtures/dem/make-fixtures.py)
const ref = JSON.parse(readFileSync(new URL('../fixtures/dem/reference.json', import.meta.url), 'utf8'));

describe('describeGrid', () => {
  it('reports size, resolution, bounds, elevation range and nodata share of the nodata-hole grid', async () => {
    const g = ref.grids.nodataHole;
    const m = describeGrid(await readDem(fixture(g.file)));
    const known = g.values.flat().filter((v: number | null) => v !== null) as number[];
    expect(m).toMatchObject({ width: 12, height: 10, resolution: [1, 1], bounds: [500100, 5548990, 500112, 5549000], verticalUnit: 'metre' });
    expect(m.crs).toMatchObject({ epsg: 32633, name: 'WGS 84 / UTM zone 33N' });
    expect(m.nodataShare).toBeCloseTo(12 / 120, 12); // the 3 x 4 hole
    expect(m.elevation.min).toBeCloseTo(Math.min(...known), 3);
    expect(m.elevation.max).toBeCloseTo(Math.max(...known), 3);
    expect(m.elevation.mean).toBeCloseTo(known.reduce((a, b) => a + b, 0) / known.length, 3);
  });

  it('gives WGS 84 bounds that contain the transformed grid corners', async () => {
    const grid = await readDem(fixture('utm-f32-strips.tif'));
    const m = describeGrid(grid);
    const tr = createTransform(grid.crs, WGS84);
    for (const [x, y] of [[500000, 5550000], [500018, 5550000], [500000, 5549986], [500018, 5549986]]) {
      const [lon, lat] = tr.forward(x, y);
      expect(lon).toBeGreaterThanOrEqual(m.boundsWgs84[0] - 1e-12);
      expect(lon).toBeLessThanOrEqual(m.boundsWgs84[2] + 1e-12);
      expect(lat).toBeGreaterThanOrEqual(m.boundsWgs84[1] - 1e-12);
      expect(lat).toBeLessThanOrEqual(m.boundsWgs84[3] + 1e-12);
    }
  });

  it('reports the unit heights were stored in (feet grids are converted to metres)', async () => {
    const m = describeGrid(await readDem(fixture('feet-unittype.tif')));
    expect(m.verticalUnit).toBe('foot');
    const ft = ref.grids.feet.values.flat() as number[];
    expect(m.elevation.max).toBeCloseTo(Math.max(...ft) * 0.3048, 3);
  });

  it('uses positive pixel sizes for rotated grids and null elevation when all unknown', () => {
    const grid = createGrid({ width: 2, height: 2, data: new Float32Array([NaN, NaN, NaN, NaN]), transform: [0, 3, 4, 0, 4, -3], crs: crsFromEpsg(32633) });
    const m = describeGrid(grid);
    expect(m.resolution).toEqual([5, 5]);
    expect(m.elevation).toEqual({ min: null, max: null, mean: null });
    expect(m.nodataShare).toBe(1);
  });

  it('does not mutate the grid', async () => {
    const grid = await readDem(fixture('nodata-hole.tif'));
    const before = Array.from(grid.data);
    describeGrid(grid);
    expect(Array.from(grid.data)).toEqual(before);
  });
});

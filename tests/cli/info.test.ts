import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runTerrainCli } from './run-cli';

// GDAL 3.6.2's reading of the same fixtures (tests/fixtures/dem/make-fixtures.py)
const ref = JSON.parse(readFileSync(new URL('../fixtures/dem/reference.json', import.meta.url), 'utf8'));

describe('terrain info', () => {
  it('prints one JSON document with the stable fields', async () => {
    const r = await runTerrainCli(['info', 'tests/fixtures/dem/tiled-deflate-fp.tif']);
    expect(r.code).toBe(0);
    expect(r.stderr).toBe('');
    const doc = JSON.parse(r.stdout);
    const g = ref.grids.tiledDeflate;
    const known = (g.values.flat() as number[]);
    expect(doc).toMatchObject({ width: 37, height: 21, crs: { epsg: 32633 }, resolution: [1, 1], bounds: [612000, 4739979, 612037, 4740000], nodataShare: 0, verticalUnit: 'metre' });
    expect(doc.crs.proj4).toContain('+zone=33');
    expect(doc.boundsWgs84).toHaveLength(4);
    expect(doc.elevation.min).toBeCloseTo(Math.min(...known), 3);
    expect(doc.elevation.max).toBeCloseTo(Math.max(...known), 3);
  });

  it('fails with one line on stderr and a non-zero exit for bad input', async () => {
    for (const [args, pattern] of [
      [['info', 'tests/fixtures/dem/not-a-tiff.tif'], /^error \(not-tiff\): .*GeoTIFF/],
      [['info', 'tests/fixtures/dem/missing.tif'], /^error: Cannot read DEM file .*no such file/],
      [['info'], /^error: info takes one DEM file/],
      [['nonsense'], /^error: Unknown command "nonsense"/],
    ] as const) {
      const r = await runTerrainCli([...args]);
      expect(r.code, args.join(' ')).not.toBe(0);
      expect(r.stdout).toBe('');
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(pattern);
    }
  });
});

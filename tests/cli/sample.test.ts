import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runTerrainCli } from './run-cli';

// GDAL 3.6.2 bilinear samples (gdal.Warp -r bilinear, 1x1 output) from tests/fixtures/dem/make-fixtures.py
const ref = JSON.parse(readFileSync(new URL('../fixtures/dem/reference.json', import.meta.url), 'utf8'));

describe('terrain sample', () => {
  it('prints GDAL\'s bilinear heights at grid-CRS points and null outside', async () => {
    const g = ref.grids.tiledDeflate;
    const [a, b] = g.samples;
    const r = await runTerrainCli(['sample', `tests/fixtures/dem/${g.file}`, '--at', `${a.x},${a.y}`, '--at', `${b.x},${b.y}`, '--at', '0,0', '--crs', 'EPSG:32633']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.samples).toHaveLength(3);
    expect(doc.samples[0].x).toBe(a.x);
    expect(doc.samples[0].elevation).toBeCloseTo(a.bilinear, 4);
    expect(doc.samples[1].elevation).toBeCloseTo(b.bilinear, 4);
    expect(doc.samples[2]).toEqual({ x: 0, y: 0, elevation: null });
  });

  it('takes lon,lat by default and reads nearest pixels on request', async () => {
    const g = ref.grids.geographic;
    const s = g.samples[0];
    const r = await runTerrainCli(['sample', `tests/fixtures/dem/${g.file}`, '--at', `${s.x},${s.y}`, '--method', 'nearest']);
    expect(JSON.parse(r.stdout).samples[0].elevation).toBeCloseTo(s.nearest, 4);
  });

  it('marks a point in a nodata hole null', async () => {
    const r = await runTerrainCli(['sample', 'tests/fixtures/dem/nodata-hole.tif', '--at', '500105.5,5548995.5', '--crs', 'EPSG:32633']);
    expect(JSON.parse(r.stdout).samples[0].elevation).toBeNull();
  });

  it('rejects bad options with one line on stderr', async () => {
    for (const [args, pattern] of [
      [['sample', 'tests/fixtures/dem/utm-f32-strips.tif'], /at least one --at/],
      [['sample', 'tests/fixtures/dem/utm-f32-strips.tif', '--at', '15.2'], /--at needs X,Y/],
      [['sample', 'tests/fixtures/dem/utm-f32-strips.tif', '--at', '1,2', '--method', 'cubic'], /--method must be bilinear or nearest/],
      [['sample', 'tests/fixtures/dem/utm-f32-strips.tif', '--at', '1,2', '--crs', 'EPSG:999999'], /unknown-crs/],
      [['sample', 'tests/fixtures/dem/utm-f32-strips.tif', '--at', '1,2', '--bogus'], /Unknown option/],
    ] as const) {
      const r = await runTerrainCli([...args]);
      expect(r.code, args.join(' ')).not.toBe(0);
      expect(r.stderr.trim().split('\n'), args.join(' ')).toHaveLength(1);
      expect(r.stderr).toMatch(pattern);
    }
  }, 120_000); // five runs of the command line: slow on a shared machine
});

import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { computeCoverage, type CoveragePhoto } from '../../terrain/coverage';
import { coverageCog, coverageGeoTiff, coverageGeoTiffParts, COVERAGE_NODATA } from '../../terrain/coverage-raster-file';
import { writeFilePartsSync } from '../../cli/io';
import type { Camera } from '../../terrain/camera';
import { syntheticSite } from './coverage-site';

const camera: Camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };

/** A raster wider than two tiles (so it is tiled and has overviews); its area is the cells' whole square (the parts test below has cells outside its area). */
function raster(viewsOnly = false) {
  const site = syntheticSite(700, 2, (x, y) => 20 * Math.sin(x / 90) + 15 * Math.cos(y / 60));
  const photos: CoveragePhoto[] = [];
  for (let line = 0; line < 5; line++) for (let k = 0; k < 12; k++) photos.push({ xM: -500 + line * 250, yM: -550 + k * 100, altitudeM: 200, yawDeg: 0 });
  return computeCoverage(site.grid, site.frame, site.area(-600, -640, 600, 600), camera, photos, { cellM: 2, specGsdCm: 5, viewsOnly });
}

describe('coverage raster as a Cloud-Optimised GeoTIFF', () => {
  const r = raster();
  const dir = mkdtempSync(join(tmpdir(), 'loftline-cog-'));
  const cogPath = join(dir, 'coverage.cog.tif');
  writeFileSync(cogPath, coverageCog(r));

  it('passes GDAL\'s COG validator', () => {
    // Reference: GDAL 3.6.2's validate_cloud_optimized_geotiff.py (Debian python3-gdal, osgeo_utils.samples);
    // it exits 0 and prints "is a valid cloud optimized GeoTIFF" only when no layout rule is broken.
    const out = execFileSync('/usr/bin/python3', ['-m', 'osgeo_utils.samples.validate_cloud_optimized_geotiff', '--full-check=yes', cogPath], { encoding: 'utf8' });
    expect(out).toContain('is a valid cloud optimized GeoTIFF');
    expect(r.cells.width).toBeGreaterThan(512);
  });

  it('holds, as gdalinfo and gdallocationinfo read it, the same bands, overviews and values as the strip GeoTIFF', () => {
    // Reference: gdalinfo -json and gdallocationinfo -valonly from GDAL 3.6.2 (Debian gdal-bin).
    const info = JSON.parse(execFileSync('gdalinfo', ['-json', cogPath], { encoding: 'utf8' }));
    expect(info.size).toEqual([r.cells.width, r.cells.height]);
    expect(info.bands).toHaveLength(5);
    expect(info.bands[0].block).toEqual([256, 256]);
    expect(info.bands[0].noDataValue).toBe(COVERAGE_NODATA);
    expect(info.bands[0].overviews.length).toBeGreaterThanOrEqual(2);
    expect(info.bands[0].description).toMatch(/^views/);
    expect(info.geoTransform).toEqual([...r.cells.transform]);
    const stripPath = join(dir, 'coverage.strip.tif');
    writeFileSync(stripPath, coverageGeoTiff(r));
    const { width, height } = r.cells;
    const probes: Array<[number, number]> = [[0, 0], [width - 1, height - 1], [300, 257], [511, 20], [width >> 1, height >> 1], [257, height - 3]];
    for (const [c, row] of probes) {
      for (const b of [1, 2, 5]) {
        const a = execFileSync('gdallocationinfo', ['-valonly', '-b', String(b), cogPath, String(c), String(row)], { encoding: 'utf8' }).trim();
        const s = execFileSync('gdallocationinfo', ['-valonly', '-b', String(b), stripPath, String(c), String(row)], { encoding: 'utf8' }).trim();
        expect(a).toBe(s);
      }
      const i = row * width + c;
      const views = execFileSync('gdallocationinfo', ['-valonly', '-b', '1', cogPath, String(c), String(row)], { encoding: 'utf8' }).trim();
      expect(Number(views)).toBe(r.cells.inside[i] ? r.views[i] : COVERAGE_NODATA);
    }
  });
});

describe('views-only coverage raster as a strip GeoTIFF', () => {
  it('holds each band its measures share once, and GDAL reads every band cell for cell as the raster has it', () => {
    // Reference: gdal_translate -of ENVI from GDAL 3.6.2 (Debian gdal-bin): band-sequential little-endian Float32
    // as GDAL decodes the file; each band's strip offset points at the bytes it shares.
    const r = raster(true);
    const { width, height, inside } = r.cells;
    const n = width * height;
    const dir = mkdtempSync(join(tmpdir(), 'loftline-views-'));
    const tif = join(dir, 'views.tif'), raw = join(dir, 'views.raw');
    const bytes = coverageGeoTiff(r);
    writeFileSync(tif, bytes);
    // views, the figures' one NaN array and the other counts' one zero array: three bands' bytes, not five
    expect(bytes.length).toBeLessThan(3 * 4 * n + 4096);
    execFileSync('gdal_translate', ['-q', '-of', 'ENVI', tif, raw]);
    const read = new Float32Array(new Uint8Array(readFileSync(raw)).buffer);
    expect(read.length).toBe(5 * n);
    let inArea = 0, seen = 0;
    for (let i = 0; i < n; i++) {
      const want = inside[i] ? [r.views[i], NaN, 0, NaN, NaN] : [COVERAGE_NODATA, COVERAGE_NODATA, COVERAGE_NODATA, COVERAGE_NODATA, COVERAGE_NODATA];
      for (let b = 0; b < 5; b++) if (!Object.is(read[b * n + i], want[b])) expect(`band ${b + 1} cell ${i}: ${read[b * n + i]}`).toBe(`band ${b + 1} cell ${i}: ${want[b]}`);
      if (inside[i]) { inArea++; if (r.views[i] > 0) seen++; }
    }
    expect(inArea).toBeGreaterThan(10_000);
    expect(seen).toBeGreaterThan(inArea / 2);
  });
});

describe('coverage raster written in parts', () => {
  it('is byte for byte the file written whole, whatever the piece size, and GDAL reads every band of it cell for cell', () => {
    // a triangle of ground, so every row has a run of cells outside the area (nodata) that pieces start and end in
    const site = syntheticSite(700, 2, (x, y) => 20 * Math.sin(x / 90) + 15 * Math.cos(y / 60));
    const photos: CoveragePhoto[] = [];
    for (let line = 0; line < 5; line++) for (let k = 0; k < 12; k++) photos.push({ xM: -500 + line * 250, yM: -550 + k * 100, altitudeM: 200, yawDeg: 0 });
    const triangle = { type: 'Polygon' as const, coordinates: [[[-600, -640], [600, -640], [0, 600], [-600, -640]].map(([x, y]) => site.frame.toLonLat(x, y))] };
    const r = computeCoverage(site.grid, site.frame, triangle, camera, photos, { cellM: 2, specGsdCm: 5 });
    const { width, height, inside } = r.cells;
    const n = width * height;
    expect(n - r.cells.insideCount).toBeGreaterThan(n / 3);
    const whole = coverageGeoTiff(r);
    // pieces of one value, of a few (their ends falling inside and outside the runs of cells outside the area), of
    // more than a row, and the default (more than the whole band here)
    for (const size of [1, 7, 1000, undefined]) {
      const parts: Uint8Array[] = [];
      // each part is copied before the next is asked for: the pieces share one scratch array
      for (const part of coverageGeoTiffParts(r, size)) parts.push(part.slice());
      const joined = Buffer.concat(parts);
      expect(joined.length).toBe(whole.length);
      expect(Buffer.compare(joined, Buffer.from(whole))).toBe(0);
    }
    // Reference: gdal_translate -of ENVI from GDAL 3.6.2 (Debian gdal-bin) on the file as the command line writes it
    // (`writeFilePartsSync`, pieces of 4096 values): band-sequential little-endian Float32 as GDAL decodes it
    const dir = mkdtempSync(join(tmpdir(), 'loftline-parts-'));
    const tif = join(dir, 'parts.tif'), raw = join(dir, 'parts.raw');
    writeFilePartsSync(tif, coverageGeoTiffParts(r, 4096));
    execFileSync('gdal_translate', ['-q', '-of', 'ENVI', tif, raw]);
    const read = new Float32Array(new Uint8Array(readFileSync(raw)).buffer);
    expect(read.length).toBe(5 * n);
    const bands = [r.views, r.finestGsdCm, r.viewsAtSpecGsd, r.maxRayAngleDeg, r.sigmaVerticalM];
    let checked = 0;
    for (let i = 0; i < n; i++) {
      for (let b = 0; b < 5; b++) {
        const want = inside[i] ? Math.fround(bands[b][i]) : COVERAGE_NODATA;
        if (!Object.is(read[b * n + i], want)) expect(`band ${b + 1} cell ${i}: ${read[b * n + i]}`).toBe(`band ${b + 1} cell ${i}: ${want}`);
      }
      if (inside[i] && r.views[i] > 1) checked++;
    }
    expect(checked).toBeGreaterThan(10_000);
  });
});

import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { directionGapDeg } from '../../terrain/view-directions';
import { computeCoverage } from '../../terrain/coverage';
import { syntheticSite } from './coverage-site';
import { cellX, cellY } from '../../terrain/coverage-grid';
import { coverageGeoTiff } from '../../terrain/coverage-raster-file';

// A 1-inch-type survey camera (13.2 x 8.8 mm, 8.8 mm lens): half field of view 36.9° across the track, 26.6° along it.
const camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };
const DEG = Math.PI / 180;

/** Unit rays from the ground to cameras at the given azimuths (clockwise from north) and angles from the vertical. */
function rays(list: Array<[number, number]>): Float64Array {
  const out = new Float64Array(list.length * 3);
  list.forEach(([az, off], k) => {
    out[k * 3] = Math.sin(off * DEG) * Math.sin(az * DEG);
    out[k * 3 + 1] = Math.sin(off * DEG) * Math.cos(az * DEG);
    out[k * 3 + 2] = Math.cos(off * DEG);
  });
  return out;
}

describe('views from all round (widest gap between oblique view directions)', () => {
  const cos30 = Math.cos(30 * DEG);
  const scratch = new Float64Array(16);
  it('is the widest angle round the compass between consecutive oblique views, worked by hand', () => {
    // four sides a quarter turn apart: 90°; three at 0°, 100°, 200°: the gap from 200° back round to 0° is 160°
    expect(directionGapDeg(rays([[0, 40], [90, 40], [180, 40], [270, 40]]), 4, cos30, scratch)).toBeCloseTo(90, 9);
    expect(directionGapDeg(rays([[200, 35], [0, 35], [100, 35]]), 3, cos30, scratch)).toBeCloseTo(160, 9);
    // two opposite sides (a single set of nadir lines, seen from the lines either side): 180°
    expect(directionGapDeg(rays([[90, 33], [270, 33]]), 2, cos30, scratch)).toBeCloseTo(180, 9);
    // across north: 350° and 10° are 20° apart, so the widest gap is the 340° the other way
    expect(directionGapDeg(rays([[350, 45], [10, 45]]), 2, cos30, scratch)).toBeCloseTo(340, 9);
  });
  it('leaves out views nearer the vertical than the oblique angle, and is 360° with fewer than two oblique views', () => {
    expect(directionGapDeg(rays([[0, 40], [90, 10], [180, 40], [270, 29.9]]), 4, cos30, scratch)).toBeCloseTo(180, 9);
    expect(directionGapDeg(rays([[0, 40], [90, 10]]), 2, cos30, scratch)).toBe(360);
    expect(directionGapDeg(rays([]), 0, cos30, scratch)).toBe(360);
  });
  it('in the coverage raster: a point of flat ground seen from four cameras 35° off its vertical, then from three', () => {
    const site = syntheticSite(200, 2, () => 100);
    const H = 80, d = H * Math.tan(35 * DEG);
    // each camera turned so the point lies across its track (36.9° half field): east and west cameras fly north,
    // north and south ones fly east
    const four = [
      { xM: d, yM: 0, altitudeM: 100 + H, yawDeg: 0 }, { xM: -d, yM: 0, altitudeM: 100 + H, yawDeg: 0 },
      { xM: 0, yM: d, altitudeM: 100 + H, yawDeg: 90 }, { xM: 0, yM: -d, altitudeM: 100 + H, yawDeg: 90 },
    ];
    const area = site.area(-3, -3, 3, 3);
    const opts = { cellM: 2, specGsdCm: 5, obliqueDeg: 30 };
    const r4 = computeCoverage(site.grid, site.frame, area, camera, four, opts);
    const r3 = computeCoverage(site.grid, site.frame, area, camera, four.slice(0, 3), opts);
    const r4near = computeCoverage(site.grid, site.frame, area, camera, four, { ...opts, obliqueDeg: 36 });
    const none = computeCoverage(site.grid, site.frame, area, camera, four, { cellM: 2, specGsdCm: 5 });
    // the closed form at each cell's own ground point: the compass bearing from the point to each camera
    const expected = (x: number, y: number, cams: typeof four, obliqueDeg = 30) => {
      const oblique = cams.filter((c) => Math.atan2(Math.hypot(c.xM - x, c.yM - y), c.altitudeM - 100) / DEG >= obliqueDeg);
      if (oblique.length < 2) return 360;
      const az = oblique.map((c) => Math.atan2(c.xM - x, c.yM - y) / DEG).map((a) => (a + 360) % 360).sort((a, b) => a - b);
      let gap = az[0] + 360 - az[az.length - 1];
      for (let k = 1; k < az.length; k++) gap = Math.max(gap, az[k] - az[k - 1]);
      return gap;
    };
    let n = 0, fewer = 0;
    for (let i = 0; i < r4.cells.inside.length; i++) {
      if (!r4.cells.inside[i]) continue;
      n++;
      const x = cellX(r4.cells, i), y = cellY(r4.cells, i);
      expect(r4.views[i]).toBe(4);
      expect(r4.directionGapDeg![i]).toBeCloseTo(expected(x, y, four), 3);
      expect(Math.abs(r4.directionGapDeg![i] - 90)).toBeLessThan(8);
      // without the south camera the widest gap runs from west round to east through south: about 180°
      expect(r3.directionGapDeg![i]).toBeCloseTo(expected(x, y, four.slice(0, 3)), 3);
      expect(Math.abs(r3.directionGapDeg![i] - 180)).toBeLessThan(8);
      // views 35° ± a few degrees from the vertical: at 36° only those from cameras the cell lies away from count
      expect(r4near.directionGapDeg![i]).toBeCloseTo(expected(x, y, four, 36), 3);
      if (r4near.directionGapDeg![i] === 360) fewer++;
    }
    expect(n).toBeGreaterThan(4);
    expect(fewer).toBeGreaterThan(0);
    // not asked for, not worked out, and the file keeps its five bands
    expect(none.directionGapDeg).toBeUndefined();
    // Reference: gdalinfo -json and gdallocationinfo -valonly from GDAL 3.6.2 (Debian gdal-bin) read the sixth band
    // cell for cell as the raster holds it (to the digits it prints)
    const dir = mkdtempSync(join(tmpdir(), 'loftline-dirs-'));
    writeFileSync(join(dir, 'four.tif'), coverageGeoTiff(r4));
    writeFileSync(join(dir, 'none.tif'), coverageGeoTiff(none));
    const info = (f: string) => JSON.parse(execFileSync('gdalinfo', ['-json', join(dir, f)], { encoding: 'utf8' })) as { bands: Array<{ description: string }> };
    expect(info('none.tif').bands.length).toBe(5);
    const bands = info('four.tif').bands;
    expect(bands.length).toBe(6);
    expect(bands[5].description).toBe('widest gap between the directions of the oblique views, degrees');
    const { width } = r4.cells;
    for (let i = 0; i < r4.cells.inside.length; i++) {
      if (!r4.cells.inside[i]) continue;
      const v = Number(execFileSync('gdallocationinfo', ['-valonly', '-b', '6', join(dir, 'four.tif'), String(i % width), String(Math.floor(i / width))], { encoding: 'utf8' }).trim());
      expect(v).toBeCloseTo(r4.directionGapDeg![i], 4);
    }
  });
});

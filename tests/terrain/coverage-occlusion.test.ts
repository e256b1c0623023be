import { describe, expect, it } from 'vitest';
import { computeCoverage } from '../../terrain/coverage';
import type { Camera } from '../../terrain/camera';
import { syntheticSite } from './coverage-site';
import { cellX, cellY } from '../../terrain/coverage-grid';

const camera: Camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };

describe('terrain occlusion along viewing rays', () => {
  it('hides exactly the ground in the shadow of a cliff edge, as similar triangles give it', () => {
    const cliffM = 20;
    // plateau 20 m high west of x = 0, level ground at 0 east of it; 1 m pixels
    const site = syntheticSite(150, 1, (x) => (x < 0 ? cliffM : 0));
    // the plateau's edge: the easternmost pixel centre still on it (the grid's heights fall to 0 one pixel later)
    const k = site.frame.scale;
    const col = Math.floor((site.frame.originE - site.grid.transform[0]) / 1 - 0.5);
    let edgeX = -Infinity;
    for (let c = col - 3; c <= col + 3; c++) {
      const x = (site.grid.transform[0] + (c + 0.5) - site.frame.originE) / k;
      if (x < 0) edgeX = Math.max(edgeX, x);
    }
    const a = 30, Z = 100; // camera 30 m west of x = 0, 100 m above the level ground, looking straight down
    // Closed form: the ray from ground point (x, 0) up to the camera (−a, Z) passes the edge's x at height
    // Z·(x − edgeX)/(x + a); the point is hidden while that is below the cliff top, i.e. for x < xStar with
    // xStar = (cliff·a + Z·edgeX) / (Z − cliff). The cliff face itself (edgeX to edgeX + 1) faces away from the camera.
    const xStar = (cliffM * a + Z * edgeX) / (Z - cliffM);
    const raster = computeCoverage(site.grid, site.frame, site.area(-20, -15, 30, 15), camera, [{ xM: -a, yM: 0, altitudeM: Z, yawDeg: 0 }], { cellM: 0.5, specGsdCm: 10 });
    const { cells } = raster;
    let hidden = 0, seen = 0, checked = 0;
    for (let i = 0; i < cells.z.length; i++) {
      if (!cells.inside[i]) continue;
      const x = cellX(cells, i);
      // cells within a metre of the edge or the shadow's end are left out: the grid's bilinear slope and the
      // height lattice's resampling blur both by up to a pixel
      if (Math.abs(x - edgeX) < 1.5 || Math.abs(x - xStar) < 1) continue;
      checked++;
      const expectHidden = x > edgeX && x < xStar;
      expect(raster.views[i], `cell at x = ${x.toFixed(2)} m (shadow ends at ${xStar.toFixed(2)} m)`).toBe(expectHidden ? 0 : 1);
      if (expectHidden) hidden++; else seen++;
    }
    expect(checked).toBeGreaterThan(5000);
    expect(hidden).toBeGreaterThan(200); // the shadow is about 6 m wide: ~12 cells a row over 60 rows
    expect(seen).toBeGreaterThan(3000);
  });

  it('still hides ground behind a plateau when a strip of unknown heights covers the cliff face (no slope bound is taken across it)', () => {
    // plateau 40 m high west of the strip, level ground at 0 east of it; the heights from x = −1.5 to 1.5 m are
    // unknown (NaN, as in a grid's void), so every known pixel is level and only the march finds the shadow
    const cliffM = 40, a = 30, Z = 100;
    const site = syntheticSite(150, 1, (x) => (x < -1.5 ? cliffM : x <= 1.5 ? NaN : 0));
    const raster = computeCoverage(site.grid, site.frame, site.area(-20, -15, 30, 15), camera, [{ xM: -a, yM: 0, altitudeM: Z, yawDeg: 0 }], { cellM: 0.5, specGsdCm: 10 });
    // the plateau's known surface ends between x = −3.5 and −1.5 (a pixel of resampling beside the void), and an
    // edge at e casts the shadow to (cliff·a + Z·e) / (Z − cliff), as similar triangles give it (first test)
    const shadowAtLeast = (cliffM * a + Z * -3.5) / (Z - cliffM), shadowAtMost = (cliffM * a + Z * -1.5) / (Z - cliffM);
    let hidden = 0, seen = 0;
    for (let i = 0; i < raster.cells.z.length; i++) {
      if (!raster.cells.inside[i] || !(raster.cells.z[i] === raster.cells.z[i])) continue;
      const x = cellX(raster.cells, i);
      if (x > 4 && x < shadowAtLeast - 0.5) { expect(raster.views[i], `cell at x = ${x.toFixed(2)} m`).toBe(0); hidden++; }
      if (x > shadowAtMost + 1) { expect(raster.views[i], `cell at x = ${x.toFixed(2)} m`).toBe(1); seen++; }
    }
    expect(hidden).toBeGreaterThan(500);
    expect(seen).toBeGreaterThan(500);
  });

  it('sees the whole cliff shadow when occlusion is switched off (the shadow comes from the march, not from the view test)', () => {
    const site = syntheticSite(150, 1, (x) => (x < 0 ? 20 : 0));
    const raster = computeCoverage(site.grid, site.frame, site.area(2, -15, 5, 15), camera, [{ xM: -30, yM: 0, altitudeM: 100, yawDeg: 0 }], { cellM: 0.5, specGsdCm: 10, occlusion: false });
    let n = 0;
    for (let i = 0; i < raster.views.length; i++) if (raster.cells.inside[i]) { expect(raster.views[i]).toBe(1); n++; }
    expect(n).toBeGreaterThan(300);
  });
});

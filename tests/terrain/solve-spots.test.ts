import { describe, expect, it } from 'vitest';
import { computeCoverage, cellSlopesDeg } from '../../terrain/coverage';
import { coverageCells, cellX, cellY } from '../../terrain/coverage-grid';
import { resolveMission } from '../../terrain/mission';
import { viewGeometry } from '../../terrain/solve-geometry';
import { placeSpots, spotHeightM, tourGap, tourOrder } from '../../terrain/solve-spots';
import { localHeights } from '../../terrain/local-frame';
import { pixelPitchMm } from '../../terrain/camera';
import { syntheticSite } from './coverage-site';

// A 1-inch-type survey camera (13.2 x 8.8 mm, 8.8 mm lens, 5472 x 3648 px), as in the demo mission.
const camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };
const spec = { maxGsdCm: 2.5, minViews: 1, maxSigmaVerticalM: null, maxSigmaHorizontalM: null, maxDirectionGapDeg: null, obliqueDeg: 30 };
const DEG = Math.PI / 180;

function missionOn(site: ReturnType<typeof syntheticSite>) {
  const [lon, lat] = site.frame.toLonLat(-150, -150);
  return resolveMission({ area: site.area(-60, -60, 60, 60), camera, targetGsdCm: 2.5, takeoff: { lon, lat }, headingDeg: 0, clearanceM: 30, maxAglM: 120 });
}

describe('spot photos', () => {
  it('on a 55° plane, a spot at its height gives the hand GSD (R·p/f)/cos β along the slope, inside the spec', () => {
    // invented ground: a plane rising 55° to the east, 1 m pixels
    const beta = 55;
    const site = syntheticSite(200, 1, (x) => 300 + Math.tan(beta * DEG) * x);
    const mission = missionOn(site);
    const g = viewGeometry(camera, spec, null);
    const h = spotHeightM(g, mission, beta, 0.95);
    // H·cos β·0.95 with H the height whose nadir GSD on level ground is the spec's: 2.5 cm / (p/f)
    const pOverF = pixelPitchMm(camera) / camera.focalLengthMm;
    expect(h).toBeCloseTo((0.025 / pOverF) * Math.cos(beta * DEG) * 0.95, 6);
    // the photo straight above the cell nearest the centre, at h above the cell's own ground
    const cells = coverageCells(site.grid, site.frame, mission.area, 2);
    let k = -1, best = Infinity;
    for (let i = 0; i < cells.width * cells.height; i++) {
      if (!cells.inside[i]) continue;
      const d = Math.hypot(cellX(cells, i), cellY(cells, i));
      if (d < best) { best = d; k = i; }
    }
    const photo = { xM: cellX(cells, k), yM: cellY(cells, k), altitudeM: cells.z[k] + h, yawDeg: 0 };
    const raster = computeCoverage(site.grid, site.frame, mission.area, camera, [photo], { cellM: 2, specGsdCm: spec.maxGsdCm });
    // on the optical axis over a plane at incidence β: (R·p/f)/cos β (ground-plane GSD of oblique imagery, GSD over
    // the sine of the elevation angle; Leachtenauer et al., "General Image-Quality Equation: GIQE", Applied Optics
    // 36(32), 1997, from memory); the raster's ground normal is a central difference on its height lattice
    const hand = ((h * pOverF) / Math.cos(beta * DEG)) * 100;
    expect(raster.finestGsdCm[k] / hand).toBeGreaterThan(0.98);
    expect(raster.finestGsdCm[k] / hand).toBeLessThan(1.02);
    expect(raster.finestGsdCm[k]).toBeLessThanOrEqual(spec.maxGsdCm);
    // the slope the solver's reach test reads is the raster's own: 55° here
    const slopes = cellSlopesDeg(site.grid, site.frame, mission.area, 2);
    expect(slopes[k]).toBeCloseTo(beta, 0);
  });

  it('never plans a spot below the clearance or above the height limit, and lowers a spot that fell short by the GSD ratio', () => {
    const site = syntheticSite(200, 1, (x) => 300 + 0.5 * x);
    const mission = missionOn(site);
    const g = viewGeometry(camera, spec, null);
    expect(spotHeightM(g, mission, 80, 0.95)).toBe(30);
    expect(spotHeightM(g, { ...mission, maxAglM: 50 }, 0, 0.95)).toBe(50);
    const { heightAt } = localHeights(site.grid, site.frame);
    const short = [{ x: 10, y: 5, z: heightAt(10, 5), slopeDeg: 26.6, finestGsdCm: 3, item: 'gsd' as const }];
    const [first] = placeSpots(short, g, mission, 0.95, [], heightAt, 0);
    expect(first.heightM).toBeCloseTo(spotHeightM(g, mission, 26.6, 0.95), 9);
    // along the contour: the plane rises to the east, so the spot's line runs north-south
    expect(Math.min(Math.abs(first.headingDeg - 0), Math.abs(first.headingDeg - 180), Math.abs(first.headingDeg - 360))).toBeLessThan(1);
    // still 2.8 cm under it: lowered by 2.5/2.8 with a 2 % margin
    const [again] = placeSpots([{ ...short[0], finestGsdCm: 2.8 }], g, mission, 0.95, [first], heightAt, 0);
    expect(again.heightM).toBeCloseTo(first.heightM * (2.5 / 2.8) * 0.98, 6);
  });

  it('serves short cells on gentle ground with one spot as far as its photo meets the spec there, and the raster agrees', () => {
    // invented ground rising 6° to the east: a patch of short cells 40 m square
    const site = syntheticSite(200, 1, (x) => 300 + Math.tan(6 * DEG) * x);
    const mission = missionOn(site);
    const g = viewGeometry(camera, spec, null);
    const { heightAt } = localHeights(site.grid, site.frame);
    const cells = coverageCells(site.grid, site.frame, mission.area, 4);
    const short: Parameters<typeof placeSpots>[0] = [];
    for (let i = 0; i < cells.inside.length; i++) {
      const x = cellX(cells, i), y = cellY(cells, i);
      if (cells.inside[i] && Math.abs(x) <= 20 && Math.abs(y) <= 20) short.push({ x, y, z: cells.z[i], slopeDeg: 6, finestGsdCm: 3, item: 'gsd' });
    }
    expect(short.length).toBeGreaterThan(80);
    const spots = placeSpots(short, g, mission, 0.95, [], heightAt, 0);
    // a photo straight above at about 0.95 of the spec's height covers tens of metres of gentle ground: a few
    // spots, not one per 4.5 m
    expect(spots.length).toBeLessThanOrEqual(10);
    expect(spots.reduce((t, sp) => t + sp.cells, 0)).toBe(short.length);
    // the coverage raster of those photos alone (its own GSD formula, view-gsd.ts): every short cell within the spec
    const photos = spots.map((sp) => ({ xM: sp.x, yM: sp.y, altitudeM: sp.groundM + sp.heightM, yawDeg: sp.headingDeg }));
    const raster = computeCoverage(site.grid, site.frame, mission.area, camera, photos, { cellM: 4, specGsdCm: spec.maxGsdCm });
    for (let i = 0; i < cells.inside.length; i++) {
      if (!cells.inside[i] || Math.abs(cellX(cells, i)) > 20 || Math.abs(cellY(cells, i)) > 20) continue;
      expect(raster.finestGsdCm[i]).toBeLessThanOrEqual(spec.maxGsdCm);
    }
    // on a 55° face the same patch needs more spots: the spots fly lower (h ≤ H·cos β) and the slant changes the GSD fast
    const face = syntheticSite(200, 1, (x) => 300 + Math.tan(55 * DEG) * x);
    const faceHeight = localHeights(face.grid, face.frame).heightAt;
    const steep = short.map((c) => ({ ...c, z: faceHeight(c.x, c.y), slopeDeg: 55 }));
    expect(placeSpots(steep, g, missionOn(face), 0.95, [], faceHeight, 0).length).toBeGreaterThan(1.5 * spots.length);
  });

  it('orders a tour so no transit crosses a ridge inside the clearance when another order avoids it, and fits it in a clear gap', () => {
    // invented ground: level at 300 m with a 60 m wall along x = 0 between y = -100 and 100
    const site = syntheticSite(300, 2, (x, y) => 300 + (Math.abs(x) < 10 && Math.abs(y) < 100 ? 60 : 0));
    const mission = missionOn(site);
    const { heightAt } = localHeights(site.grid, site.frame);
    const spot = (x: number, y: number) => ({ x, y, groundM: 300, slopeDeg: 0, headingDeg: 0, heightM: 40, cells: 1 });
    // two spots either side of the wall, low (340 m, under the wall top plus clearance); one north of its end
    const west = spot(-40, 0), east = spot(40, 0), north = spot(0, 150);
    const from: [number, number, number] = [-40, -200, 400], to: [number, number, number] = [40, -200, 400];
    const order = tourOrder([east, west, north], from, to, mission, heightAt);
    // west first (nearest from the start without crossing the wall), then round its end by the north spot, then east
    expect(order.map((s) => s.x)).toEqual([-40, 0, 40]);
    // the first gap's ends lie east of the wall at 330 m: either way round, one transit crosses the wall inside the
    // clearance; the second gap's transits stay clear of it
    const gaps = [{ from: [40, -50, 330] as [number, number, number], to: [40, -60, 330] as [number, number, number] }, { from, to }];
    const { gap } = tourGap(order, gaps, mission, heightAt);
    expect(gap).toBe(1);
  });
});

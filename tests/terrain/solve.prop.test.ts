import { describe, expect, it } from 'vitest';
import { cellX, cellY } from '../../terrain/coverage-grid';
import fc from 'fast-check';
import { solvePlan, type SolvedPlan } from '../../terrain/solve';
import { resolveMission } from '../../terrain/mission';
import { resolveCoverageInput } from '../../terrain/coverage-spec';
import { computeCoverage } from '../../terrain/coverage';
import { coverageFrame, planPhotos } from '../../terrain/coverage-photos';
import { localHeights } from '../../terrain/local-frame';
import { pixelPitchMm } from '../../terrain/camera';
import { syntheticSite, type Site } from './coverage-site';

// A 1-inch-type survey camera (13.2 x 8.8 mm, 8.8 mm lens, 5472 x 3648 px), as in the demo mission.
const camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };

/** Steep synthetic ground from a seed: a ramp, two hills, a valley and a near-vertical 25–45 m step (a quarry face). */
const terrainArb = fc.record({
  ramp: fc.double({ min: -0.15, max: 0.15, noNaN: true }),
  hillM: fc.double({ min: 20, max: 70, noNaN: true }),
  hx: fc.integer({ min: -200, max: 200 }), hy: fc.integer({ min: -200, max: 200 }),
  faceM: fc.double({ min: 25, max: 45, noNaN: true }),
  faceX: fc.integer({ min: -150, max: 150 }),
  headingDeg: fc.constantFrom<'advise' | number>('advise', 0, 35),
});
type Terrain = typeof terrainArb extends fc.Arbitrary<infer T> ? T : never;

function siteFor(t: Terrain): Site {
  return syntheticSite(420, 4, (x, y) => 300 + t.ramp * y + t.hillM * Math.exp(-((x - t.hx) ** 2 + (y - t.hy) ** 2) / 120 ** 2)
    + 15 * Math.sin(x / 70) * Math.cos(y / 90) + (x > t.faceX ? t.faceM : 0) * Math.min(1, Math.max(0, (x - t.faceX) / 6)));
}

function missionFor(site: Site, t: Terrain, extra: Record<string, unknown> = {}) {
  const area = site.area(-230, -230, 230, 230);
  const [lon, lat] = site.frame.toLonLat(-260, -260);
  return {
    area, camera, targetGsdCm: 2.5, takeoff: { lon, lat }, headingDeg: t.headingDeg, mode: 'follow',
    clearanceM: 30, obstacleAllowanceM: 0, maxAglM: 120, speedMps: 8, climbMps: 3, descentMps: 2,
    envelope: { preset: 'multirotor' }, spec: { maxGsdCm: 2.75, minViews: 2 }, solve: { headingCandidates: 2, repairRounds: 3 },
    ...extra,
  };
}

const SEED = { seed: 20261202, numRuns: 3 };

describe('solver (properties, fixed seed)', () => {
  it('its coverage raster, recomputed independently, meets the spec on every cell it does not list as unreachable or short', () => {
    fc.assert(fc.property(terrainArb, (t) => {
      const site = siteFor(t);
      const input = missionFor(site, t);
      const r: SolvedPlan = solvePlan(site.grid, input);
      const mission = resolveMission(input);
      const { spec, envelope } = resolveCoverageInput(input, mission);
      const frame = coverageFrame(mission.area);
      const { photos } = planPhotos(r, frame, envelope);
      const raster = computeCoverage(site.grid, frame, mission.area, camera, photos, { cellM: r.proof.cellM, specGsdCm: spec.maxGsdCm, envelope });
      expect(raster.cells.insideCount).toBe(r.proof.cellsInArea);
      // unreachable cells, recomputed from the ground: slope (central differences of the grid's heights one grid
      // step either side of the cell) so steep that a photo straight above at the clearance is too coarse. The
      // raster's normal comes from its own height lattice, not the grid itself, so cells within 3 % of the limit
      // may fall either way
      const gsdPerM = (pixelPitchMm(camera) / camera.focalLengthMm) * 100;
      const { heightAt } = localHeights(site.grid, frame);
      let unreachable = 0, borderline = 0, failingClear = 0, failingBorder = 0;
      const { width, height, inside } = raster.cells;
      for (let row = 0; row < height; row++) for (let c = 0; c < width; c++) {
        const i = row * width + c;
        if (!inside[i]) continue;
        const x = cellX(raster.cells, i), y = cellY(raster.cells, i), d = 4;
        const gx = (heightAt(x + d, y) - heightAt(x - d, y)) / (2 * d), gy = (heightAt(x, y + d) - heightAt(x, y - d)) / (2 * d);
        const atClearance = (30 * gsdPerM) / Math.cos(Math.atan(Math.hypot(gx || 0, gy || 0)));
        const fails = !(raster.finestGsdCm[i] <= spec.maxGsdCm) || raster.views[i] < spec.minViews;
        if (atClearance > spec.maxGsdCm * 1.03) { unreachable++; continue; }
        if (atClearance >= spec.maxGsdCm * 0.97) { borderline++; if (fails) failingBorder++; continue; }
        if (fails) failingClear++;
      }
      expect(r.proof.reachableCells).toBeGreaterThanOrEqual(r.proof.cellsInArea - unreachable - borderline);
      expect(r.proof.reachableCells).toBeLessThanOrEqual(r.proof.cellsInArea - unreachable);
      // every clearly reachable cell the recomputed raster fails is counted short, and nothing else is
      expect(r.proof.shortCells).toBeGreaterThanOrEqual(failingClear);
      expect(r.proof.shortCells).toBeLessThanOrEqual(failingClear + failingBorder);
      // with spot photos the solved plan meets the spec on every reachable cell
      expect(r.proof.meets).toBe(true);
      expect(r.proof.shareReachableMeeting).toBe(1);
      expect(failingClear).toBe(0);
      // and never slower than a uniform plan it compared with that meets the spec
      for (const u of r.comparison.uniform) if (u.meets) expect(r.summary.flightTimeS).toBeLessThanOrEqual(u.flightTimeS + 0.05);
    }), SEED);
  }, 300_000);

  it('holds clearance and the climb/descent limits along every leg resampled at the grid resolution, independently of the stations', () => {
    fc.assert(fc.property(terrainArb, (t) => {
      const site = siteFor(t);
      const input = missionFor(site, t);
      const r = solvePlan(site.grid, input);
      const mission = resolveMission(input);
      const frame = coverageFrame(mission.area);
      const { heightAt } = localHeights(site.grid, frame);
      let slowLegs = 0;
      for (const line of r.lines) {
        for (const g of line.legs) {
          const v = g.speedMps ?? mission.speedMps;
          expect(v).toBeLessThanOrEqual(mission.speedMps + 1e-9);
          if (v < mission.speedMps - 1e-9) slowLegs++;
          const len = g.end.distanceM - g.start.distanceM;
          const dz = g.altitudeEndM - g.altitudeStartM;
          // vertical speed on the leg at its own ground speed, from its end points (rounded to the millimetre and 0.01 m/s)
          if (dz > 0) expect((dz / len) * v).toBeLessThanOrEqual(mission.climbMps * 1.01 + 1e-3);
          if (dz < 0) expect((-dz / len) * v).toBeLessThanOrEqual(mission.descentMps * 1.01 + 1e-3);
          const [x0, y0] = frame.toLocal(g.start.lon, g.start.lat), [x1, y1] = frame.toLocal(g.end.lon, g.end.lat);
          const n = Math.max(2, Math.ceil(len / 4) + 1); // the grid's 4 m pixels
          for (let k = 0; k < n; k++) {
            const f = k / (n - 1);
            const ground = heightAt(x0 + (x1 - x0) * f, y0 + (y1 - y0) * f);
            const alt = g.altitudeStartM + dz * f;
            // the fit floors each profile sample by the highest of its two neighbours: bilinear ground between
            // samples 4 m apart can rise a few centimetres above both on this ground, hence the 0.1 m slack
            expect(alt - ground).toBeGreaterThanOrEqual(mission.clearanceM + mission.obstacleAllowanceM - 0.1);
          }
        }
      }
      void slowLegs;
      // no transit to or from a spot photo comes inside the clearance (the tour is ordered and placed so)
      const spotNos = new Set(r.choices.lines.filter((c) => c.kind === 'spot').map((c) => c.line));
      for (const w of r.warnings.filter((x) => x.code === 'transit-clearance')) {
        const m = /^Line (\d+) to line (\d+)/.exec(w.message);
        if (m) expect(spotNos.has(Number(m[1])) || spotNos.has(Number(m[2])), w.message).toBe(false);
      }
    }), SEED);
  }, 300_000);

  it('never returns a plan slower than a uniform plan it compared with that meets the spec, and falls back to it', () => {
    // gentle ground (no face), where a uniform plan can meet the spec
    const t: Terrain = { ramp: 0.02, hillM: 10, hx: 0, hy: 0, faceM: 0, faceX: 100, headingDeg: 0 };
    const site = siteFor(t);
    // a side overlap floor of 80 % makes the solved layout dense; a uniform 60/60 follow plan meets the spec faster
    const input = missionFor(site, t, { solve: { minSideOverlap: 0.8, headingCandidates: 1, repairRounds: 1 }, spec: { maxGsdCm: 3.2, minViews: 2 } });
    const uniform = [{ forwardOverlap: 0.75, sideOverlap: 0.6, mode: 'follow' as const, headingDeg: 0 }];
    const r = solvePlan(site.grid, input, { uniform });
    const meeting = r.comparison.uniform.filter((u) => u.meets);
    expect(meeting.length).toBeGreaterThan(0);
    for (const u of meeting) expect(r.summary.flightTimeS).toBeLessThanOrEqual(u.flightTimeS + 0.05);
    expect(r.choices.fallback).toMatch(/uniform setting/);
    expect(r.proof.meets).toBe(true);
  }, 120_000);
});

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analysePlan } from '../../terrain/plan';
import { createGrid } from '../../terrain/grid';
import { heightForGsdM } from '../../terrain/gsd';
import { ONE_INCH, missionOver, utmGrid } from './plan-fixtures';

// Grids built with createGrid in WGS 84 / UTM 33N (EPSG:32633), 2 m pixels; heights on a 1/64 m lattice so
// that raising the float32 grid by whole metres is exact.
const q = (v: number) => Math.round(v * 64) / 64;
const flat = utmGrid({ width: 400, height: 400, pixelM: 2, f: () => 812.25 });
const rough = utmGrid({ width: 400, height: 400, pixelM: 2, f: (x, y) => q(500 + 50 * Math.sin(x / 90) * Math.cos(y / 130) + 25 * Math.sin((x - y) / 55) + 0.04 * y) });

const missionArb = fc.record({
  x0: fc.integer({ min: 150, max: 300 }), y0: fc.integer({ min: 150, max: 300 }),
  w: fc.integer({ min: 120, max: 350 }), h: fc.integer({ min: 120, max: 350 }),
  headingDeg: fc.integer({ min: 0, max: 359 }),
  targetGsdCm: fc.double({ min: 1.5, max: 3.2, noNaN: true }),
  forwardOverlap: fc.double({ min: 0.6, max: 0.85, noNaN: true }),
  sideOverlap: fc.double({ min: 0.5, max: 0.8, noNaN: true }),
  mode: fc.constantFrom('hold', 'steps', 'follow'),
  clearanceM: fc.integer({ min: 10, max: 50 }),
  climbMps: fc.double({ min: 0.5, max: 5, noNaN: true }),
  descentMps: fc.double({ min: 0.5, max: 5, noNaN: true }),
});

type MissionCase = typeof missionArb extends fc.Arbitrary<infer T> ? T : never;

const build = (grid: typeof flat, m: MissionCase, extra: Record<string, unknown> = {}) =>
  missionOver(grid, m.x0, m.y0, m.x0 + m.w, m.y0 + m.h, {
    headingDeg: m.headingDeg, targetGsdCm: m.targetGsdCm, forwardOverlap: m.forwardOverlap, sideOverlap: m.sideOverlap,
    mode: m.mode, clearanceM: m.clearanceM, climbMps: m.climbMps, descentMps: m.descentMps, ...extra,
  });

const RUNS = { numRuns: 12 };

describe('plan analysis (properties)', () => {
  it('equals the flat-ground formulas on a flat grid', () => {
    fc.assert(fc.property(missionArb, (m) => {
      const r = analysePlan(flat, build(flat, m, { altitudeRoundingM: 0 }));
      const H = heightForGsdM(ONE_INCH, m.targetGsdCm);
      for (const line of r.lines) {
        expect(line.legs).toHaveLength(1);
        line.stations.forEach((s, i) => {
          expect(s.aglM!).toBeCloseTo(Math.max(H, m.clearanceM), 2);
          if (H >= m.clearanceM) expect(s.gsdCm!).toBeCloseTo(m.targetGsdCm, 3);
          if (i > 0 && H >= m.clearanceM) expect(s.forwardOverlap!).toBeCloseTo(m.forwardOverlap, 3);
          if (s.sideOverlap !== null && H >= m.clearanceM) expect(s.sideOverlap).toBeCloseTo(m.sideOverlap, 3);
        });
      }
    }), RUNS);
  });

  it('raises every altitude by the constant the grid is raised by, and changes no GSD or overlap', () => {
    fc.assert(fc.property(missionArb, fc.integer({ min: -400, max: 3000 }), (m, dz) => {
      const up = createGrid({ ...rough, data: rough.data.map((v) => v + dz) });
      const a = analysePlan(rough, build(rough, m)), b = analysePlan(up, build(rough, m));
      a.lines.forEach((line, li) => line.stations.forEach((s, i) => {
        const t = b.lines[li].stations[i];
        expect(Math.abs(t.altitudeM - dz - s.altitudeM)).toBeLessThan(1e-2);
        expect(Math.abs(t.altitudeAboveTakeoffM - s.altitudeAboveTakeoffM)).toBeLessThan(1e-2);
        expect(Math.abs(t.gsdCm! - s.gsdCm!)).toBeLessThan(1e-3);
        expect(Math.abs((t.forwardOverlap ?? 0) - (s.forwardOverlap ?? 0))).toBeLessThan(1e-3);
        expect(Math.abs((t.sideOverlap ?? 0) - (s.sideOverlap ?? 0))).toBeLessThan(1e-3);
      }));
    }), { numRuns: 8 });
  });

  it('never cuts the clearance, never exceeds the gradients, keeps overlaps in [0, 1]', () => {
    fc.assert(fc.property(missionArb, fc.integer({ min: 0, max: 20 }), (m, obstacle) => {
      const r = analysePlan(rough, build(rough, m, { obstacleAllowanceM: obstacle }));
      const floor = m.clearanceM + obstacle;
      for (const line of r.lines) {
        for (const s of line.stations) {
          if (s.aglM !== null) expect(s.aglM).toBeGreaterThanOrEqual(floor - 1e-3);
          for (const v of [s.forwardOverlap, s.sideOverlap]) if (v !== null) { expect(v).toBeGreaterThanOrEqual(0); expect(v).toBeLessThanOrEqual(1); }
        }
        for (const leg of line.legs) {
          expect(leg.aglMinM).toBeGreaterThanOrEqual(floor - 1e-3);
          expect(leg.gradient).toBeLessThanOrEqual(m.climbMps / 10 + 1e-6);
          expect(leg.gradient).toBeGreaterThanOrEqual(-m.descentMps / 10 - 1e-6);
        }
      }
    }), RUNS);
  });
});

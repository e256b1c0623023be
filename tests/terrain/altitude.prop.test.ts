import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fitAltitudes, type AltitudeLimits, type AltitudeMode } from '../../terrain/altitude';

// Random ground along a line: a base height, a slope and a few bumps and steps, sampled every `step` metres.
const terrainArb = fc.record({
  n: fc.integer({ min: 2, max: 400 }),
  step: fc.double({ min: 0.5, max: 20, noNaN: true }),
  base: fc.double({ min: -50, max: 2000, noNaN: true }),
  slope: fc.double({ min: -0.4, max: 0.4, noNaN: true }),
  bumps: fc.array(fc.record({ at: fc.double({ min: 0, max: 1, noNaN: true }), height: fc.double({ min: -150, max: 150, noNaN: true }), width: fc.double({ min: 0.001, max: 0.5, noNaN: true }), step: fc.boolean() }), { maxLength: 5 }),
});

const limitsArb = fc.record({
  target: fc.double({ min: 20, max: 150, noNaN: true }),
  tol: fc.double({ min: 0, max: 0.3, noNaN: true }),
  clearance: fc.double({ min: 0, max: 60, noNaN: true }),
  maxAgl: fc.double({ min: 61, max: 200, noNaN: true }),
  climb: fc.double({ min: 0.02, max: 1, noNaN: true }),
  descent: fc.double({ min: 0.02, max: 1, noNaN: true }),
  minLeg: fc.double({ min: 0, max: 300, noNaN: true }),
  maxLegs: fc.integer({ min: 1, max: 30 }),
  rounding: fc.constantFrom(0, 0.5, 1, 5),
}).map((l): AltitudeLimits => ({
  targetHeightM: l.target, bandLowM: l.target * (1 - l.tol), bandHighM: l.target * (1 + l.tol), clearanceM: l.clearance, maxAglM: l.maxAgl,
  climbGradient: l.climb, descentGradient: l.descent, minLegLengthM: l.minLeg, maxLegsPerLine: l.maxLegs, roundingM: l.rounding,
}));

const modeArb = fc.constantFrom<AltitudeMode>('hold', 'steps', 'follow');

function build(t: { n: number; step: number; base: number; slope: number; bumps: Array<{ at: number; height: number; width: number; step: boolean }> }) {
  const x = new Float64Array(t.n), h = new Float64Array(t.n);
  const len = (t.n - 1) * t.step;
  for (let i = 0; i < t.n; i++) {
    x[i] = i * t.step;
    let v = t.base + t.slope * x[i];
    for (const b of t.bumps) {
      const u = (x[i] / Math.max(len, 1e-9) - b.at) / b.width;
      v += b.step ? (u > 0 ? b.height : 0) : b.height * Math.exp(-u * u);
    }
    h[i] = v;
  }
  return { x, h };
}

const RUNS = { numRuns: 300 };

describe('terrain-following altitudes (properties)', () => {
  it('never go below ground + clearance at any sample, in any mode', () => {
    fc.assert(fc.property(terrainArb, limitsArb, modeArb, (t, lim, mode) => {
      fc.pre(lim.clearanceM < lim.maxAglM);
      const { x, h } = build(t);
      const p = fitAltitudes(x, h, mode, lim);
      for (let i = 0; i < x.length; i++) expect(p.altitudeM[i] - h[i]).toBeGreaterThanOrEqual(lim.clearanceM - 1e-6);
    }), RUNS);
  });

  it('never climb or descend more steeply than the limits, and legs join end to end', () => {
    fc.assert(fc.property(terrainArb, limitsArb, modeArb, (t, lim, mode) => {
      const { x, h } = build(t);
      const p = fitAltitudes(x, h, mode, lim);
      expect(p.legs.length).toBeGreaterThanOrEqual(1);
      expect(p.legs.length).toBeLessThanOrEqual(lim.maxLegsPerLine);
      expect(p.legs[0].startM).toBe(x[0]);
      expect(p.legs[p.legs.length - 1].endM).toBe(x[x.length - 1]);
      p.legs.forEach((leg, k) => {
        expect(leg.endM).toBeGreaterThan(leg.startM);
        expect(leg.gradient).toBeLessThanOrEqual(lim.climbGradient + 1e-9);
        expect(leg.gradient).toBeGreaterThanOrEqual(-lim.descentGradient - 1e-9);
        expect((leg.altitudeEndM - leg.altitudeStartM) / (leg.endM - leg.startM)).toBeCloseTo(leg.gradient, 9);
        if (k > 0) {
          expect(leg.startM).toBe(p.legs[k - 1].endM);
          expect(leg.altitudeStartM).toBe(p.legs[k - 1].altitudeEndM);
        }
        if (mode === 'hold') expect(leg.gradient).toBe(0);
      });
    }), RUNS);
  });

  it('report every sample outside the GSD band or the height limit inside an unmet stretch', () => {
    fc.assert(fc.property(terrainArb, limitsArb, modeArb, (t, lim, mode) => {
      const { x, h } = build(t);
      const p = fitAltitudes(x, h, mode, lim);
      for (let i = 0; i < x.length; i++) {
        const agl = p.altitudeM[i] - h[i];
        const out = agl < lim.bandLowM - 1e-6 || agl > Math.min(lim.bandHighM, lim.maxAglM) + 1e-6;
        if (out) expect(p.unmet.some((u) => u.startM <= x[i] && x[i] <= u.endM), `sample ${i} at ${x[i]} m (AGL ${agl})`).toBe(true);
      }
      for (const u of p.unmet) expect(u.message.length).toBeGreaterThan(10);
    }), RUNS);
  });

  it('raise every altitude by the same constant when the ground is raised by it (rounding off)', () => {
    fc.assert(fc.property(terrainArb, limitsArb, modeArb, fc.integer({ min: -300, max: 3000 }), (t, lim0, mode, dz) => {
      const lim = { ...lim0, roundingM: 0 };
      const { x, h } = build(t);
      const up = h.map((v) => v + dz);
      const a = fitAltitudes(x, h, mode, lim);
      const b = fitAltitudes(x, up, mode, lim);
      // to 0.1 mm: at knife-edge ties (a slope equal to the limit to 1e-9) rounding noise may pick another
      // but equally good leg split, so the profiles are compared, not the leg lists
      for (let i = 0; i < x.length; i++) expect(Math.abs(b.altitudeM[i] - dz - a.altitudeM[i])).toBeLessThan(1e-4);
    }), { numRuns: Number(process.env.PROP_RUNS ?? 200) });
  });

  it('keep legs at least the minimum length, except a forced last leg in follow', () => {
    fc.assert(fc.property(terrainArb, limitsArb, fc.constantFrom<AltitudeMode>('steps', 'follow'), (t, lim, mode) => {
      const { x, h } = build(t);
      const p = fitAltitudes(x, h, mode, { ...lim, maxLegsPerLine: 200 });
      const total = x[x.length - 1] - x[0];
      p.legs.forEach((leg, k) => {
        const last = k === p.legs.length - 1;
        if (total >= lim.minLegLengthM && !(mode === 'follow' && last)) expect(leg.endM - leg.startM).toBeGreaterThanOrEqual(Math.min(lim.minLegLengthM, total) - 1e-6);
      });
    }), RUNS);
  });

  it('fly flat ground at exactly the target height in every mode (the flat-ground formula)', () => {
    fc.assert(fc.property(fc.double({ min: -100, max: 4000, noNaN: true }), limitsArb, modeArb, fc.integer({ min: 2, max: 300 }), (g, lim0, mode, n) => {
      const lim = { ...lim0, roundingM: 0 };
      fc.pre(lim.clearanceM <= lim.bandLowM && lim.bandHighM <= lim.maxAglM);
      const x = Float64Array.from({ length: n }, (_, i) => i * 7);
      const h = new Float64Array(n).fill(g);
      const p = fitAltitudes(x, h, mode, lim);
      expect(p.legs).toHaveLength(1);
      for (let i = 0; i < n; i++) expect(p.altitudeM[i] - g).toBeCloseTo(lim.targetHeightM, 6);
      expect(p.unmet).toEqual([]);
    }), RUNS);
  });
});

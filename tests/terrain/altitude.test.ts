import { describe, expect, it } from 'vitest';
import { fitAltitudes, safeProfile, type AltitudeLimits } from '../../terrain/altitude';
import { TerrainError } from '../../terrain/errors';

const LIM: AltitudeLimits = {
  targetHeightM: 80, bandLowM: 72, bandHighM: 88, clearanceM: 30, maxAglM: 120,
  climbGradient: 0.3, descentGradient: 0.2, minLegLengthM: 50, maxLegsPerLine: 20, roundingM: 0,
};

function profile(n: number, step: number, f: (x: number) => number) {
  const x = new Float64Array(n), h = new Float64Array(n);
  for (let i = 0; i < n; i++) { x[i] = i * step; h[i] = f(x[i]); }
  return { x, h };
}

describe('safeProfile (two-pass lowest gradient-limited profile)', () => {
  it('rises ahead of a spike at the climb limit and falls after it at the descent limit (values by hand)', () => {
    const { x } = profile(101, 10, () => 0);
    const floor = new Float64Array(101);
    floor[50] = 100; // at 500 m
    const { safe } = safeProfile(x, floor, 0.5, 0.25);
    expect(safe[50]).toBe(100);
    expect(safe[40]).toBeCloseTo(100 - 0.5 * 100, 12); // 50 m at 400 m
    expect(safe[30]).toBeCloseTo(0, 12); // the climb starts 200 m ahead
    expect(safe[20]).toBe(0);
    expect(safe[70]).toBeCloseTo(100 - 0.25 * 200, 12); // 50 m at 700 m
    expect(safe[90]).toBeCloseTo(0, 12);
    expect(safe[100]).toBe(0);
  });

  it('is the floor itself where the floor already respects the limits', () => {
    const { x, h } = profile(50, 5, (d) => 100 + 0.1 * d);
    expect([...safeProfile(x, h, 0.3, 0.2).safe]).toEqual([...h]);
  });
});

describe('fitAltitudes', () => {
  it('holds the target height over flat ground in every mode, one leg', () => {
    const { x, h } = profile(201, 5, () => 250);
    for (const mode of ['hold', 'steps', 'follow'] as const) {
      const p = fitAltitudes(x, h, mode, LIM);
      expect(p.legs).toHaveLength(1);
      expect(p.legs[0].altitudeStartM).toBeCloseTo(330, 9);
      expect(p.legs[0].altitudeEndM).toBeCloseTo(330, 9);
      expect(p.legs[0].gradient).toBe(0);
      expect(p.unmet).toEqual([]);
    }
  });

  it('follows a steady slope within the climb limit with one sloped leg (follow) and level legs with climbs (steps)', () => {
    const { x, h } = profile(401, 5, (d) => 100 + 0.1 * d);
    const f = fitAltitudes(x, h, 'follow', LIM);
    expect(f.legs).toHaveLength(1);
    expect(f.legs[0].gradient).toBeCloseTo(0.1, 9);
    expect(f.unmet).toEqual([]);
    const s = fitAltitudes(x, h, 'steps', LIM);
    expect(s.legs.length).toBeGreaterThan(2);
    for (const leg of s.legs) expect([0, 0.3]).toContainEqual(Math.round(leg.gradient * 1e9) / 1e9);
    const hold = fitAltitudes(x, h, 'hold', LIM);
    expect(hold.legs).toHaveLength(1);
    expect(hold.unmet.map((u) => u.reason)).toContain('hold');
  });

  it('flies at or above the target height where the limits allow (below it the overlaps would shrink)', () => {
    const { x, h } = profile(601, 5, (d) => 200 + 40 * Math.sin(d / 400) + 0.02 * d);
    const p = fitAltitudes(x, h, 'follow', LIM);
    expect(p.unmet).toEqual([]);
    for (let i = 0; i < x.length; i++) {
      expect(p.altitudeM[i] - h[i]).toBeGreaterThanOrEqual(LIM.targetHeightM - 1e-6);
      expect(p.altitudeM[i] - h[i]).toBeLessThanOrEqual(LIM.bandHighM + 1e-6);
    }
  });

  it('reports a cliff steeper than the climb limit as a climb-limit stretch before it, never cutting the clearance', () => {
    const { x, h } = profile(401, 5, (d) => (d < 1000 ? 100 : 160));
    const p = fitAltitudes(x, h, 'follow', LIM);
    const climb = p.unmet.find((u) => u.reason === 'climb-limit');
    expect(climb).toBeDefined();
    expect(climb!.endM).toBeLessThanOrEqual(1000);
    expect(climb!.startM).toBeGreaterThan(700); // starts about (60 - 16) / 0.3 m ahead of the cliff
    expect(climb!.message).toMatch(/climb limit \(gradient 0\.300\)/);
    for (let i = 0; i < x.length; i++) expect(p.altitudeM[i] - h[i]).toBeGreaterThanOrEqual(30 - 1e-9);
    for (const leg of p.legs) expect(leg.gradient).toBeLessThanOrEqual(0.3 + 1e-9);
  });

  it('reports a drop steeper than the descent limit as a descent-limit stretch after it', () => {
    const { x, h } = profile(401, 5, (d) => (d < 1000 ? 160 : 100));
    const p = fitAltitudes(x, h, 'follow', LIM);
    const down = p.unmet.find((u) => u.reason === 'descent-limit');
    expect(down).toBeDefined();
    expect(down!.startM).toBeGreaterThanOrEqual(1000);
    for (const leg of p.legs) expect(leg.gradient).toBeGreaterThanOrEqual(-0.2 - 1e-9);
  });

  it('says when the clearance needs more height than the band, or the band more than the height limit', () => {
    const { x, h } = profile(101, 10, () => 0);
    const high = fitAltitudes(x, h, 'follow', { ...LIM, clearanceM: 100 });
    expect(high.unmet.map((u) => u.reason)).toEqual(['clearance-above-band']);
    expect(high.legs[0].aglMinM).toBeCloseTo(100, 9);
    const capped = fitAltitudes(x, h, 'follow', { ...LIM, targetHeightM: 150, bandLowM: 135, bandHighM: 165 });
    expect(capped.unmet.map((u) => u.reason)).toEqual(['band-above-max-agl']);
    expect(capped.legs[0].aglMaxM).toBeCloseTo(120, 5); // flies at the limit
  });

  it('reports a valley too narrow to descend into as above the height limit', () => {
    // 200 m deep, 100 m wide valley: at a descent gradient of 0.2 the aircraft cannot follow it
    const { x, h } = profile(401, 5, (d) => (Math.abs(d - 1000) < 50 ? 0 : 200));
    const p = fitAltitudes(x, h, 'follow', LIM);
    expect(p.unmet.map((u) => u.reason)).toContain('above-max-agl');
  });

  it('says when the mode, not the limits, puts the aircraft above the height limit (hold over a wide valley)', () => {
    const { x, h } = profile(401, 5, (d) => (Math.abs(d - 1000) < 400 ? 100 : 200));
    const p = fitAltitudes(x, h, 'hold', LIM);
    const cap = p.unmet.filter((u) => u.reason === 'above-max-agl');
    // over most of the valley the single altitude is the cause; just inside the rims the descent limit is
    expect(cap.some((u) => /because of one altitude for the whole line/.test(u.message) && u.endM - u.startM > 500)).toBe(true);
    expect(cap.some((u) => /clearance and the climb\/descent limits leave no lower way/.test(u.message))).toBe(true);
    // following the ground, only the rims remain, where the descent limit forces it
    const follow = fitAltitudes(x, h, 'follow', LIM).unmet.filter((u) => u.reason === 'above-max-agl');
    for (const u of follow) {
      expect(u.message).toMatch(/leave no lower way/);
      expect(u.endM - u.startM).toBeLessThan(60);
    }
  });

  it('carries the higher known neighbour over nodata and reports the stretch', () => {
    const { x, h } = profile(101, 10, (d) => 100 + d * 0.05);
    for (let i = 40; i < 50; i++) h[i] = NaN;
    const p = fitAltitudes(x, h, 'follow', LIM);
    expect(p.unknownCount).toBe(10);
    expect(p.groundM[45]).toBeCloseTo(100 + 500 * 0.05, 9); // the next known sample, the higher one
    const u = p.unmet.find((s) => s.reason === 'ground-unknown')!;
    expect([u.startM, u.endM]).toEqual([400, 490]);
    const none = fitAltitudes(x, new Float64Array(101).fill(NaN), 'follow', LIM);
    expect(none.legs).toEqual([]);
    expect(none.unmet[0].reason).toBe('ground-unknown');
  });

  it('rounds altitudes up to the rounding step', () => {
    const { x, h } = profile(301, 5, (d) => 123.4 + 30 * Math.sin(d / 200));
    for (const mode of ['hold', 'steps', 'follow'] as const) {
      const p = fitAltitudes(x, h, mode, { ...LIM, roundingM: 5 });
      for (const leg of p.legs) {
        expect(leg.altitudeStartM / 5).toBeCloseTo(Math.round(leg.altitudeStartM / 5), 9);
        expect(leg.altitudeEndM / 5).toBeCloseTo(Math.round(leg.altitudeEndM / 5), 9);
      }
    }
  });

  it('keeps to the maximum legs per line, reporting what that costs', () => {
    const { x, h } = profile(801, 5, (d) => 100 + 25 * Math.sin(d / 90));
    const free = fitAltitudes(x, h, 'follow', LIM);
    expect(free.legs.length).toBeGreaterThan(4);
    const few = fitAltitudes(x, h, 'follow', { ...LIM, maxLegsPerLine: 4 });
    expect(few.legs.length).toBeLessThanOrEqual(4);
    expect(few.unmet.map((u) => u.reason)).toContain('leg-limits');
    const steps = fitAltitudes(x, h, 'steps', { ...LIM, maxLegsPerLine: 3 });
    expect(steps.legs.length).toBeLessThanOrEqual(3);
  });

  it('throws invalid-input on bad limits or samples', () => {
    const { x, h } = profile(10, 5, () => 0);
    expect(() => fitAltitudes(x, h, 'follow', { ...LIM, clearanceM: 130 })).toThrow(TerrainError);
    expect(() => fitAltitudes(x, h, 'follow', { ...LIM, climbGradient: 0 })).toThrow(/climbGradient/);
    expect(() => fitAltitudes(x, h, 'glide' as never, LIM)).toThrow(/mode/);
    expect(() => fitAltitudes(Float64Array.from([0, 5, 5]), Float64Array.from([0, 0, 0]), 'hold', LIM)).toThrow(/increase/);
  });

  it('does not mutate its inputs', () => {
    const { x, h } = profile(50, 5, (d) => (d > 100 && d < 120 ? NaN : d));
    const x0 = [...x], h0 = [...h];
    fitAltitudes(x, h, 'steps', LIM);
    expect([...x]).toEqual(x0);
    expect([...h]).toEqual(h0);
  });
});

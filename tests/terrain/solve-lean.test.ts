import { describe, expect, it } from 'vitest';
import { solvePlan } from '../../terrain/solve';
import { analysePlan } from '../../terrain/plan';
import { resolveMission } from '../../terrain/mission';
import { resolveCoverageInput } from '../../terrain/coverage-spec';
import { makeVerifier } from '../../terrain/solve-verify';
import { bandLadder, bestUniform } from '../../terrain/solve-uniform';
import { viewGeometry } from '../../terrain/solve-geometry';
import { syntheticSite } from './coverage-site';

// The solver analyses its candidate layouts and yardstick plans without overlaps (no choice reads them; only the
// returned plan carries them), and stops a yardstick's raster at its first short cell (only whether it meets the
// spec decides). These checks hold those shortcuts to the full analysis on fixed small cases.

// A 1-inch-type survey camera (13.2 x 8.8 mm, 8.8 mm lens, 5472 x 3648 px), as in the demo mission.
const camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };

/** Invented ground: a ramp, a hill and a 30 m step (a quarry face) east of x = 60 m. */
const site = syntheticSite(420, 4, (x, y) => 300 + 0.08 * y + 40 * Math.exp(-((x + 80) ** 2 + (y - 60) ** 2) / 120 ** 2)
  + 12 * Math.sin(x / 70) * Math.cos(y / 90) + 30 * Math.min(1, Math.max(0, (x - 60) / 6)));

/** A solved plan with the yardsticks' shares left out (the fast solve leaves them null where their raster stopped early). */
const withoutShares = (r: ReturnType<typeof solvePlan>) => ({ ...r, comparison: { ...r.comparison, uniform: r.comparison.uniform.map((u) => ({ ...u, shareReachable: null })) } });

function mission(extra: Record<string, unknown> = {}) {
  const [lon, lat] = site.frame.toLonLat(-260, -260);
  return {
    area: site.area(-200, -200, 200, 200), camera, targetGsdCm: 2.5, takeoff: { lon, lat }, headingDeg: 'advise', mode: 'follow',
    clearanceM: 30, maxAglM: 120, speedMps: 8, climbMps: 3, descentMps: 2, spec: { maxGsdCm: 2.75, minViews: 2 },
    envelope: { preset: 'multirotor' }, solve: { headingCandidates: 2, repairRounds: 2 }, ...extra,
  };
}

describe('solver candidates analysed without overlaps', () => {
  it('an analysis without overlaps has the same lines, stations, legs, GSDs and flight time, and no overlap figure', () => {
    const input = mission({ headingDeg: 20, forwardOverlap: 0.75, sideOverlap: 0.65 });
    const full = analysePlan(site.grid, input);
    const lean = analysePlan(site.grid, input, { overlaps: false });
    const noOverlaps = (p: typeof full) => p.lines.map((l) => ({
      ...l,
      stations: l.stations.map((s) => ({ ...s, forwardOverlap: null, sideOverlap: null, forwardOverlapGuaranteed: null, sideOverlapGuaranteed: null, flags: s.flags.filter((f) => !/overlap|footprint/.test(f.code)) })),
    }));
    expect(noOverlaps(lean)).toEqual(noOverlaps(full));
    expect(lean.summary.flightTimeS).toBe(full.summary.flightTimeS);
    expect(lean.summary.photoCount).toBe(full.summary.photoCount);
    expect(lean.summary.gsdCm).toEqual(full.summary.gsdCm);
    // the full analysis does give overlaps here (as planned and under the envelope), the lean one none
    expect(full.summary.forwardOverlapMin).not.toBeNull();
    expect(full.summary.sideOverlapGuaranteedMin).not.toBeNull();
    expect(lean.summary.forwardOverlapMin).toBeNull();
    expect(lean.lines.flatMap((l) => l.stations).every((s) => s.forwardOverlap === null && s.sideOverlapGuaranteed === null)).toBe(true);
  }, 120_000);

  it('chooses the same plan, with the same figures, as when every candidate is analysed in full', () => {
    const input = mission();
    const fast = solvePlan(site.grid, input);
    const full = solvePlan(site.grid, input, { candidatesInFull: true });
    // several candidates were really compared (two headings, repair rounds or yardsticks)
    expect(fast.comparison.uniform.length).toBeGreaterThanOrEqual(3);
    expect(withoutShares(fast)).toEqual(withoutShares(full));
    // every yardstick has the same verdict; a share is left out only where the yardstick falls short
    fast.comparison.uniform.forEach((u, k) => {
      expect(u.meets).toBe(full.comparison.uniform[k].meets);
      if (u.shareReachable === null) expect(u.meets).toBe(false);
      else expect(u.shareReachable).toBe(full.comparison.uniform[k].shareReachable);
    });
    expect(fast.comparison.uniform.some((u) => u.shareReachable === null)).toBe(true);
    // the returned plan carries its overlaps, as planned and guaranteed under the envelope
    const stations = fast.lines.flatMap((l) => l.stations);
    expect(stations.some((s) => s.forwardOverlap !== null && s.forwardOverlapGuaranteed !== null)).toBe(true);
    expect(stations.some((s) => s.sideOverlap !== null && s.sideOverlapGuaranteed !== null)).toBe(true);
    expect(fast.summary.overlapEnvelope?.attitudeCount).toBeGreaterThan(0);
  }, 300_000);

  it('returns a uniform fallback with its overlaps, as the full analysis gives it', () => {
    // gentle ground and a dense side overlap floor: a uniform 60/60 follow plan meets the spec faster (as in solve.prop.test.ts)
    const gentle = syntheticSite(420, 4, (x, y) => 300 + 0.02 * y + 10 * Math.exp(-(x ** 2 + y ** 2) / 120 ** 2) + 15 * Math.sin(x / 70) * Math.cos(y / 90));
    const [lon, lat] = gentle.frame.toLonLat(-260, -260);
    const input = {
      ...mission(), area: gentle.area(-230, -230, 230, 230), takeoff: { lon, lat }, headingDeg: 0,
      solve: { minSideOverlap: 0.8, headingCandidates: 1, repairRounds: 1 }, spec: { maxGsdCm: 3.2, minViews: 2 },
    };
    const uniform = [{ forwardOverlap: 0.75, sideOverlap: 0.6, mode: 'follow' as const, headingDeg: 0 }];
    const fast = solvePlan(gentle.grid, input, { uniform });
    expect(fast.choices.fallback).toMatch(/uniform setting/);
    const full = solvePlan(gentle.grid, input, { uniform, candidatesInFull: true });
    expect(withoutShares(fast)).toEqual(withoutShares(full));
    // the yardstick returned was checked in full: its share is known
    expect(fast.comparison.uniform.find((u) => u.meets)?.shareReachable).toBe(1);
    expect(fast.summary.sideOverlapGuaranteedMin).not.toBeNull();
  }, 300_000);

  it('a raster stopped at the first short cell answers whether a plan meets the spec as the whole raster does', () => {
    const input = mission({ headingDeg: 0 });
    const m = resolveMission(input);
    const { spec, envelope, settings } = resolveCoverageInput(input, m);
    const verifier = makeVerifier(site.grid, m, spec, envelope, settings, viewGeometry(m.camera, spec, envelope).gsdPerM);
    let short = 0, meeting = 0;
    // sparse to dense: the sparse plans fall short, the dense one at a low height meets the spec (rasters checked in full alike)
    for (const [forwardOverlap, sideOverlap, targetGsdCm] of [[0.6, 0.6, 2.5], [0.8, 0.7, 2.5], [0.9, 0.85, 1.8]]) {
      const plan = analysePlan(site.grid, { ...input, forwardOverlap, sideOverlap, targetGsdCm }, { overlaps: false });
      const whole = verifier.check(plan);
      const quick = verifier.verdictIfMeets(plan);
      if (whole.meets) { meeting++; expect(quick).toEqual(whole); } else { short++; expect(quick).toBeNull(); }
    }
    expect(short).toBeGreaterThan(0);
    expect(meeting).toBeGreaterThan(0);
  }, 300_000);

  it('a sweep whose rasters stop at their first short cell finds the same best uniform setting as whole rasters, down a ladder of GSD bands', () => {
    const input = mission({ headingDeg: 0, gsdTolerance: 0.1 });
    const m = resolveMission(input);
    const { spec, envelope, settings } = resolveCoverageInput(input, m);
    const verifier = makeVerifier(site.grid, m, spec, envelope, settings, viewGeometry(m.camera, spec, envelope).gsdPerM);
    const base = [{ forwardOverlap: 0.7, sideOverlap: 0.6, mode: 'follow' as const, headingDeg: 0 }, { forwardOverlap: 0.9, sideOverlap: 0.85, mode: 'follow' as const, headingDeg: 0 }];
    const ladder = bandLadder(base, spec.maxGsdCm, m.gsdTolerance, [0.85, 0.7]);
    // each setting's band top is the share of the spec's GSD it names (target · (1 + tolerance))
    expect(ladder.map((s) => +(s.targetGsdCm! * 1.1).toFixed(9))).toEqual([2.3375, 2.3375, 1.925, 1.925]);
    const settingsAll = [...base, ...ladder];
    const whole = bestUniform(site.grid, input, settingsAll, verifier, { overlaps: false });
    const quick = bestUniform(site.grid, input, settingsAll, verifier, { overlaps: false }, { untilShort: true });
    // lean: no plan kept but the best one's, which is the plan the whole sweep kept
    const lean = bestUniform(site.grid, input, settingsAll, verifier, { overlaps: false }, { untilShort: true, lean: true });
    expect(lean.best?.setting).toEqual(whole.best!.setting);
    expect(lean.best?.plan).toEqual(whole.best!.plan);
    expect(lean.outcomes.filter((o) => o.plan !== null)).toEqual([lean.best]);
    // some setting meets the spec here, and not the fastest: the search passed settings that fall short first
    expect(whole.best).not.toBeNull();
    expect(whole.checked).toBeGreaterThan(1);
    // only a setting flown lower meets it: at the mission's own band both fall short
    expect(whole.best!.setting.targetGsdCm).toBeDefined();
    expect(quick.best?.setting).toEqual(whole.best!.setting);
    expect(quick.best?.shareReachable).toBe(1);
    expect(quick.checked).toBe(whole.checked);
    // the settings passed over have no share when their raster stopped early, and none is said to meet
    for (const o of quick.outcomes) if (o !== quick.best && o.meets !== null) { expect(o.meets).toBe(false); expect(o.shareReachable).toBeNull(); }
  }, 300_000);
});

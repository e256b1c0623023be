/** Uniform plans (one overlap pair, one altitude mode, one heading for the whole area) as the solver's yardstick: the sweep and each setting's verdict. */
import type { Grid } from './grid';
import type { AltitudeMode } from './altitude';
import { analysePlan, type AnalyseOptions } from './plan';
import type { PlanResult } from './plan-result';
import type { Verifier } from './solve-verify';

/** One uniform setting. */
export interface UniformSetting {
  forwardOverlap: number;
  sideOverlap: number;
  mode: AltitudeMode;
  headingDeg: number;
}

/** A uniform setting's plan and how it fares against the spec. */
export interface UniformOutcome {
  setting: UniformSetting;
  flightTimeS: number;
  lineCount: number;
  photoCount: number;
  /** Share of the reachable cells meeting every spec item (null when not checked: a faster setting already met it, or the check stopped at the first short cell). */
  shareReachable: number | null;
  meets: boolean | null;
  plan: PlanResult;
}

/** Forward and side overlaps 60–90 % in 5 % steps, the three altitude modes, one heading. */
export function uniformSweep(headingDeg: number): UniformSetting[] {
  const out: UniformSetting[] = [];
  for (const mode of ['hold', 'steps', 'follow'] as AltitudeMode[]) {
    for (let s = 60; s <= 90; s += 5) for (let f = 60; f <= 90; f += 5) out.push({ forwardOverlap: f / 100, sideOverlap: s / 100, mode, headingDeg });
  }
  return out;
}

/**
 * Analyse every setting, then check them fastest first until one meets the spec on every reachable cell (the
 * best uniform plan: no faster setting meets it). `maxChecks` bounds the rasters computed. `opts.overlaps: false`
 * analyses without overlaps (flight time, photos and raster are the same; the verdict never reads them).
 */
export function bestUniform(grid: Grid, input: Record<string, unknown>, settings: UniformSetting[], verifier: Verifier, opts: AnalyseOptions = {}, maxChecks = Infinity): { outcomes: UniformOutcome[]; best: UniformOutcome | null; checked: number } {
  const outcomes: UniformOutcome[] = settings.map((setting) => {
    const plan = analysePlan(grid, { ...input, ...setting }, { verticalDatum: opts.verticalDatum, overlaps: opts.overlaps });
    return { setting, flightTimeS: plan.summary.flightTimeS, lineCount: plan.summary.lineCount, photoCount: plan.summary.photoCount, shareReachable: null, meets: null, plan };
  });
  const order = outcomes.map((_, i) => i).sort((a, b) => outcomes[a].flightTimeS - outcomes[b].flightTimeS || outcomes[b].setting.forwardOverlap - outcomes[a].setting.forwardOverlap);
  let best: UniformOutcome | null = null;
  let checked = 0;
  for (const i of order) {
    if (checked >= maxChecks) break;
    const o = outcomes[i];
    const v = verifier.check(o.plan);
    checked++;
    o.shareReachable = v.compliance.shareAll;
    o.meets = v.meets;
    if (v.meets) { best = o; break; }
  }
  return { outcomes, best, checked };
}

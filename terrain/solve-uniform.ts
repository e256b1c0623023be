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
  /** The middle of the GSD band flown (cm; the band's width the mission's tolerance); absent: the mission's own target. */
  targetGsdCm?: number;
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
  /** The analysed plan (null in a lean sweep, except for the best setting's). */
  plan: PlanResult | null;
}

/** How many cells settings fell short at are kept to be visited first by the next setting's raster. */
const SHORT_KEPT = 32;

/** Forward and side overlaps 60–90 % in 5 % steps, the three altitude modes, one heading. */
export function uniformSweep(headingDeg: number): UniformSetting[] {
  const out: UniformSetting[] = [];
  for (const mode of ['hold', 'steps', 'follow'] as AltitudeMode[]) {
    for (let s = 60; s <= 90; s += 5) for (let f = 60; f <= 90; f += 5) out.push({ forwardOverlap: f / 100, sideOverlap: s / 100, mode, headingDeg });
  }
  return out;
}

/**
 * The same settings flown lower: for each share in `tops`, each setting with its GSD band topped at that share of
 * the spec's coarsest GSD (target = spec · share / (1 + tolerance)). A planner who flies a uniform plan chooses its
 * height as well as its overlaps; over hilly ground the band at the mission's own target leaves coarse GSD where the
 * ground falls away from the lines, and a lower band is the uniform answer to that.
 */
export function bandLadder(settings: UniformSetting[], specGsdCm: number, tolerance: number, tops: number[]): UniformSetting[] {
  return tops.flatMap((top) => settings.map((s) => ({ ...s, targetGsdCm: (specGsdCm * top) / (1 + tolerance) })));
}

/**
 * Analyse every setting, then check them fastest first until one meets the spec on every reachable cell (the
 * best uniform plan: no faster setting meets it). `sweep.maxChecks` bounds the rasters computed. `opts.overlaps: false`
 * analyses without overlaps (flight time, photos and raster are the same; the verdict never reads them).
 * `sweep.untilShort` stops each setting's raster at its first short cell (`verdictIfMeets`): the same best setting, found
 * sooner, but no share for the settings that fall short (null). `sweep.lean` keeps no plan but the best one's, analysing
 * each setting again when it is checked: a sweep of hundreds of dense plans would not fit in memory.
 */
export function bestUniform(grid: Grid, input: Record<string, unknown>, settings: UniformSetting[], verifier: Verifier, opts: AnalyseOptions = {}, sweep: { maxChecks?: number; untilShort?: boolean; lean?: boolean } = {}): { outcomes: UniformOutcome[]; best: UniformOutcome | null; checked: number } {
  const { maxChecks = Infinity, untilShort = false, lean = false } = sweep;
  const analyse = (setting: UniformSetting) => analysePlan(grid, { ...input, ...setting }, { verticalDatum: opts.verticalDatum, overlaps: opts.overlaps });
  const outcomes: UniformOutcome[] = settings.map((setting) => {
    const plan = analyse(setting);
    return { setting, flightTimeS: plan.summary.flightTimeS, lineCount: plan.summary.lineCount, photoCount: plan.summary.photoCount, shareReachable: null, meets: null, plan: lean ? null : plan };
  });
  const order = outcomes.map((_, i) => i).sort((a, b) => outcomes[a].flightTimeS - outcomes[b].flightTimeS || outcomes[b].setting.forwardOverlap - outcomes[a].setting.forwardOverlap);
  let best: UniformOutcome | null = null;
  let checked = 0;
  // the cells earlier settings fell short at, latest first: uniform settings tend to fall short at the same ground
  // (a pit the lines cannot come down to), so a raster visiting them first stops in a tile or two
  const shortAt: number[] = [];
  const short = { cell: -1 };
  for (const i of order) {
    if (checked >= maxChecks) break;
    const o = outcomes[i];
    short.cell = -1;
    // (lean: analysed again, the same plan: the analysis is a pure function of the grid and the input)
    const plan = o.plan ?? analyse(o.setting);
    const v = untilShort ? verifier.verdictIfMeets(plan, shortAt, short) : verifier.check(plan);
    if (short.cell >= 0) {
      const at = shortAt.indexOf(short.cell);
      if (at >= 0) shortAt.splice(at, 1);
      shortAt.unshift(short.cell);
      if (shortAt.length > SHORT_KEPT) shortAt.pop();
    }
    checked++;
    o.shareReachable = v ? v.compliance.shareAll : null;
    o.meets = v ? v.meets : false;
    if (o.meets) { o.plan = plan; best = o; break; }
  }
  return { outcomes, best, checked };
}

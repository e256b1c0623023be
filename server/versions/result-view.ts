/**
 * A version's stored analysis result and mission as reports, leg sheets, mission items and exports read them,
 * checked once at this boundary against the one schema of the result (contracts/plan-result.ts, the same schema
 * the analysis checks before it stores a result), with the lines in flying order.
 */
import { planResultSchema, type PlanResultData } from '../../contracts/plan-result';
import { resolveMission, type Mission } from '../../terrain/mission';
import { versionErrors } from './versions.errors';

export type ResultView = PlanResultData;
export type LineView = ResultView['lines'][number];
export type StationView = LineView['stations'][number];
export type LegView = LineView['legs'][number];

/** A stored result as this view reads it; a result that does not fit is a server-side problem (500 with the reason logged). */
export function readResult(result: unknown): ResultView {
  const r = planResultSchema.safeParse(result);
  if (!r.success) throw new Error(`Stored analysis result does not fit the result schema: ${r.error.message}`);
  // Flying order is the line index (0 first).
  return { ...r.data, lines: [...r.data.lines].sort((a, b) => a.index - b.index) };
}

/** The mission of a version: the stored input with the engine's defaults applied (the input may wrap it as `mission`). */
export function readMission(input: unknown): Mission {
  const candidates = [input, (input as { mission?: unknown } | null)?.mission];
  let last: unknown;
  for (const c of candidates) {
    if (c === undefined || c === null) continue;
    try {
      return resolveMission(c);
    } catch (err) {
      last = err;
    }
  }
  throw new Error(`Stored plan input is not a mission: ${last instanceof Error ? last.message : String(last)}`);
}

/** Warning codes of the engine that the shared flight cautions already cover (contracts/cautions.ts words them once). */
const coveredByCautions = new Set(['bare-earth', 'local-rules', 'wind']);

/** The engine's plan-wide warnings that add something to the cautions (e.g. distances, flagged stations). */
export function planWarnings(view: ResultView): string[] {
  return view.warnings.filter((w) => !coveredByCautions.has(w.code)).map((w) => w.message);
}

/** Ground height of the takeoff point above the datum, as the engine sampled it. */
export function takeoffGroundM(view: ResultView): number {
  return view.takeoff.groundM;
}

/**
 * The vertical datum every height of a version is above: the one its stored analysis names (the site's datum,
 * passed to the analysis), else the site's as stated (a grid whose datum has no EPSG entry).
 */
export function heightDatumOf(v: { result: unknown; siteVerticalDatum: string }): string {
  const named = (v.result as { heights?: { verticalDatum?: { name?: unknown } | null } } | null)?.heights?.verticalDatum?.name;
  return typeof named === 'string' && named.trim() !== '' ? named : v.siteVerticalDatum;
}

/** A version can be reported on only once its analysis is done. */
export function requireAnalysed(v: { analysisState: string; result: unknown; number: number }): void {
  if (v.analysisState !== 'done' || v.result === null || v.result === undefined) {
    throw versionErrors.analysis_not_done(`Version ${v.number} has no finished analysis yet (it is ${v.analysisState}).`);
  }
}

/** The distinct camera tilts of a plan's tilted lines (oblique capture), ascending; empty when every photo looks straight down. */
export function cameraTiltsOf(view: ResultView): number[] {
  return [...new Set(view.lines.map((l) => l.cameraTiltDeg ?? 0).filter((t) => t > 0))].sort((a, b) => a - b);
}

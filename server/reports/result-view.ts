/**
 * The parts of a stored analysis result and mission that reports, leg sheets and exports read, checked once at this
 * boundary. The result follows the terrain engine's plan output (lines -> stations and legs, summary, warnings);
 * fields this view does not name pass through untouched.
 */
import { z } from 'zod';
import { resolveMission, type Mission } from '../../terrain/mission';
import { AppError } from '../http/errors';

const n = z.number();
const nn = z.number().nullable();
const point = z.object({ lon: n, lat: n, distanceM: n });
const flag = z.union([z.string(), z.object({ code: z.string(), reason: z.string().optional() }).passthrough()]);
const note = z.union([z.string(), z.object({ message: z.string() }).passthrough()]);

export const stationViewSchema = z
  .object({
    lon: n,
    lat: n,
    distanceM: n,
    groundM: nn.default(null),
    altitudeM: nn.default(null),
    aglM: nn.default(null),
    gsdCm: nn.default(null),
    forwardOverlap: nn.default(null),
    sideOverlap: nn.default(null),
    // as guaranteed under the mission's attitude envelope; absent in results stored before
    forwardOverlapGuaranteed: nn.default(null),
    sideOverlapGuaranteed: nn.default(null),
    flags: z.array(flag).default([]),
  })
  .passthrough();

export const legViewSchema = z
  .object({
    start: point,
    end: point,
    /** Above the grid's vertical datum. */
    altitudeStartM: n,
    altitudeEndM: n,
    altitudeStartAboveTakeoffM: n,
    altitudeEndAboveTakeoffM: n,
    aglMinM: nn,
    aglMaxM: nn,
    gsdMinCm: nn,
    gsdMaxCm: nn,
    gradient: n,
  })
  .passthrough();

export const lineViewSchema = z
  .object({
    index: z.number().int(),
    headingDeg: n.optional(),
    lengthM: n.optional(),
    stations: z.array(stationViewSchema),
    legs: z.array(legViewSchema),
    warnings: z.array(note).optional(),
    unmet: z.array(z.object({ startM: n, endM: n, message: z.string() }).passthrough()).optional(),
  })
  .passthrough();

export const resultViewSchema = z
  .object({
    lines: z.array(lineViewSchema),
    summary: z
      .object({
        lineCount: z.number().int().optional(),
        photoCount: z.number().int().optional(),
        flightDistanceM: n.optional(),
        flightTimeS: n.optional(),
        batteries: z.number().int().optional(),
        shareWithinGsdTarget: nn.optional(),
        /** The attitude envelope of the guaranteed overlaps; null or absent: as planned only. */
        overlapEnvelope: z.object({ words: z.string() }).passthrough().nullable().optional(),
      })
      .passthrough()
      .default({}),
    warnings: z.array(note).default([]),
    takeoff: z.object({ lon: n, lat: n, groundM: n }).passthrough().optional(),
  })
  .passthrough();

export type StationView = z.infer<typeof stationViewSchema>;
export type LegView = z.infer<typeof legViewSchema>;
export type LineView = z.infer<typeof lineViewSchema>;
export type ResultView = z.infer<typeof resultViewSchema>;

/** A stored result as this view reads it; a result that does not fit is a server-side problem (500 with the reason logged). */
export function readResult(result: unknown): ResultView {
  const r = resultViewSchema.safeParse(result);
  if (!r.success) throw new Error(`Stored analysis result does not fit the report view: ${r.error.message}`);
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

/** Warning codes of the engine that the shared flight cautions already cover (cautions.ts words them once). */
const coveredByCautions = new Set(['bare-earth', 'local-rules', 'wind']);

/** The engine's plan-wide warnings that add something to the cautions (e.g. distances, flagged stations). */
export function planWarnings(view: ResultView): string[] {
  return view.warnings.filter((w) => typeof w === 'string' || !coveredByCautions.has(String((w as { code?: unknown }).code))).map(noteText);
}

/** Text of a warning or flag, whatever form the engine gave it. */
export function noteText(x: z.infer<typeof note> | z.infer<typeof flag>): string {
  if (typeof x === 'string') return x;
  if ('message' in x && typeof x.message === 'string') return x.message;
  if ('reason' in x && typeof x.reason === 'string') return x.reason;
  return 'code' in x ? String(x.code) : JSON.stringify(x);
}

/** Ground height of the takeoff point above the datum: as the engine sampled it, else from a leg (datum minus above-takeoff altitude). */
export function takeoffGroundM(view: ResultView): number | null {
  if (view.takeoff) return view.takeoff.groundM;
  for (const line of view.lines) {
    const leg = line.legs[0];
    if (leg) return leg.altitudeStartM - leg.altitudeStartAboveTakeoffM;
  }
  return null;
}

/**
 * The vertical datum every height of a version is above: the one its stored analysis names (the site's datum,
 * passed to the analysis), else the site's as stated (results stored before the analysis carried it).
 */
export function heightDatumOf(v: { result: unknown; siteVerticalDatum: string }): string {
  const named = (v.result as { heights?: { verticalDatum?: { name?: unknown } | null } } | null)?.heights?.verticalDatum?.name;
  return typeof named === 'string' && named.trim() !== '' ? named : v.siteVerticalDatum;
}

/** A version can be reported on only once its analysis is done. */
export function requireAnalysed(v: { analysisState: string; result: unknown; number: number }): void {
  if (v.analysisState !== 'done' || v.result === null || v.result === undefined) {
    throw new AppError(409, 'analysis_not_done', `Version ${v.number} has no finished analysis yet (it is ${v.analysisState}).`);
  }
}

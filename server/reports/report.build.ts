/** Build the compliance report of one analysed version from its mission, its stored result and its site. */
import type { ComplianceReport, SpecCheck, StationStats } from '../../contracts/reports';
import { reviewStateSchema } from '../../contracts/reviews';
import { unitOfProj4 } from '../../terrain/crs';
import type { GridMetadata } from '../../terrain/metadata';
import type { Mission } from '../../terrain/mission';
import type { VersionRecord } from '../versions/versions.repository';
import { flightCautions } from '../../contracts/cautions';
import { coverageChecks, reportCoverage } from './report.coverage';
import type { ReportAsFlown, ReportFlown } from '../../contracts/reports';
import { gsdBandCm } from '../../terrain/gsd';
import { fmt } from '../../contracts/format/figures';
import { cameraTiltsOf, heightDatumOf, planWarnings, readMission, readResult, type StationView } from '../versions/result-view';
import { distribution, maxKnown, minKnown, percentileMethod, shareWithin } from './stats';

/** The GSD band of the spec as the report gives it, [finest, coarsest] cm (terrain/gsd.ts computes it). */
function gsdBandOf(m: Pick<Mission, 'targetGsdCm' | 'gsdTolerance'>): [number, number] {
  const band = gsdBandCm(m);
  return [band.min, band.max];
}

/**
 * Figures over a set of stations against the GSD band. Heights above ground span the stations and the legs
 * flown between them (each leg's least and greatest over its whole profile): a status such as "above the
 * height limit" can come from ground between two photos, and the range beside it must include it.
 */
export function stationStats(stations: StationView[], band: [number, number], legs: ReadonlyArray<{ aglMinM: number | null; aglMaxM: number | null }> = []): StationStats {
  const gsd = stations.map((s) => s.gsdCm);
  return {
    stationCount: stations.length,
    knownCount: stations.filter((s) => s.groundM !== null && s.gsdCm !== null).length,
    shareMeetingGsd: shareWithin(gsd, band[0], band[1]),
    gsdCm: distribution(gsd),
    forwardOverlapMin: minKnown(stations.map((s) => s.forwardOverlap)),
    sideOverlapMin: minKnown(stations.map((s) => s.sideOverlap)),
    aglMinM: minKnown([...stations.map((s) => s.aglM), ...legs.map((l) => l.aglMinM)]),
    aglMaxM: maxKnown([...stations.map((s) => s.aglM), ...legs.map((l) => l.aglMaxM)]),
  };
}

/** The least overlaps as guaranteed under the mission's attitude envelope, or null when it has none (as planned only). */
interface GuaranteedOverlaps { words: string; forwardMin: number | null; sideMin: number | null }

function guaranteedOverlaps(view: ReturnType<typeof readResult>): GuaranteedOverlaps | null {
  const env = view.summary.overlapEnvelope;
  if (!env) return null;
  const all = view.lines.flatMap((l) => l.stations);
  return { words: env.words, forwardMin: minKnown(all.map((s) => s.forwardOverlapGuaranteed ?? null)), sideMin: minKnown(all.map((s) => s.sideOverlapGuaranteed ?? null)) };
}

/**
 * An overlap requirement's achieved figures, as planned and as guaranteed side by side; it is met only when both
 * are (the envelope is part of the spec the mission states).
 */
function overlapAchieved(planned: string, g: GuaranteedOverlaps | null, guaranteed: number | null): string {
  return g ? `minimum ${planned} as planned, ${fmt.percent(guaranteed, 'min')} as guaranteed under ${g.words}` : `minimum ${planned} as planned (no attitude envelope: as planned only)`;
}

function specChecks(m: Mission, o: StationStats, lineCount: number, band: [number, number], g: GuaranteedOverlaps | null = null): SpecCheck[] {
  const eps = 1e-9;
  const holds = (v: number | null, target: number) => v !== null && v >= target - eps;
  return [
    {
      key: 'gsd-band',
      label: 'GSD within the target band',
      required: `${fmt.gsdCm(band[0])} to ${fmt.gsdCm(band[1])} at every station`,
      achieved: `${fmt.percent(o.shareMeetingGsd, 'min')} of stations; GSD ${fmt.gsdCm(o.gsdCm.min, 'min')} to ${fmt.gsdCm(o.gsdCm.max, 'max')}`,
      pass: o.shareMeetingGsd === 1,
    },
    {
      key: 'forward-overlap',
      label: 'Forward overlap',
      required: `at least ${fmt.percent(m.forwardOverlap)}`,
      achieved: overlapAchieved(fmt.percent(o.forwardOverlapMin, 'min'), g, g?.forwardMin ?? null),
      pass: holds(o.forwardOverlapMin, m.forwardOverlap) && (g === null || holds(g.forwardMin, m.forwardOverlap)),
    },
    {
      key: 'side-overlap',
      label: 'Side overlap',
      required: `at least ${fmt.percent(m.sideOverlap)}`,
      achieved: o.sideOverlapMin === null && lineCount <= 1 ? 'one line only: no side overlap' : overlapAchieved(fmt.percent(o.sideOverlapMin, 'min'), g, g?.sideMin ?? null),
      pass: o.sideOverlapMin === null ? lineCount <= 1 : holds(o.sideOverlapMin, m.sideOverlap) && (g === null || holds(g.sideMin, m.sideOverlap)),
    },
    {
      key: 'clearance',
      label: 'Clearance above ground',
      required: `at least ${fmt.metres(m.clearanceM + m.obstacleAllowanceM)} (clearance ${fmt.metres(m.clearanceM)} + obstacle allowance ${fmt.metres(m.obstacleAllowanceM)})`,
      achieved: `minimum ${fmt.metres(o.aglMinM, 'min')}`,
      pass: o.aglMinM !== null && o.aglMinM >= m.clearanceM + m.obstacleAllowanceM - eps,
    },
    {
      key: 'height-limit',
      label: 'Height limit above ground',
      required: `at most ${fmt.metres(m.maxAglM)}`,
      achieved: `maximum ${fmt.metres(o.aglMaxM, 'max')}`,
      pass: o.aglMaxM !== null && o.aglMaxM <= m.maxAglM + eps,
    },
  ];
}

/** The spec's requirements as checked against an analysed version's results (the report's "Spec against results"). */
export function requirementChecks(v: VersionRecord): SpecCheck[] {
  const mission = readMission(v.input);
  const view = readResult(v.result);
  const band = gsdBandOf(mission);
  const overall = stationStats(view.lines.flatMap((l) => l.stations), band, view.lines.flatMap((l) => l.legs));
  return [...specChecks(mission, overall, view.lines.length, band, guaranteedOverlaps(view)), ...coverageChecks(v.coverage)];
}

/** The reasons stored with a sign-off, each beside the requirement it answers. */
function signOffReasons(v: VersionRecord, checks: SpecCheck[]): ComplianceReport['signOff']['reasons'] {
  return (v.signOffReasons ?? []).map((r) => {
    const c = checks.find((x) => x.key === r.key);
    return { key: r.key, label: c?.label ?? r.key, required: c?.required ?? '', achieved: c?.achieved ?? '', reason: r.reason };
  });
}

/** The whole report; `now` is injected so the document can be reproduced; `extras.asFlown` the latest photo check's section. */
export function buildReport(v: VersionRecord, now: Date = new Date(), extras: { asFlown?: ReportAsFlown | null; flown?: ReportFlown | null } = {}): ComplianceReport {
  const mission = readMission(v.input);
  const view = readResult(v.result);
  const meta = v.siteMetadata as GridMetadata;
  const band = gsdBandOf(mission);
  const all = view.lines.flatMap((l) => l.stations);
  const overall = stationStats(all, band, view.lines.flatMap((l) => l.legs));
  const checks = [...specChecks(mission, overall, view.lines.length, band, guaranteedOverlaps(view)), ...coverageChecks(v.coverage)];
  const surfaceKind = v.siteSurfaceKind === 'surface' ? 'surface' : 'bare-earth';
  const basis = overall.gsdCm.median;
  const state = reviewStateSchema.parse(v.reviewState);
  const signedAt = v.signedOffAt ? v.signedOffAt.toISOString() : null;
  const tilts = cameraTiltsOf(view);

  return {
    version: {
      id: v.id,
      planId: v.planId,
      number: v.number,
      reviewState: state,
      analysedAt: v.analysedAt ? v.analysedAt.toISOString() : null,
      createdBy: v.createdByName ?? null,
    },
    project: { name: v.projectName, client: v.projectClient },
    plan: { name: v.planName },
    spec: {
      targetGsdCm: mission.targetGsdCm,
      gsdTolerance: mission.gsdTolerance,
      gsdBandCm: band,
      forwardOverlap: mission.forwardOverlap,
      sideOverlap: mission.sideOverlap,
      clearanceM: mission.clearanceM,
      obstacleAllowanceM: mission.obstacleAllowanceM,
      maxAglM: mission.maxAglM,
      altitudeMode: mission.mode,
    },
    overall: {
      ...overall,
      lineCount: view.lines.length,
      photoCount: view.summary.photoCount,
      flightTimeS: view.summary.flightTimeS,
    },
    checks,
    coverage: reportCoverage(v.coverage),
    asFlown: extras.asFlown ?? null,
    lines: view.lines.map((line, i) => ({
      number: i + 1,
      ...stationStats(line.stations, band, line.legs),
      lengthM: line.lengthM,
      headingDeg: line.headingDeg,
      legCount: line.legs.length,
      warnings: [...line.warnings.map((w) => w.message), ...summariseUnmet(line.unmet)],
      gsdSeries: line.stations.map((s) => ({ distanceM: s.distanceM, gsdCm: s.gsdCm })),
    })),
    dem: {
      siteName: v.siteName,
      fileName: v.siteFileName,
      crs: { name: meta.crs.name, epsg: meta.crs.epsg },
      resolution: meta.resolution,
      resolutionUnit: unitOfProj4(meta.crs.proj4),
      verticalDatum: heightDatumOf(v),
      surfaceKind,
      elevationRangeM: [meta.elevation.min, meta.elevation.max],
    },
    accuracy: {
      label: 'ADVISORY',
      basisGsdCm: basis,
      horizontalCm: basis === null ? null : [basis, 2 * basis],
      verticalCm: basis === null ? null : [1.5 * basis, 3 * basis],
      ruleOfThumb:
        'With good ground control, horizontal accuracy is often quoted at about 1 to 2 times the GSD and vertical accuracy at about 1.5 to 3 times the GSD (common practice; no single source). Figures are from the median GSD.',
      source: 'common practice',
      deferral:
        'These are not a guarantee. Accuracy is proven only with independent check points measured on site, assessed by licensed survey practice under the standards that apply to the job.',
    },
    assumptions: [
      'GSD, footprint and overlaps are computed station by station from the ground under each photo in the elevation grid, not from flat-ground formulas.',
      `A station meets the GSD target when its GSD lies within ${fmt.gsdCm(band[0])} to ${fmt.gsdCm(band[1])} (target ${fmt.gsdCm(mission.targetGsdCm)} ± ${fmt.percent(mission.gsdTolerance)}); stations over unknown ground count as not meeting it.`,
      `Percentiles: ${percentileMethod}.`,
      `Heights above the datum refer to the grid's vertical datum (${heightDatumOf(v)}); altitudes for the pilot are above the takeoff point.`,
      tilts.length
        ? `Station figures (GSD, overlaps, heights) take the camera as planned: tilted ${tilts.join('°, ')}° from straight down towards the nose on the lines planned so (GSD where the photo's centre ray meets the ground), straight down on the others, with no roll or wind crab, and the aircraft holding the planned track and speed; the ground proof counts views per cell at those angles, under the attitude envelope the mission states, if any.`
        : 'Station figures (GSD, overlaps, heights) take the camera pointing straight down (no tilt, roll or wind crab) and the aircraft holding the planned track and speed; the ground proof counts views per cell under the attitude envelope the mission states, if any.',
    ],
    warnings: planWarnings(view),
    cautions: flightCautions({ surfaceKind, verticalDatum: heightDatumOf(v), maxAglM: mission.maxAglM, obstacleAllowanceM: mission.obstacleAllowanceM, cameraTiltsDeg: tilts }),
    signOff: {
      state,
      signedOffBy: state === 'signed_off' ? (v.signedOffByName ?? '(former member)') : null,
      signedOffAt: state === 'signed_off' ? signedAt : null,
      statement:
        state === 'signed_off'
          ? `Signed off by ${v.signedOffByName ?? '(former member)'} on ${fmt.utc(signedAt)}. Version ${v.number} is locked.`
          : `Not signed off (state: ${state.replace('_', ' ')}). This report is for review only.`,
      reasons: state === 'signed_off' ? signOffReasons(v, checks) : [],
    },
    flown: extras.flown ?? null,
    percentileMethod,
    generatedAt: now.toISOString(),
  };
}

/**
 * One sentence per reason for a line's unmet stretches (a busy line over a quarry face has dozens): how many,
 * how long in all, and the explanation of the longest of them.
 */
export function summariseUnmet(unmet: ReadonlyArray<{ startM: number; endM: number; message: string; reason?: unknown }>): string[] {
  const groups = new Map<string, Array<{ startM: number; endM: number; message: string }>>();
  for (const u of unmet) {
    const key = typeof u.reason === 'string' ? u.reason : u.message;
    groups.set(key, [...(groups.get(key) ?? []), u]);
  }
  return [...groups.values()].map((g) => {
    if (g.length === 1) return g[0].message;
    const total = g.reduce((t, u) => t + (u.endM - u.startM), 0);
    const longest = g.reduce((a, b) => (b.endM - b.startM > a.endM - a.startM ? b : a));
    // the engine's sentence follows a colon: its capital goes, unless it starts an abbreviation (GSD, AGL)
    const m = longest.message, said = /^[A-Z][a-z]/.test(m) ? m[0].toLowerCase() + m.slice(1) : m;
    return `${g.length} stretches, ${Math.round(total)} m in all: ${said}`;
  });
}

/** The mission items of one stored version: signed-off versions only, heights above the takeoff point, cautions included. */
import { missionCautions } from '../../contracts/cautions';
import type { MissionItems } from '../../contracts/mission-items';
import { reviewStateSchema } from '../../contracts/reviews';
import { AppError } from '../http/errors';
import { heightDatumOf, readMission, readResult, requireAnalysed, takeoffGroundM } from '../reports/result-view';
import type { VersionRecord } from '../reviews/versions.repository';
import { altitudeFrame, buildMissionItems, protocolUsed, type BuilderLine } from './mission-items.build';

const finite = (x: unknown): number | undefined => (typeof x === 'number' && Number.isFinite(x) ? x : undefined);

/** The smallest photo spacing any leg of a line states (solved plans), or undefined when none does. */
function tightestLegTrigger(legs: readonly unknown[]): number | undefined {
  let best: number | undefined;
  for (const g of legs) {
    const t = (g as { triggerDistanceM?: { min?: unknown } }).triggerDistanceM;
    const v = finite(t?.min);
    if (v !== undefined && v > 0 && (best === undefined || v < best)) best = v;
  }
  return best;
}

/** 409 unless the version is signed off: an aircraft gets nothing a surveyor has not signed. */
export function requireSignedOff(v: Pick<VersionRecord, 'reviewState' | 'number'>): void {
  const state = reviewStateSchema.parse(v.reviewState);
  if (state !== 'signed_off') {
    throw new AppError(409, 'not_signed_off', `Version ${v.number} is not signed off (it is ${state.replace('_', ' ')}): mission items are made from signed-off versions only. Have a surveyor sign it off first.`);
  }
}

/** The item list of a signed-off, analysed version; `now` is injected for reproducible output. */
export function missionItemsOf(v: VersionRecord, now: Date = new Date()): MissionItems {
  requireAnalysed(v);
  requireSignedOff(v);
  const mission = readMission(v.input);
  const view = readResult(v.result);
  const planTrigger = finite((view.summary as Record<string, unknown>).triggerDistanceM);
  if (planTrigger === undefined || planTrigger <= 0) throw new Error(`Stored analysis of version ${v.number} has no trigger distance.`);
  const lines: BuilderLine[] = view.lines.map((l) => ({
    // A line or leg may state its own trigger distance or speed (passed through from the analysis); else the plan's.
    // A solved plan states photo spacing per leg (a range along it); one distance per line keeps the tightest of them,
    // so no stretch of the line gets fewer photos than it was proven with.
    triggerDistanceM: finite((l as Record<string, unknown>).triggerDistanceM) ?? tightestLegTrigger(l.legs) ?? planTrigger,
    speedMps: finite((l as Record<string, unknown>).speedMps) ?? mission.speedMps,
    stations: l.stations.map((s) => ({ lon: s.lon, lat: s.lat, distanceM: s.distanceM })),
    legs: l.legs.map((g) => ({
      start: g.start,
      end: g.end,
      altitudeStartAboveTakeoffM: g.altitudeStartAboveTakeoffM,
      altitudeEndAboveTakeoffM: g.altitudeEndAboveTakeoffM,
      speedMps: finite((g as Record<string, unknown>).speedMps),
    })),
  }));
  const { items, lines: missionLines } = buildMissionItems({ takeoff: mission.takeoff, lines });
  const datum = heightDatumOf(v);
  const surfaceKind = v.siteSurfaceKind === 'surface' ? 'surface' : 'bare-earth';
  return {
    version: {
      id: v.id,
      planId: v.planId,
      number: v.number,
      planName: v.planName,
      projectName: v.projectName,
      signedOffBy: v.signedOffByName ?? '(former member)',
      signedOffAt: v.signedOffAt ? v.signedOffAt.toISOString() : null,
    },
    altitude: {
      ...altitudeFrame,
      reference: `metres above the takeoff point (${mission.takeoff.lat.toFixed(7)}, ${mission.takeoff.lon.toFixed(7)}), which the autopilot takes as its home position when it arms there`,
      takeoff: { lon: mission.takeoff.lon, lat: mission.takeoff.lat },
      takeoffGroundM: takeoffGroundM(view),
      verticalDatum: datum,
    },
    lines: missionLines,
    items,
    protocol: protocolUsed,
    cautions: missionCautions({ surfaceKind, verticalDatum: datum, maxAglM: mission.maxAglM, obstacleAllowanceM: mission.obstacleAllowanceM }),
    generatedAt: now.toISOString(),
  };
}

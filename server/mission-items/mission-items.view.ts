/** The mission items of one stored version: signed-off versions only, heights above the takeoff point, cautions included. */
import { missionCautions } from '../../contracts/cautions';
import { planLegSchema } from '../../contracts/plan-result';
import type { MissionItems } from '../../contracts/mission-items';
import { reviewStateSchema } from '../../contracts/reviews';
import { cameraTiltsOf, heightDatumOf, readMission, readResult, requireAnalysed, takeoffGroundM, type ResultView } from '../versions/result-view';
import type { Mission } from '../../terrain/mission';
import type { VersionRecord } from '../versions/versions.repository';
import { altitudeFrame, buildMissionItems, protocolUsed, type BuilderLine } from './mission-items.build';
import { versionErrors } from '../versions/versions.errors';

/** The per-leg figures a solved plan adds to a leg (contracts/plan-result.ts), read where present. */
const solvedLegSchema = planLegSchema.pick({ speedMps: true, triggerDistanceM: true });

const finite = (x: unknown): number | undefined => (typeof x === 'number' && Number.isFinite(x) ? x : undefined);

/** 409 unless the version is signed off: an aircraft gets nothing a surveyor has not signed. */
export function requireSignedOff(v: Pick<VersionRecord, 'reviewState' | 'number'>): void {
  const state = reviewStateSchema.parse(v.reviewState);
  if (state !== 'signed_off') {
    throw versionErrors.not_signed_off(`Version ${v.number} is not signed off (it is ${state.replace('_', ' ')}): mission items are made from signed-off versions only. Have a surveyor sign it off first.`);
  }
}

/** The builder's lines from a stored analysis: the legs' own speed and photo spacing where the solver stated them, else the mission's speed and the plan's air base. */
export function builderLinesOf(view: ResultView, mission: Pick<Mission, 'speedMps'>, versionNumber: number): BuilderLine[] {
  const planTrigger = finite((view.summary as Record<string, unknown>).triggerDistanceM);
  if (planTrigger === undefined || planTrigger <= 0) throw new Error(`Stored analysis of version ${versionNumber} has no trigger distance.`);
  return view.lines.map((l) => ({
    // Solved plans state a speed and a photo spacing per leg; a plan analysed from the mission's settings flies the
    // mission's speed and the plan's air base (summary.triggerDistanceM, the spacing its stations were laid at).
    triggerDistanceM: planTrigger,
    speedMps: mission.speedMps,
    // oblique capture: the camera tilt on its mount the plan's line was analysed with
    cameraTiltDeg: finite((l as Record<string, unknown>).cameraTiltDeg) ?? 0,
    stations: l.stations.map((s) => ({ lon: s.lon, lat: s.lat, distanceM: s.distanceM })),
    legs: l.legs.map((g) => {
      const own = solvedLegSchema.safeParse(g);
      return {
        start: g.start,
        end: g.end,
        altitudeStartAboveTakeoffM: g.altitudeStartAboveTakeoffM,
        altitudeEndAboveTakeoffM: g.altitudeEndAboveTakeoffM,
        speedMps: own.success ? own.data.speedMps : undefined,
        // The leg's tightest spacing: a distance trigger fires at one spacing, and the tightest keeps every planned overlap.
        triggerDistanceM: own.success ? own.data.triggerDistanceM?.min : undefined,
      };
    }),
  }));
}

/** The item list of a signed-off, analysed version; `now` is injected for reproducible output. */
export function missionItemsOf(v: VersionRecord, now: Date = new Date()): MissionItems {
  requireAnalysed(v);
  requireSignedOff(v);
  const mission = readMission(v.input);
  const view = readResult(v.result);
  const lines = builderLinesOf(view, mission, v.number);
  const { items, lines: missionLines } = buildMissionItems({ takeoff: mission.takeoff, lines, returnAltitudeAboveTakeoffM: view.takeoff.returnAltitudeAboveTakeoffM });
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
    cautions: missionCautions({ surfaceKind, verticalDatum: datum, maxAglM: mission.maxAglM, obstacleAllowanceM: mission.obstacleAllowanceM, cameraTiltsDeg: cameraTiltsOf(view) }),
    generatedAt: now.toISOString(),
  };
}

/** Build the pilot's leg sheet of one analysed version: lines in flying order, their legs, the battery plan, the checklist. */
import type { ChecklistItem, LegSheet, SheetLeg, SheetLine } from '../../contracts/flights';
import { reviewStateSchema } from '../../contracts/reviews';
import { flightCautions, notSignedOffCaution } from '../../contracts/cautions';
import { fmt } from '../../contracts/format/figures';
import { azimuthDeg, distanceM } from '../versions/geodesy';
import { cameraTiltsOf, heightDatumOf, planWarnings, readMission, readResult, takeoffGroundM, type LegView, type LineView } from '../versions/result-view';
import type { VersionRecord } from '../versions/versions.repository';
import { planBatteries } from './battery-plan';

/** A leg as the pilot reads it; time over the leg's horizontal length at its own speed (solved plans), else the cruise speed. */
function sheetLeg(leg: LegView, number: number, speedMps: number): SheetLeg {
  const lengthM = Math.abs(leg.end.distanceM - leg.start.distanceM);
  const v = leg.speedMps !== undefined && leg.speedMps > 0 ? leg.speedMps : speedMps;
  const rise = leg.altitudeEndM - leg.altitudeStartM;
  return {
    number,
    start: leg.start,
    end: leg.end,
    altitudeAboveTakeoffM: { start: leg.altitudeStartAboveTakeoffM, end: leg.altitudeEndAboveTakeoffM },
    altitudeAboveDatumM: { start: leg.altitudeStartM, end: leg.altitudeEndM },
    aglM: { min: leg.aglMinM, max: leg.aglMaxM },
    gsdCm: { min: leg.gsdMinCm, max: leg.gsdMaxCm },
    headingDeg: azimuthDeg(leg.start, leg.end),
    lengthM,
    timeS: lengthM / v,
    gradientPct: leg.gradient * 100,
    kind: Math.abs(rise) < 0.05 ? 'level' : rise > 0 ? 'climb' : 'descent',
  };
}

/** What the solver says of a line: a spot photo or a line of the layout, and which set of lines (lattice and slant plans). */
type LineRole = { kind: 'line' | 'spot'; set?: number };

/** Each line's role, in flying order; a plan laid out from the settings has one set of lines and no spot photos. */
function lineRoles(view: ReturnType<typeof readResult>): LineRole[] {
  const choices = view.solved?.choices.lines ?? [];
  const byLine = new Map(choices.map((c) => [c.line, c]));
  const sets = new Set(choices.filter((c) => c.kind === 'line').map((c) => c.set));
  return view.lines.map((l) => {
    // the solver numbers its lines in flying order from 1, as the result's line index counts from 0
    const c = byLine.get(l.index + 1);
    if (!c) return { kind: 'line' };
    return c.kind === 'spot' ? { kind: 'spot' } : sets.size > 1 ? { kind: 'line', set: c.set } : { kind: 'line' };
  });
}

function sheetLine(line: LineView, number: number, speedMps: number, role: LineRole): SheetLine {
  const first = line.legs[0]?.start ?? line.stations[0];
  const last = line.legs[line.legs.length - 1]?.end ?? line.stations[line.stations.length - 1];
  const lengthM = line.lengthM;
  const legs = line.legs.map((l, i) => sheetLeg(l, i + 1, speedMps));
  // the legs at their own speeds, and any run-in or run-out beyond them at the cruise speed
  const legLengthM = legs.reduce((t, g) => t + g.lengthM, 0);
  return {
    number,
    kind: role.kind,
    ...(role.set !== undefined ? { set: role.set } : {}),
    headingDeg: line.headingDeg,
    lengthM,
    timeS: legs.reduce((t, g) => t + g.timeS, 0) + Math.max(0, lengthM - legLengthM) / speedMps,
    photoCount: line.stations.length,
    ...(line.cameraTiltDeg ? { cameraTiltDeg: line.cameraTiltDeg } : {}),
    start: { lon: first.lon, lat: first.lat },
    end: { lon: last.lon, lat: last.lat },
    legs,
    warnings: [...line.warnings.map((w) => w.message), ...line.unmet.map((u) => u.message)],
  };
}

/** The sheet; `now` is injected for reproducible output. */
export function buildLegSheet(v: VersionRecord, now: Date = new Date()): LegSheet {
  const mission = readMission(v.input);
  const view = readResult(v.result);
  const state = reviewStateSchema.parse(v.reviewState);
  const signedOff = state === 'signed_off';
  const surfaceKind = v.siteSurfaceKind === 'surface' ? 'surface' : 'bare-earth';
  const roles = lineRoles(view);
  const lines = view.lines.map((l, i) => sheetLine(l, i + 1, mission.speedMps, roles[i]!));
  const takeoff = mission.takeoff;
  const batteries = planBatteries(
    lines.map((l, i) => {
      // the transit from the line before, flown level at the higher of the two altitudes (climb first or descend
      // last, as the MAVLink export flies it): the level distance at the cruise speed plus the change of altitude
      const prev = lines[i - 1];
      let fromPreviousS = 0;
      if (prev && prev.legs.length && l.legs.length) {
        const dz = l.legs[0].altitudeAboveDatumM.start - prev.legs[prev.legs.length - 1].altitudeAboveDatumM.end;
        fromPreviousS = distanceM(prev.end, l.start) / mission.speedMps + (dz > 0 ? dz / mission.climbMps : -dz / mission.descentMps);
      }
      const startAboveTakeoffM = l.legs[0]?.altitudeAboveTakeoffM.start, endAboveTakeoffM = l.legs[l.legs.length - 1]?.altitudeAboveTakeoffM.end;
      return { number: l.number, timeS: l.timeS, fromTakeoffM: distanceM(takeoff, l.start), toTakeoffM: distanceM(l.end, takeoff), fromPreviousS, startAboveTakeoffM, endAboveTakeoffM, returnAboveTakeoffM: view.lines[i].returnAltitudeAboveTakeoffM };
    }),
    { enduranceMin: mission.enduranceMin, reserve: mission.batteryReserve, speedMps: mission.speedMps, turnTimeS: mission.turnTimeS, climbMps: mission.climbMps, descentMps: mission.descentMps },
  );
  const onLines = new Set(lines.flatMap((l) => l.warnings));
  const groundM = takeoffGroundM(view);
  const farthest = lines.length
    ? Math.max(...lines.flatMap((l) => l.legs.flatMap((g) => [distanceM(takeoff, g.start), distanceM(takeoff, g.end)])))
    : null;
  const cautions = flightCautions({ surfaceKind, verticalDatum: heightDatumOf(v), maxAglM: mission.maxAglM, obstacleAllowanceM: mission.obstacleAllowanceM, cameraTiltsDeg: cameraTiltsOf(view) });
  if (!signedOff) cautions.unshift(notSignedOffCaution);

  const checklist: ChecklistItem[] = [
    ...cautions.map((text, i) => ({ id: `caution-${i + 1}`, kind: 'caution' as const, text })),
    {
      id: 'takeoff-height',
      kind: 'check',
      text: `Take off from ${takeoff.lat.toFixed(6)}, ${takeoff.lon.toFixed(6)}: the sheet assumes its ground is ${fmt.metres(groundM)} above ${heightDatumOf(v)}. Check it on site; from another spot every altitude above takeoff shifts by the height difference.`,
    },
    { id: 'limits', kind: 'check', text: `Confirm the local altitude limit, airspace and permissions for this site; the plan's limit is ${fmt.metres(mission.maxAglM)} above ground.` },
    {
      id: 'line-of-sight',
      kind: 'check',
      text: `Plan where you and any observer stand to keep the aircraft in sight along every line${farthest === null ? '' : ` (the plan reaches ${fmt.metres(farthest)} from the takeoff point)`}.`,
    },
    { id: 'wind', kind: 'check', text: 'Check the wind forecast and on site: strong wind drifts the aircraft off the lines and shortens battery time.' },
    { id: 'batteries', kind: 'check', text: `Charge ${batteries.count} ${batteries.count === 1 ? 'battery' : 'batteries'} for this plan (reserve ${fmt.percent(mission.batteryReserve)} each), plus a spare.` },
  ];

  return {
    version: {
      id: v.id,
      planId: v.planId,
      number: v.number,
      planName: v.planName,
      projectName: v.projectName,
      client: v.projectClient,
      reviewState: state,
      signedOff,
      signedOffBy: signedOff ? (v.signedOffByName ?? '(former member)') : null,
      signedOffAt: signedOff && v.signedOffAt ? v.signedOffAt.toISOString() : null,
    },
    units: v.projectUnits === 'imperial' ? 'imperial' : 'metric',
    datum: { name: heightDatumOf(v), takeoff: { lon: takeoff.lon, lat: takeoff.lat }, takeoffGroundM: groundM },
    speedMps: mission.speedMps,
    altitudeMode: mission.mode,
    lines,
    batteries,
    checklist,
    cautions,
    // the plan's own list repeats every line's warnings; the sheet shows those on their line's card only
    warnings: planWarnings(view).filter((m) => !onLines.has(m)),
    generatedAt: now.toISOString(),
  };
}

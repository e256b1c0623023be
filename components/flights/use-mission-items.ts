/** What the leg sheet's hand-off card shows: item count, altitude frame, trigger distance and speed per line, the download, photos recorded. */
import { lineSettingRanges, type MissionItem, type MissionItems } from '../../contracts/mission-items';
import type { FlightTrigger } from '../../contracts/flight-triggers';
import type { UnitSystem } from '../../contracts/projects';
import { errorMessage } from '../api/api-error';
import { formatLength, formatSpeed } from '../projects/units';
import { missionItemsPath, useFlightTriggersQuery, useMissionItemsQuery } from './mission-items.queries';

type MissionHandoff =
  | { kind: 'unavailable'; reason: string }
  | { kind: 'loading' }
  | { kind: 'error'; message: string }
  | {
      kind: 'ready';
      itemCount: number;
      frameName: string;
      reference: string;
      lines: HandoffLine[];
      /** Every item in one short row each, in upload order. */
      items: ItemRow[];
      cautions: string[];
      downloadHref: string;
      /** Photos the link has recorded as flown (null until known). */
      recorded: { count: number; lastAt: string | null } | null;
    };

/** A line as the card shows it: photo spacing and ground speed as ranges over its legs. */
interface HandoffLine {
  number: number;
  photoCount: number;
  firstSeq: number;
  lastSeq: number;
  triggerDistanceM: { min: number; max: number };
  speedMps: { min: number; max: number };
  /** True when the legs of the line differ in spacing or speed (solved plans). */
  perLeg: boolean;
  /** The camera tilt the gimbal item before the line sets, degrees from straight down; null: no gimbal item (straight down). */
  cameraTiltDeg: number | null;
}

/** One item in short: its MAVLink command without the MAV_CMD_ prefix, where it belongs, and the figure it sets. */
interface ItemRow {
  seq: number;
  command: string;
  line: number | null;
  leg: number | null;
  /** Metres above the takeoff point (positioned items). */
  altitudeAboveTakeoffM: number | null;
  /** Ground speed set (DO_CHANGE_SPEED), m/s. */
  speedMps: number | null;
  /** Photo spacing set (DO_SET_CAM_TRIGG_DIST; 0 stops the camera), m. */
  triggerDistanceM: number | null;
  /** Gimbal pitch set (DO_GIMBAL_MANAGER_PITCHYAW param1), degrees from the horizon, −90 straight down. */
  gimbalPitchDeg: number | null;
}

/** Pure: one item's short row. */
export function itemRowOf(i: MissionItem): ItemRow {
  const positioned = i.about.frameName !== 'MAV_FRAME_MISSION';
  return {
    seq: i.seq,
    command: i.about.commandName.replace(/^MAV_CMD_/, ''),
    line: i.about.line,
    leg: i.about.leg,
    altitudeAboveTakeoffM: positioned && i.about.kind !== 'return' ? i.z : null,
    speedMps: i.about.kind === 'speed' ? i.param2 : null,
    triggerDistanceM: i.about.kind === 'camera-on' || i.about.kind === 'camera-spacing' || i.about.kind === 'camera-off' ? i.param1 : null,
    gimbalPitchDeg: i.about.kind === 'camera-tilt' ? i.param1 : null,
  };
}

/** A range as text: one figure when both ends agree, else "min–max". */
export const rangeText = (r: { min: number; max: number }, f: (v: number) => string) => (r.min === r.max ? f(r.min) : `${f(r.min)}–${f(r.max)}`);

/** One item in a short line: seq, command, place in the plan, the figure it sets (heights above the takeoff point). */
export function itemRowText(i: ItemRow, units: UnitSystem): string {
  const where = i.line === null ? '' : ` · line ${i.line}${i.leg === null ? '' : ` leg ${i.leg}`}`;
  const figure =
    i.altitudeAboveTakeoffM !== null
      ? ` · ${formatLength(i.altitudeAboveTakeoffM, units, 1)} above takeoff`
      : i.speedMps !== null
        ? ` · ${formatSpeed(i.speedMps, units, 2)}`
        : i.triggerDistanceM !== null
          ? i.triggerDistanceM === 0
            ? ' · camera off'
            : ` · a photo every ${formatLength(i.triggerDistanceM, units, 2)}`
          : i.gimbalPitchDeg !== null
            ? ` · gimbal pitch ${i.gimbalPitchDeg}° from the horizon (${gimbalWords(i.gimbalPitchDeg)})`
            : '';
  return `${i.seq} ${i.command}${where}${figure}`;
}

/** "straight down" or "tilted 35° from straight down": a gimbal pitch as the leg sheet words the camera. */
function gimbalWords(pitchDeg: number): string {
  const tilt = 90 + pitchDeg;
  return tilt === 0 ? 'straight down' : `tilted ${tilt}° from straight down`;
}

/** Pure: a line's figures for the card; `items` give the gimbal item set before it, if any. */
export function handoffLineOf(l: MissionItems['lines'][number], items: readonly MissionItem[] = []): HandoffLine {
  const r = lineSettingRanges(l);
  const gimbal = items.find((i) => i.about.kind === 'camera-tilt' && i.about.line === l.number);
  return {
    cameraTiltDeg: gimbal && gimbal.param1 !== null ? 90 + gimbal.param1 : null,
    number: l.number,
    photoCount: l.photoCount,
    firstSeq: l.firstSeq,
    lastSeq: l.lastSeq,
    ...r,
    perLeg: r.triggerDistanceM.min !== r.triggerDistanceM.max || r.speedMps.min !== r.speedMps.max,
  };
}

/**
 * A line of the card in words: its photo spacing and speed, or one photo for a spot photo's hover; the camera tilt
 * its gimbal item sets; its photos and items.
 */
export function handoffLineText(l: HandoffLine, units: UnitSystem): string {
  const speed = rangeText(l.speedMps, (v) => formatSpeed(v, units));
  const camera = l.cameraTiltDeg === null ? '' : `, camera ${l.cameraTiltDeg === 0 ? 'straight down' : `tilted ${l.cameraTiltDeg}°`}`;
  const items = `items ${l.firstSeq}–${l.lastSeq}`;
  if (l.photoCount === 1) return `Line ${l.number}: one photo at ${speed}${camera} (${items})`;
  const spacing = rangeText(l.triggerDistanceM, (v) => formatLength(v, units, 1));
  return `Line ${l.number}: a photo every ${spacing} at ${speed}${l.perLeg ? ', set leg by leg' : ''}${camera} (${l.photoCount} photos, ${items})`;
}

/** Pure: the card's state from the sheet's facts and the query's. */
export function missionHandoffOf(q: { signedOff: boolean; offline: boolean; teamId: string | undefined; versionId: string; data?: MissionItems; error?: unknown; loading: boolean; triggers?: FlightTrigger[] }): MissionHandoff {
  if (!q.signedOff) return { kind: 'unavailable', reason: 'Mission items are made from signed-off versions only.' };
  if (q.data && q.teamId) {
    return {
      kind: 'ready',
      itemCount: q.data.items.length,
      frameName: q.data.altitude.frameName,
      reference: q.data.altitude.reference,
      lines: q.data.lines.map((l) => handoffLineOf(l, q.data!.items)),
      items: q.data.items.map(itemRowOf),
      cautions: q.data.cautions,
      downloadHref: missionItemsPath(q.teamId, q.versionId, true),
      recorded: q.triggers ? { count: q.triggers.length, lastAt: q.triggers.reduce<string | null>((a, t) => (a === null || t.capturedAt > a ? t.capturedAt : a), null) } : null,
    };
  }
  if (q.offline) return { kind: 'unavailable', reason: 'Mission items need the connection back.' };
  if (q.error) return { kind: 'error', message: errorMessage(q.error) };
  return { kind: 'loading' };
}

/** The hand-off card's state for one version of the sheet. */
export function useMissionItems(teamId: string | undefined, versionId: string, signedOff: boolean, offline: boolean): MissionHandoff {
  const q = useMissionItemsQuery(teamId, versionId, signedOff && !offline);
  const t = useFlightTriggersQuery(teamId, versionId, signedOff && !offline);
  return missionHandoffOf({ signedOff, offline, teamId, versionId, data: q.data, error: q.error, loading: q.isLoading, triggers: t.data?.triggers });
}

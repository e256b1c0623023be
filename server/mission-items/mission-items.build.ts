/**
 * MAVLink mission items from a plan's lines and legs (pure: no I/O). Enum values come from node-mavlink's generated
 * common.xml mappings, so the numbers the JSON carries are the ones the link serializes.
 *
 * Sequence (MAVLink mission protocol, mavlink.io/en/services/mission.html; commands from common.xml):
 *   MAV_CMD_NAV_TAKEOFF at the takeoff point to the first line's start altitude, then per line
 *   NAV_WAYPOINT line start, DO_CHANGE_SPEED (ground speed), NAV_WAYPOINT at the first photo station,
 *   DO_SET_CAM_TRIGG_DIST (trigger distance, one photo at once), NAV_WAYPOINT at every change of leg (followed by
 *   DO_CHANGE_SPEED where the leg's speed differs from the one in force, and DO_SET_CAM_TRIGG_DIST where its photo
 *   spacing differs once the camera runs), NAV_WAYPOINT line end, DO_SET_CAM_TRIGG_DIST 0 (camera off); finally
 *   MAV_CMD_NAV_RETURN_TO_LAUNCH, after a NAV_WAYPOINT over the last line's end at the plan's return altitude where the
 *   straight way home needs more than that end's altitude to keep the clearance.
 * Between two lines at different altitudes a NAV_WAYPOINT holds the transit at the higher of the two (climb over the
 * end of the one line, or arrive over the start of the next and descend), as the plan's transit clearance check
 * assumes: a straight slant from a high line to a low one (a spot photo over a pit) would cut below it.
 * A plan with tilted-camera lines (oblique capture) sets the gimbal before each line: MAV_CMD_DO_GIMBAL_MANAGER_PITCHYAW
 * with the pitch below the horizon (-90 straight down, -(90 - t) for a tilt t towards the nose), yaw 0 and no flags
 * (both relative to the aircraft, as the plan's analysis models the camera on its mount), device 0 (all gimbals); and
 * back to straight down before the return. Plans without tilted lines carry no gimbal item.
 * A DO command runs once the aircraft reaches the NAV item before it, so the camera starts on the first station
 * (the run-in before it stays free of photos, and later photos fall on the planned stations) and stops at the line end.
 */
import { common } from 'node-mavlink';
import type { MissionItem, MissionItemKind, MissionLine } from '../../contracts/mission-items';

const { MavCmd, MavFrame, SpeedType } = common;

/** A point along a line as the builder needs it. */
interface AlongPoint {
  lon: number;
  lat: number;
  distanceM: number;
}

interface BuilderLeg {
  start: AlongPoint;
  end: AlongPoint;
  altitudeStartAboveTakeoffM: number;
  altitudeEndAboveTakeoffM: number;
  /** A ground speed of the leg's own, where the plan states one; else the line's. */
  speedMps?: number;
  /** A photo spacing of the leg's own (solved plans: the tightest spacing of its stations); else the leg's before it, else the line's. */
  triggerDistanceM?: number;
}

export interface BuilderLine {
  legs: BuilderLeg[];
  /** Photo stations in flying order (distance from the line start). */
  stations: AlongPoint[];
  triggerDistanceM: number;
  speedMps: number;
  /** Camera tilt on its mount towards the nose, degrees from straight down (0: straight down). */
  cameraTiltDeg?: number;
}

export interface BuilderInput {
  takeoff: { lon: number; lat: number };
  lines: BuilderLine[];
  /** Altitude above takeoff the straight return from the last line's end keeps the clearance at (the plan's); climbed to there before the return when above that end. */
  returnAltitudeAboveTakeoffM?: number;
}

/** Degrees to MAVLink's int32 degE7. */
export function degE7(deg: number): number {
  return Math.round(deg * 1e7);
}

const cmdName = (c: number) => `MAV_CMD_${MavCmd[c]}`;
const frameName = (f: number) => `MAV_FRAME_${MavFrame[f]}`;

/** The MAVLink messages and commands the hand-off uses (README lists them with the same source). */
export const protocolUsed = {
  source: 'MAVLink common message set (message_definitions/v1.0/common.xml) and the mission protocol, mavlink.io/en/services/mission.html',
  messages: ['HEARTBEAT', 'MISSION_COUNT', 'MISSION_REQUEST_INT', 'MISSION_REQUEST', 'MISSION_ITEM_INT', 'MISSION_ACK', 'MISSION_REQUEST_LIST'],
  commands: [MavCmd.NAV_TAKEOFF, MavCmd.NAV_WAYPOINT, MavCmd.DO_CHANGE_SPEED, MavCmd.DO_SET_CAM_TRIGG_DIST, MavCmd.NAV_RETURN_TO_LAUNCH].map(cmdName),
};

/** The altitude frame of every positioned item. */
export const altitudeFrame = { frame: MavFrame.GLOBAL_RELATIVE_ALT_INT as number, frameName: frameName(MavFrame.GLOBAL_RELATIVE_ALT_INT) };

function lerpAltitude(leg: BuilderLeg, distanceM: number): number {
  const span = leg.end.distanceM - leg.start.distanceM;
  if (Math.abs(span) < 1e-9) return leg.altitudeStartAboveTakeoffM;
  const t = (distanceM - leg.start.distanceM) / span;
  return leg.altitudeStartAboveTakeoffM + t * (leg.altitudeEndAboveTakeoffM - leg.altitudeStartAboveTakeoffM);
}

const samePlace = (a: AlongPoint, b: AlongPoint) => Math.abs(a.lon - b.lon) < 1e-9 && Math.abs(a.lat - b.lat) < 1e-9;

interface Stop {
  kind: 'line-start' | 'first-photo' | 'leg-change' | 'line-end';
  point: AlongPoint;
  altitudeM: number;
  leg: number;
  /** Leg `leg` starts here (its speed and photo spacing take effect). */
  startsLeg?: boolean;
  /** The camera starts here (the line's first photo station). */
  cameraOn?: boolean;
}

/** Per leg, the speed and photo spacing in force on it: its own, else carried from the leg before, else the line's. */
function legSettings(line: BuilderLine): Array<{ speedMps: number; triggerDistanceM: number }> {
  const ownTrigger = (g: BuilderLeg) => (g.triggerDistanceM !== undefined && g.triggerDistanceM > 0 ? g.triggerDistanceM : undefined);
  // Legs before the first one with a spacing of its own take that one (solved legs with one station state none).
  let trigger = ownTrigger(line.legs.find((g) => ownTrigger(g) !== undefined) ?? line.legs[0] ?? ({} as BuilderLeg)) ?? line.triggerDistanceM;
  let speed = line.speedMps;
  return line.legs.map((g) => {
    trigger = ownTrigger(g) ?? trigger;
    speed = g.speedMps !== undefined && g.speedMps > 0 ? g.speedMps : speed;
    return { speedMps: speed, triggerDistanceM: trigger };
  });
}

/** The NAV stops of one line in flying order, the first photo station among them. */
function stopsOf(line: BuilderLine): Stop[] {
  const stops: Stop[] = [];
  line.legs.forEach((leg, gi) => {
    const legNo = gi + 1;
    if (gi === 0) stops.push({ kind: 'line-start', point: leg.start, altitudeM: leg.altitudeStartAboveTakeoffM, leg: legNo, startsLeg: true });
    else {
      const prev = line.legs[gi - 1];
      const joined = samePlace(prev.end, leg.start) && Math.abs(prev.altitudeEndAboveTakeoffM - leg.altitudeStartAboveTakeoffM) < 1e-6;
      if (!joined) stops.push({ kind: 'leg-change', point: prev.end, altitudeM: prev.altitudeEndAboveTakeoffM, leg: legNo - 1 });
      stops.push({ kind: 'leg-change', point: leg.start, altitudeM: leg.altitudeStartAboveTakeoffM, leg: legNo, startsLeg: true });
    }
    if (gi === line.legs.length - 1) stops.push({ kind: 'line-end', point: leg.end, altitudeM: leg.altitudeEndAboveTakeoffM, leg: legNo });
  });
  const first = line.stations[0];
  if (!first || stops.length === 0) return stops;
  // The camera starts at the first station: on a stop already there, else on a waypoint of its own on the leg under it.
  const there = stops.find((s) => s.kind !== 'line-end' && Math.abs(s.point.distanceM - first.distanceM) < 1e-3);
  if (there) {
    there.cameraOn = true;
    return stops;
  }
  const gi = Math.max(0, line.legs.findIndex((g) => first.distanceM >= g.start.distanceM - 1e-9 && first.distanceM <= g.end.distanceM + 1e-9));
  const stop: Stop = { kind: 'first-photo', point: first, altitudeM: lerpAltitude(line.legs[gi], first.distanceM), leg: gi + 1, cameraOn: true };
  const after = stops.findIndex((s) => s.point.distanceM > first.distanceM);
  stops.splice(after < 0 ? stops.length - 1 : Math.max(1, after), 0, stop);
  return stops;
}

/** Every item of the mission, and per line the camera and speed settings with the items' range. */
export function buildMissionItems(input: BuilderInput): { items: MissionItem[]; lines: MissionLine[] } {
  const items: MissionItem[] = [];
  const lines: MissionLine[] = [];
  const positioned = (kind: MissionItemKind, command: number, p: { lon: number; lat: number }, altitudeM: number, line: number | null, leg: number | null, params: [number | null, number | null, number | null, number | null]) =>
    push(kind, command, altitudeFrame.frame, params, degE7(p.lat), degE7(p.lon), altitudeM, line, leg);
  const action = (kind: MissionItemKind, command: number, line: number | null, leg: number | null, params: [number | null, number | null, number | null, number | null]) =>
    push(kind, command, MavFrame.MISSION, params, 0, 0, 0, line, leg);
  function push(kind: MissionItemKind, command: number, frame: number, p: [number | null, number | null, number | null, number | null], x: number, y: number, z: number, line: number | null, leg: number | null) {
    items.push({
      seq: items.length,
      frame,
      command,
      current: 0,
      autocontinue: 1,
      param1: p[0],
      param2: p[1],
      param3: p[2],
      param4: p[3],
      x,
      y,
      z,
      mission_type: 0,
      about: { kind, commandName: cmdName(command), frameName: frameName(frame), line, leg },
    });
  }

  const firstLeg = input.lines.find((l) => l.legs.length > 0)?.legs[0];
  if (!firstLeg) return { items, lines };
  // Takeoff: climb over the takeoff point to the first line's start altitude; yaw NaN keeps the heading as it is.
  positioned('takeoff', MavCmd.NAV_TAKEOFF, input.takeoff, firstLeg.altitudeStartAboveTakeoffM, null, null, [0, 0, 0, null]);

  let lastEnd: { point: AlongPoint; altitudeM: number } | null = null;
  const tilted = input.lines.some((l) => (l.cameraTiltDeg ?? 0) !== 0);
  // DO_GIMBAL_MANAGER_PITCHYAW: param1 pitch (deg, negative down), param2 yaw 0, param3-4 rates NaN (unset);
  // param5 flags 0 and param7 device 0 ride in x and z of the MISSION_ITEM_INT, 0 here
  const gimbal = (line: number | null, tiltDeg: number) => action('camera-tilt', MavCmd.DO_GIMBAL_MANAGER_PITCHYAW, line, line === null ? null : 1, [-(90 - tiltDeg), 0, null, null]);
  input.lines.forEach((line, li) => {
    if (line.legs.length === 0) return;
    const number = li + 1;
    const start = line.legs[0];
    if (lastEnd) {
      // below half a metre the slant and the level-then-vertical transit are the same flight
      const a = lastEnd.altitudeM, b = start.altitudeStartAboveTakeoffM;
      if (b > a + 0.5) positioned('transit', MavCmd.NAV_WAYPOINT, lastEnd.point, b, null, null, [0, 0, 0, null]);
      else if (a > b + 0.5) positioned('transit', MavCmd.NAV_WAYPOINT, start.start, a, null, null, [0, 0, 0, null]);
    }
    const end = line.legs[line.legs.length - 1];
    lastEnd = { point: end.end, altitudeM: end.altitudeEndAboveTakeoffM };
    const firstSeq = items.length;
    // set on the way to the line's start (after the transit or the last line's end), so it is in place for the first photo
    if (tilted) gimbal(number, line.cameraTiltDeg ?? 0);
    const settings = legSettings(line);
    // Speed is set at every line start (the turn before it may have flown at another); later only where it changes.
    let speedInForce: number | undefined;
    let cameraDistance: number | undefined;
    for (const stop of stopsOf(line)) {
      const own = settings[stop.leg - 1];
      // NAV_WAYPOINT params: hold 0 s, acceptance and pass radius 0 (autopilot default), yaw NaN (unchanged).
      positioned(stop.kind, MavCmd.NAV_WAYPOINT, stop.point, stop.altitudeM, number, stop.leg, [0, 0, 0, null]);
      // DO_CHANGE_SPEED: param1 speed type (ground speed), param2 m/s, param3 throttle -1 (no change).
      if (stop.startsLeg && own.speedMps !== speedInForce) {
        action('speed', MavCmd.DO_CHANGE_SPEED, number, stop.leg, [SpeedType.GROUNDSPEED, own.speedMps, -1, 0]);
        speedInForce = own.speedMps;
      }
      // DO_SET_CAM_TRIGG_DIST: param1 distance m, param2 shutter integration 0 (ignore), param3 1 = one photo at once.
      if (stop.cameraOn) {
        action('camera-on', MavCmd.DO_SET_CAM_TRIGG_DIST, number, stop.leg, [own.triggerDistanceM, 0, 1, 0]);
        cameraDistance = own.triggerDistanceM;
      } else if (stop.startsLeg && cameraDistance !== undefined && own.triggerDistanceM !== cameraDistance) {
        // A new spacing on a running camera. common.xml does not say whether the distance count restarts there; one
        // photo at the change (param3 1) keeps every gap within the planned spacing either way, at one photo's cost.
        action('camera-spacing', MavCmd.DO_SET_CAM_TRIGG_DIST, number, stop.leg, [own.triggerDistanceM, 0, 1, 0]);
        cameraDistance = own.triggerDistanceM;
      }
      if (stop.kind === 'line-end') action('camera-off', MavCmd.DO_SET_CAM_TRIGG_DIST, number, stop.leg, [0, 0, 0, 0]);
    }
    const cameraOn = items.slice(firstSeq).find((i) => i.about.kind === 'camera-on');
    lines.push({
      number,
      triggerDistanceM: cameraOn?.param1 ?? settings[0].triggerDistanceM,
      speedMps: settings[0].speedMps,
      legs: settings.map((s, gi) => ({ leg: gi + 1, ...s })),
      photoCount: line.stations.length,
      firstSeq,
      lastSeq: items.length - 1,
    });
  });
  // the return flies straight home from here: climb over the last line's end first where the ground on the way
  // needs it (the plan's return altitude), so the transit keeps the clearance whatever the autopilot's own return
  // altitude (which only ever raises it on the usual autopilots: check yours)
  const back = input.returnAltitudeAboveTakeoffM;
  // (set inside the callback above, which the compiler's narrowing does not follow)
  const finalEnd = lastEnd as { point: AlongPoint; altitudeM: number } | null;
  if (finalEnd && back !== undefined && Number.isFinite(back) && back > finalEnd.altitudeM + 0.5) positioned('transit', MavCmd.NAV_WAYPOINT, finalEnd.point, back, null, null, [0, 0, 0, null]);
  if (tilted) gimbal(null, 0);
  action('return', MavCmd.NAV_RETURN_TO_LAUNCH, null, null, [0, 0, 0, 0]);
  return { items, lines };
}

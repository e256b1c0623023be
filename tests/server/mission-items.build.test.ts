import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildMissionItems, degE7, type BuilderInput } from '../../server/mission-items/mission-items.build';
import type { MissionItem } from '../../contracts/mission-items';
import { builderLinesOf } from '../../server/mission-items/mission-items.view';
import { readMission, readResult } from '../../server/versions/result-view';
import { analysedResult, solvedMission, solvedResult, syntheticMission } from '../support/fixtures';
import { enumValue, startSimVehicle, type SimVehicle } from '../support/sim-vehicle';

// Enum values are looked up by name in the definitions the independent `mavlink` package (1.0.1) parsed from XML:
// its bundled common.xml, plus tests/fixtures/mavlink/mission-int.xml written from mavlink.io's common.xml.
let sim: SimVehicle;
let cmd: (name: string) => number;
beforeAll(async () => {
  sim = await startSimVehicle();
  cmd = (name) => enumValue(sim.codec, name);
});
afterAll(async () => sim?.stop());

const result = analysedResult();
const mission = syntheticMission();

function input(): BuilderInput {
  return {
    takeoff: mission.takeoff,
    lines: result.lines.map((l) => ({
      triggerDistanceM: result.summary.triggerDistanceM,
      speedMps: mission.speedMps ?? 10,
      stations: l.stations,
      legs: l.legs.map((g) => ({ ...g, speedMps: undefined, triggerDistanceM: undefined })),
    })),
  };
}

/** A straight line due east at 54° N: legs of `lengthsM` with the given own speeds and photo spacings, a station every 10 m from 5 m. */
function eastLine(legs: Array<{ lengthM: number; speedMps?: number; triggerDistanceM?: number }>) {
  const lonAt = (d: number) => d / 65_550; // about 65.5 km per degree of longitude at 54° N; the figure does not matter here
  let d = 0;
  const built = legs.map((g) => {
    const leg = { start: { lon: lonAt(d), lat: 54, distanceM: d }, end: { lon: lonAt(d + g.lengthM), lat: 54, distanceM: d + g.lengthM }, altitudeStartAboveTakeoffM: 80, altitudeEndAboveTakeoffM: 80, speedMps: g.speedMps, triggerDistanceM: g.triggerDistanceM };
    d += g.lengthM;
    return leg;
  });
  const stations = Array.from({ length: Math.floor((d - 5) / 10) + 1 }, (_, k) => ({ lon: lonAt(5 + 10 * k), lat: 54, distanceM: 5 + 10 * k }));
  return { triggerDistanceM: 25, speedMps: 10, stations, legs: built };
}

const kinds = (items: MissionItem[]) => items.map((i) => i.about.kind);

describe('mission items of a plan', () => {
  it('take off over the takeoff point, fly every line and return to launch, in MAVLink enum values', () => {
    const { items, lines } = buildMissionItems(input());
    expect(items.map((i) => i.seq)).toEqual(items.map((_, k) => k));
    expect(items[0].command).toBe(cmd('MAV_CMD_NAV_TAKEOFF'));
    expect(items[0].frame).toBe(cmd('MAV_FRAME_GLOBAL_RELATIVE_ALT_INT'));
    expect([items[0].x, items[0].y]).toEqual([degE7(mission.takeoff.lat), degE7(mission.takeoff.lon)]);
    expect(items[0].z).toBe(result.lines[0].legs[0].altitudeStartAboveTakeoffM);
    expect(items.at(-1)!.command).toBe(cmd('MAV_CMD_NAV_RETURN_TO_LAUNCH'));
    expect(lines).toHaveLength(result.lines.length);
    expect(items.filter((i) => i.command === cmd('MAV_CMD_NAV_WAYPOINT')).every((i) => i.frame === cmd('MAV_FRAME_GLOBAL_RELATIVE_ALT_INT'))).toBe(true);
    expect(items.filter((i) => i.command !== cmd('MAV_CMD_NAV_WAYPOINT') && i.command !== cmd('MAV_CMD_NAV_TAKEOFF')).every((i) => i.frame === cmd('MAV_FRAME_MISSION'))).toBe(true);
  });

  it('per line: start, ground speed, camera on at the first photo station with the trigger distance, legs, end, camera off', () => {
    const { items, lines } = buildMissionItems(input());
    result.lines.forEach((line, li) => {
      const own = items.slice(lines[li].firstSeq, lines[li].lastSeq + 1);
      expect(kinds(own)).toEqual(['line-start', 'speed', 'first-photo', 'camera-on', ...line.legs.slice(1).map(() => 'leg-change'), 'line-end', 'camera-off']);
      const speed = own[1];
      expect([speed.command, speed.param1, speed.param2, speed.param3]).toEqual([cmd('MAV_CMD_DO_CHANGE_SPEED'), cmd('SPEED_TYPE_GROUNDSPEED'), 10, -1]);
      const on = own[3];
      expect([on.command, on.param1, on.param3]).toEqual([cmd('MAV_CMD_DO_SET_CAM_TRIGG_DIST'), result.summary.triggerDistanceM, 1]);
      const off = own.at(-1)!;
      expect([off.command, off.param1]).toEqual([cmd('MAV_CMD_DO_SET_CAM_TRIGG_DIST'), 0]);
      const first = line.stations[0];
      expect([own[2].x, own[2].y]).toEqual([degE7(first.lat), degE7(first.lon)]);
      // hold mode: one level leg, so the first station's altitude is the leg's.
      expect(own[2].z).toBeCloseTo(line.stations[0].altitudeAboveTakeoffM, 6);
      const end = line.legs.at(-1)!;
      expect([own.at(-2)!.x, own.at(-2)!.y, own.at(-2)!.z]).toEqual([degE7(end.end.lat), degE7(end.end.lon), end.altitudeEndAboveTakeoffM]);
      expect(lines[li].photoCount).toBe(line.stations.length);
    });
  });

  it('changes speed only where a leg\'s own speed differs from the one in force, and sets it at every line start', () => {
    const line = eastLine([{ lengthM: 100 }, { lengthM: 100, speedMps: 6 }, { lengthM: 100, speedMps: 6 }, { lengthM: 100, speedMps: 10 }]);
    const { items, lines } = buildMissionItems({ takeoff: { lon: 0, lat: 54 }, lines: [line, line] });
    const speeds = items.filter((i) => i.about.kind === 'speed');
    // Line start at the line's 10 m/s, leg 2 slows to 6, leg 3 keeps it (no item), leg 4 is back at 10.
    expect(speeds.map((s) => [s.about.line, s.about.leg, s.param2])).toEqual([[1, 1, 10], [1, 2, 6], [1, 4, 10], [2, 1, 10], [2, 2, 6], [2, 4, 10]]);
    expect(speeds.every((s) => s.command === cmd('MAV_CMD_DO_CHANGE_SPEED') && s.param1 === cmd('SPEED_TYPE_GROUNDSPEED'))).toBe(true);
    expect(lines[0].legs.map((g) => g.speedMps)).toEqual([10, 6, 6, 10]);
  });

  it('sets a leg\'s own photo spacing where it differs once the camera runs, with one photo at the change', () => {
    const line = eastLine([{ lengthM: 100, triggerDistanceM: 30 }, { lengthM: 100, triggerDistanceM: 30 }, { lengthM: 100, triggerDistanceM: 18.5 }, { lengthM: 100 }]);
    const { items, lines } = buildMissionItems({ takeoff: { lon: 0, lat: 54 }, lines: [line] });
    const trig = items.filter((i) => i.command === cmd('MAV_CMD_DO_SET_CAM_TRIGG_DIST'));
    // common.xml, MAV_CMD_DO_SET_CAM_TRIGG_DIST: param1 distance (0 stops), param3 1 = trigger once immediately.
    expect(trig.map((t) => [t.about.kind, t.about.leg, t.param1, t.param3])).toEqual([['camera-on', 1, 30, 1], ['camera-spacing', 3, 18.5, 1], ['camera-off', 4, 0, 0]]);
    // A leg without a spacing of its own keeps the one in force.
    expect(lines[0].legs.map((g) => g.triggerDistanceM)).toEqual([30, 30, 18.5, 18.5]);
    expect(lines[0].triggerDistanceM).toBe(30);
    // The spacing item follows the waypoint where leg 3 starts (a DO command runs once the NAV item before it is reached).
    const at = items.findIndex((i) => i.about.kind === 'camera-spacing');
    expect([items[at - 1].about.kind, items[at - 1].about.leg, items[at - 1].command]).toEqual(['leg-change', 3, cmd('MAV_CMD_NAV_WAYPOINT')]);
  });

  it('a solved plan flies each leg at its own speed with the camera at the leg\'s tightest photo spacing', () => {
    const solved = solvedResult();
    const view = readResult(solved);
    const { items, lines } = buildMissionItems({ takeoff: readMission(solvedMission()).takeoff, lines: builderLinesOf(view, readMission(solvedMission()), 1) });
    const WP = cmd('MAV_CMD_NAV_WAYPOINT');
    const SPEED = cmd('MAV_CMD_DO_CHANGE_SPEED');
    const TRIGG = cmd('MAV_CMD_DO_SET_CAM_TRIGG_DIST');
    let changes = 0;
    view.lines.forEach((line, li) => {
      const own = items.slice(lines[li].firstSeq, lines[li].lastSeq + 1);
      // Play the line's items in order: what is in force at each waypoint once the DO commands after it have run.
      let speed = NaN;
      let camera = 0;
      const inForce: Array<{ leg: number; speed: number; camera: number }> = [];
      own.forEach((it, k) => {
        if (it.command === SPEED) speed = it.param2!;
        if (it.command === TRIGG) camera = it.param1!;
        const next = own[k + 1];
        if ((next === undefined || next.command === WP) && own.slice(0, k + 1).some((x) => x.command === WP)) {
          const wp = [...own.slice(0, k + 1)].reverse().find((x) => x.command === WP)!;
          if (wp.about.kind !== 'line-end') inForce.push({ leg: wp.about.leg!, speed, camera });
        }
      });
      const legs = solved.lines[li].legs;
      for (const f of inForce) {
        const g = legs[f.leg - 1];
        expect(f.speed).toBe(g.speedMps);
        if (f.camera !== 0) expect(f.camera).toBe(g.triggerDistanceM!.min);
      }
      // The camera runs from the first photo station's leg to the line end.
      expect(own.filter((i) => i.about.kind === 'camera-on')).toHaveLength(1);
      expect(own.at(-1)!.about.kind).toBe('camera-off');
      // Speed items: one at the line start and one at each leg whose speed differs from the leg before.
      const speedChanges = legs.slice(1).filter((g, k) => g.speedMps !== legs[k].speedMps).length;
      expect(own.filter((i) => i.command === SPEED)).toHaveLength(1 + speedChanges);
      changes += speedChanges;
      expect(lines[li].legs.map((g) => [g.speedMps, g.triggerDistanceM])).toEqual(legs.map((g) => [g.speedMps, g.triggerDistanceM!.min]));
    });
    // The fixture's slow climb limit slows some legs over the hill (else this test would not test speed changes).
    expect(changes).toBeGreaterThan(0);
  });

  it('puts a camera-on point between the legs it falls on, with the altitude of the leg under it', () => {
    const line = {
      triggerDistanceM: 25,
      speedMps: 8,
      stations: [{ lon: 0.0006, lat: 54, distanceM: 40 }],
      legs: [
        { start: { lon: 0, lat: 54, distanceM: 0 }, end: { lon: 0.0003, lat: 54, distanceM: 20 }, altitudeStartAboveTakeoffM: 100, altitudeEndAboveTakeoffM: 100 },
        { start: { lon: 0.0003, lat: 54, distanceM: 20 }, end: { lon: 0.0009, lat: 54, distanceM: 60 }, altitudeStartAboveTakeoffM: 100, altitudeEndAboveTakeoffM: 120 },
      ],
    };
    const { items } = buildMissionItems({ takeoff: { lon: 0, lat: 54 }, lines: [line] });
    expect(kinds(items)).toEqual(['takeoff', 'line-start', 'speed', 'leg-change', 'first-photo', 'camera-on', 'line-end', 'camera-off', 'return']);
    expect(items[4].z).toBeCloseTo(110, 9);
  });

  it('holds each transit between lines at the higher of their altitudes: climb over the last line\'s end, or arrive over the next start and descend', () => {
    // three short level lines due east at 54° N, flown at 100, 60 and 60 m above takeoff, then back up to 90 m
    const level = (lon0: number, altM: number) => ({
      triggerDistanceM: 10, speedMps: 8, stations: [{ lon: lon0 + 0.0001, lat: 54, distanceM: 6.6 }],
      legs: [{ start: { lon: lon0, lat: 54, distanceM: 0 }, end: { lon: lon0 + 0.0003, lat: 54, distanceM: 19.7 }, altitudeStartAboveTakeoffM: altM, altitudeEndAboveTakeoffM: altM }],
    });
    const lines = [level(0, 100), level(0.001, 60), level(0.002, 60.3), level(0.003, 90)];
    const { items } = buildMissionItems({ takeoff: { lon: 0, lat: 54 }, lines });
    const transits = items.filter((i) => i.about.kind === 'transit');
    expect(transits.every((t) => t.command === cmd('MAV_CMD_NAV_WAYPOINT') && t.about.line === null)).toBe(true);
    // 100 -> 60: level at 100 m to over the second line's start, then down; 60 -> 60.3: none (under half a metre);
    // 60.3 -> 90: up to 90 m over the third line's end, then level
    expect(transits.map((t) => [t.x, t.y, t.z])).toEqual([
      [degE7(54), degE7(0.001), 100],
      [degE7(54), degE7(0.0023), 90],
    ]);
    // each sits just before the line it leads to
    for (const t of transits) expect(items[t.seq + 1].about.kind).toBe('line-start');
  });

  it('climbs over the last line\'s end to the plan\'s return altitude before the return when the way home needs it', () => {
    const level = { triggerDistanceM: 10, speedMps: 8, stations: [{ lon: 0.0011, lat: 54, distanceM: 6.6 }], legs: [{ start: { lon: 0.001, lat: 54, distanceM: 0 }, end: { lon: 0.0013, lat: 54, distanceM: 19.7 }, altitudeStartAboveTakeoffM: 80, altitudeEndAboveTakeoffM: 80 }] };
    // a ridge on the way home: the plan says 86.4 m above takeoff keeps the clearance
    const up = buildMissionItems({ takeoff: { lon: 0, lat: 54 }, lines: [level], returnAltitudeAboveTakeoffM: 86.4 }).items;
    expect(kinds(up).slice(-2)).toEqual(['transit', 'return']);
    const t = up[up.length - 2];
    expect([t.command, t.x, t.y, t.z, t.about.line]).toEqual([cmd('MAV_CMD_NAV_WAYPOINT'), degE7(54), degE7(0.0013), 86.4, null]);
    // no climb when the end's own altitude already keeps it (or within half a metre of it), nor when the plan has no figure (stored before)
    for (const returnAltitudeAboveTakeoffM of [80, 80.4, undefined]) {
      expect(kinds(buildMissionItems({ takeoff: { lon: 0, lat: 54 }, lines: [level], returnAltitudeAboveTakeoffM }).items).slice(-2)).toEqual(['camera-off', 'return']);
    }
  });

  it('points the gimbal before each line of a plan with tilted-camera lines, and straight down before the return', () => {
    // common.xml, MAV_CMD_DO_GIMBAL_MANAGER_PITCHYAW: param1 pitch in degrees, positive up (so -90 is straight down
    // and a camera tilted 35° towards the nose from straight down is at -55), param2 yaw, param3-4 rates (NaN unset)
    const tilted = { takeoff: { lon: 0, lat: 54 }, lines: [{ ...eastLine([{ lengthM: 100 }]), cameraTiltDeg: 35 }, eastLine([{ lengthM: 100 }])] };
    const { items, lines } = buildMissionItems(tilted);
    const gimbal = items.filter((i) => i.command === cmd('MAV_CMD_DO_GIMBAL_MANAGER_PITCHYAW'));
    expect(gimbal.map((g) => [g.about.kind, g.about.line, g.param1, g.param2, g.param3, g.param4, g.frame])).toEqual([
      ['camera-tilt', 1, -55, 0, null, null, cmd('MAV_FRAME_MISSION')],
      ['camera-tilt', 2, -90, 0, null, null, cmd('MAV_FRAME_MISSION')],
      ['camera-tilt', null, -90, 0, null, null, cmd('MAV_FRAME_MISSION')],
    ]);
    // each line's comes before its start waypoint (a DO item runs once the NAV item before it is reached) and is
    // counted in the line's items; the last just before the return
    for (const [k, l] of lines.entries()) {
      expect(items[l.firstSeq]).toBe(gimbal[k]);
      expect(items[l.firstSeq + 1].about.kind).toBe('line-start');
    }
    expect(items.at(-2)).toBe(gimbal[2]);
    expect(items.at(-1)!.command).toBe(cmd('MAV_CMD_NAV_RETURN_TO_LAUNCH'));
    // a plan of nadir lines carries no gimbal item
    expect(buildMissionItems({ takeoff: { lon: 0, lat: 54 }, lines: [eastLine([{ lengthM: 100 }])] }).items.some((i) => i.about.kind === 'camera-tilt')).toBe(false);
  });

  it('does not mutate its input', () => {
    const i = input();
    const before = JSON.stringify(i);
    buildMissionItems(i);
    expect(JSON.stringify(i)).toBe(before);
  });
});

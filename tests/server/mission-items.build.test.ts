import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildMissionItems, degE7, type BuilderInput } from '../../server/mission-items/mission-items.build';
import type { MissionItem } from '../../contracts/mission-items';
import { analysedResult, syntheticMission } from '../support/fixtures';
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

function input(overrides: { legSpeed?: number } = {}): BuilderInput {
  return {
    takeoff: mission.takeoff,
    lines: result.lines.map((l) => ({
      triggerDistanceM: result.summary.triggerDistanceM,
      speedMps: mission.speedMps ?? 10,
      stations: l.stations,
      legs: l.legs.map((g, i) => ({ ...g, speedMps: i === 1 ? overrides.legSpeed : undefined })),
    })),
  };
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

  it('changes speed on a leg that states its own speed', () => {
    const { items } = buildMissionItems({ ...input({ legSpeed: 6 }), lines: input({ legSpeed: 6 }).lines.map((l) => ({ ...l, legs: [l.legs[0], { ...l.legs[0], start: l.legs[0].end, end: { ...l.legs[0].end, distanceM: l.legs[0].end.distanceM + 50 }, speedMps: 6 }] })) });
    const speeds = items.filter((i) => i.about.kind === 'speed');
    expect(speeds.map((s) => s.param2)).toEqual(result.lines.flatMap(() => [10, 6]));
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

  it('does not mutate its input', () => {
    const i = input();
    const before = JSON.stringify(i);
    buildMissionItems(i);
    expect(JSON.stringify(i)).toBe(before);
  });
});

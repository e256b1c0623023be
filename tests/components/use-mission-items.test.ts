import { describe, expect, it } from 'vitest';
import type { MissionItems } from '../../contracts/mission-items';
import { ApiError } from '../../components/api/api-error';
import { handoffLineOf, handoffLineText, itemRowOf, itemRowText, missionHandoffOf, rangeText } from '../../components/flights/use-mission-items';
import { buildMissionItems } from '../../server/mission-items/mission-items.build';

// One line due east at 54° N, three legs: the second slower and with tighter photos (as a solved plan states them).
const at = (d: number) => ({ lon: d / 65_550, lat: 54, distanceM: d });
const built = buildMissionItems({
  takeoff: { lon: 0, lat: 54 },
  lines: [{
    triggerDistanceM: 25, speedMps: 10, stations: [at(5), at(30), at(55)],
    legs: [
      { start: at(0), end: at(100), altitudeStartAboveTakeoffM: 80, altitudeEndAboveTakeoffM: 80, speedMps: 10, triggerDistanceM: 24.5 },
      { start: at(100), end: at(200), altitudeStartAboveTakeoffM: 80, altitudeEndAboveTakeoffM: 95.25, speedMps: 6.25, triggerDistanceM: 19.75 },
      { start: at(200), end: at(300), altitudeStartAboveTakeoffM: 95.25, altitudeEndAboveTakeoffM: 95.25, speedMps: 10, triggerDistanceM: 24.5 },
    ],
  }],
});

const data = {
  items: built.items,
  altitude: { frameName: 'MAV_FRAME_GLOBAL_RELATIVE_ALT_INT', reference: 'metres above the takeoff point' },
  lines: built.lines,
  cautions: ['Arm at the takeoff point.'],
} as unknown as MissionItems;
const base = { signedOff: true, offline: false, teamId: 't1', versionId: 'v 1', loading: false };

describe('the leg sheet hand-off card state', () => {
  it('shows the item count, frame, lines and a download of the file for a signed-off version', () => {
    const h = missionHandoffOf({ ...base, data });
    expect(h).toMatchObject({ kind: 'ready', itemCount: 14, frameName: 'MAV_FRAME_GLOBAL_RELATIVE_ALT_INT', downloadHref: '/api/teams/t1/flights/v%201/mission-items?download=1' });
  });

  it('counts the photos recorded as flown and names the latest', () => {
    const t = (capturedAt: string) => ({ imageIndex: 0, lat: 0, lon: 0, altitudeAboveTakeoffM: 0, altitudeMslM: 0, rollDeg: 0, pitchDeg: 0, yawDeg: 0, capturedAt });
    const h = missionHandoffOf({ ...base, data, triggers: [t('2026-12-02T10:00:05Z'), t('2026-12-02T10:00:09Z'), t('2026-12-02T10:00:01Z')] });
    expect(h).toMatchObject({ recorded: { count: 3, lastAt: '2026-12-02T10:00:09Z' } });
    expect(missionHandoffOf({ ...base, data })).toMatchObject({ recorded: null });
  });

  it('offers nothing for a version that is not signed off, even with data at hand', () => {
    expect(missionHandoffOf({ ...base, signedOff: false, data }).kind).toBe('unavailable');
  });

  it('keeps items already loaded when the connection drops, and says the connection is needed otherwise', () => {
    expect(missionHandoffOf({ ...base, offline: true, data }).kind).toBe('ready');
    expect(missionHandoffOf({ ...base, offline: true })).toEqual({ kind: 'unavailable', reason: 'Mission items need the connection back.' });
  });

  it('passes the server\'s refusal on', () => {
    const h = missionHandoffOf({ ...base, error: new ApiError(409, 'not_signed_off', 'Version 2 is not signed off.') });
    expect(h).toEqual({ kind: 'error', message: expect.stringContaining('Version 2 is not signed off.') });
  });
});

describe('the hand-off card\'s lines and item rows', () => {
  it('shows a line\'s photo spacing and speed as ranges when its legs differ', () => {
    const l = handoffLineOf(built.lines[0]);
    expect(l).toMatchObject({ triggerDistanceM: { min: 19.75, max: 24.5 }, speedMps: { min: 6.25, max: 10 }, perLeg: true, photoCount: 3 });
    expect(rangeText(l.speedMps, (v) => `${v} m/s`)).toBe('6.25 m/s–10 m/s');
    const one = handoffLineOf({ ...built.lines[0], legs: built.lines[0].legs.map((g) => ({ ...g, speedMps: 10, triggerDistanceM: 24.5 })) });
    expect(one.perLeg).toBe(false);
    expect(rangeText(one.triggerDistanceM, (v) => `${v} m`)).toBe('24.5 m');
  });

  it('writes every item in one short row naming its height reference, in metres or feet', () => {
    const rows = built.items.map(itemRowOf);
    expect(rows.map((r) => itemRowText(r, 'metric'))).toEqual([
      '0 NAV_TAKEOFF · 80.0 m above takeoff',
      '1 NAV_WAYPOINT · line 1 leg 1 · 80.0 m above takeoff',
      '2 DO_CHANGE_SPEED · line 1 leg 1 · 10.00 m/s',
      '3 NAV_WAYPOINT · line 1 leg 1 · 80.0 m above takeoff',
      '4 DO_SET_CAM_TRIGG_DIST · line 1 leg 1 · a photo every 24.50 m',
      '5 NAV_WAYPOINT · line 1 leg 2 · 80.0 m above takeoff',
      '6 DO_CHANGE_SPEED · line 1 leg 2 · 6.25 m/s',
      '7 DO_SET_CAM_TRIGG_DIST · line 1 leg 2 · a photo every 19.75 m',
      '8 NAV_WAYPOINT · line 1 leg 3 · 95.3 m above takeoff',
      '9 DO_CHANGE_SPEED · line 1 leg 3 · 10.00 m/s',
      '10 DO_SET_CAM_TRIGG_DIST · line 1 leg 3 · a photo every 24.50 m',
      '11 NAV_WAYPOINT · line 1 leg 3 · 95.3 m above takeoff',
      '12 DO_SET_CAM_TRIGG_DIST · line 1 leg 3 · camera off',
      '13 NAV_RETURN_TO_LAUNCH',
    ]);
    // 80 m is 262.5 ft (0.3048 m to the foot, exact by definition).
    expect(itemRowText(rows[1], 'imperial')).toBe('1 NAV_WAYPOINT · line 1 leg 1 · 262.5 ft above takeoff');
  });
});

describe('the hand-off card for oblique capture and spot photos', () => {
  // Two tilted lines and a spot photo's one-photo hover between them, as a slant plan's solver lays them out.
  const tilted = buildMissionItems({
    takeoff: { lon: 0, lat: 54 },
    lines: [
      { triggerDistanceM: 25, speedMps: 10, cameraTiltDeg: 35, stations: [at(5), at(30)], legs: [{ start: at(0), end: at(100), altitudeStartAboveTakeoffM: 60, altitudeEndAboveTakeoffM: 60 }] },
      { triggerDistanceM: 25, speedMps: 8, stations: [at(150.5)], legs: [{ start: at(150), end: at(151), altitudeStartAboveTakeoffM: 40, altitudeEndAboveTakeoffM: 40 }] },
      { triggerDistanceM: 25, speedMps: 10, cameraTiltDeg: 35, stations: [at(205), at(230)], legs: [{ start: at(200), end: at(300), altitudeStartAboveTakeoffM: 60, altitudeEndAboveTakeoffM: 60 }] },
    ],
  });

  it('names the camera each gimbal item sets, from the item\'s own pitch (−90° straight down)', () => {
    const lines = tilted.lines.map((l) => handoffLineOf(l, tilted.items));
    expect(lines.map((l) => l.cameraTiltDeg)).toEqual([35, 0, 35]);
    expect(handoffLineText(lines[0]!, 'metric')).toBe(`Line 1: a photo every 25.0 m at 10.0 m/s, camera tilted 35° (2 photos, items ${lines[0]!.firstSeq}–${lines[0]!.lastSeq})`);
    // a spot photo's hover: one photo, not "a photo every 25 m" of a line that has one
    expect(handoffLineText(lines[1]!, 'metric')).toBe(`Line 2: one photo at 8.0 m/s, camera straight down (items ${lines[1]!.firstSeq}–${lines[1]!.lastSeq})`);
    const gimbalRows = tilted.items.filter((i) => i.about.kind === 'camera-tilt').map((i) => itemRowText(itemRowOf(i), 'metric'));
    expect(gimbalRows[0]).toMatch(/^\d+ DO_GIMBAL_MANAGER_PITCHYAW · line 1 leg 1 · gimbal pitch -55° from the horizon \(tilted 35° from straight down\)$/);
    expect(gimbalRows.at(-1)).toMatch(/^\d+ DO_GIMBAL_MANAGER_PITCHYAW · gimbal pitch -90° from the horizon \(straight down\)$/);
  });

  it('says nothing of the camera in a plan without gimbal items', () => {
    const l = handoffLineOf(built.lines[0]!, built.items);
    expect(l.cameraTiltDeg).toBeNull();
    expect(handoffLineText(l, 'metric')).not.toContain('camera');
  });
});

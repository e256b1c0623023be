import { describe, expect, it } from 'vitest';
import type { MissionItems } from '../../contracts/mission-items';
import { ApiError } from '../../components/api/api-error';
import { missionHandoffOf } from '../../components/flights/use-mission-items';

const data = {
  items: [{}, {}, {}],
  altitude: { frameName: 'MAV_FRAME_GLOBAL_RELATIVE_ALT_INT', reference: 'metres above the takeoff point' },
  lines: [{ number: 1, triggerDistanceM: 21.9, speedMps: 10, photoCount: 30, firstSeq: 1, lastSeq: 7 }],
  cautions: ['Arm at the takeoff point.'],
} as unknown as MissionItems;
const base = { signedOff: true, offline: false, teamId: 't1', versionId: 'v 1', loading: false };

describe('the leg sheet hand-off card state', () => {
  it('shows the item count, frame, lines and a download of the file for a signed-off version', () => {
    const h = missionHandoffOf({ ...base, data });
    expect(h).toMatchObject({ kind: 'ready', itemCount: 3, frameName: 'MAV_FRAME_GLOBAL_RELATIVE_ALT_INT', downloadHref: '/api/teams/t1/flights/v%201/mission-items?download=1' });
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

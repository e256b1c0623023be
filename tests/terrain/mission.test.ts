import { describe, expect, it } from 'vitest';
import { MISSION_DEFAULTS, checkArea, resolveMission } from '../../terrain/mission';
import { ringAreaM2 } from '../../terrain/survey-area';
import { TerrainError } from '../../terrain/errors';

import { baseMission } from './plan-fixtures';

const square = (lon: number, lat: number, d: number) => [[[lon, lat], [lon + d, lat], [lon + d, lat + d], [lon, lat + d], [lon, lat]]];

describe('resolveMission', () => {
  it('fills every optional field with its default', () => {
    const m = resolveMission(baseMission());
    for (const [k, v] of Object.entries(MISSION_DEFAULTS)) expect((m as unknown as Record<string, unknown>)[k]).toEqual(v);
    expect(m.targetGsdCm).toBe(3);
    expect(m.maxAglM).toBe(120);
  });

  it('keeps given values and normalises a 360° heading to 0', () => {
    const m = resolveMission({ ...baseMission(), headingDeg: 360, mode: 'steps', forwardOverlap: 0.75, stationStepM: 2 });
    expect(m.headingDeg).toBe(0);
    expect(m.mode).toBe('steps');
    expect(m.forwardOverlap).toBe(0.75);
    expect(m.stationStepM).toBe(2);
  });

  it('throws invalid-input with the field, the range and the value when a number is out of range', () => {
    const cases: Array<[Record<string, unknown>, RegExp]> = [
      [{ targetGsdCm: 0 }, /targetGsdCm must be a number from 0\.1 to 100, got 0/],
      [{ forwardOverlap: 80 }, /forwardOverlap .* got 80/], // percent instead of fraction
      [{ sideOverlap: -0.1 }, /sideOverlap/],
      [{ maxAglM: 0 }, /maxAglM must be a number above 0/],
      [{ speedMps: 'fast' }, /speedMps .* got "fast"/],
      [{ maxLegsPerLine: 2.5 }, /maxLegsPerLine must be a whole number/],
      [{ headingDeg: 'north' }, /headingDeg/],
      [{ mode: 'terrain' }, /mode must be "hold", "steps" or "follow"/],
      [{ clearanceM: 100, obstacleAllowanceM: 30 }, /clearance plus obstacle allowance \(130 m\) must be below the maximum height above ground \(120 m\)/],
      [{ takeoff: { lon: 10 } }, /takeoff must be/],
      [{ camera: { sensorWidthMm: 13.2 } }, /camera\./],
      [{ batteryReserve: 1 }, /batteryReserve/],
    ];
    for (const [patch, re] of cases) {
      const run = () => resolveMission({ ...baseMission(), ...patch });
      expect(run, JSON.stringify(patch)).toThrow(TerrainError);
      expect(run, JSON.stringify(patch)).toThrow(re);
      try { run(); } catch (e) { expect((e as TerrainError).code).toBe('invalid-input'); }
    }
    expect(() => resolveMission(null)).toThrow(/JSON object/);
  });

  it('does not mutate its input', () => {
    const input = { ...baseMission(), headingDeg: 360 };
    const copy = JSON.parse(JSON.stringify(input));
    resolveMission(input);
    expect(input).toEqual(copy);
  });
});

describe('checkArea', () => {
  it('accepts a closed simple polygon, with a hole', () => {
    const outer = square(10, 45, 0.01)[0];
    const hole = [[10.004, 45.004], [10.004, 45.006], [10.006, 45.006], [10.006, 45.004], [10.004, 45.004]];
    expect(() => checkArea({ type: 'Polygon', coordinates: [outer, hole] })).not.toThrow();
  });

  it('refuses open rings, self-crossing rings, bad positions, empty and oversized areas', () => {
    const bow = [[10, 45], [10.01, 45.01], [10.01, 45], [10, 45.01], [10, 45]];
    const cases: Array<[unknown, RegExp]> = [
      [{ type: 'Point', coordinates: [10, 45] }, /GeoJSON Polygon/],
      [{ type: 'Polygon', coordinates: [[[10, 45], [10.01, 45], [10.01, 45.01], [10, 45.01]]] }, /closed/],
      [{ type: 'Polygon', coordinates: [bow] }, /crosses itself/],
      [{ type: 'Polygon', coordinates: [[[10, 45], [200, 45], [10, 46], [10, 45]]] }, /lon in -180\.\.180/],
      [{ type: 'Polygon', coordinates: [[[10, 45], [10.01, 45], [10.02, 45], [10, 45]]] }, /encloses no ground/],
      [{ type: 'Polygon', coordinates: square(10, 45, 0.2) }, /km², more than the 100 km²/],
      [{ type: 'Polygon', coordinates: [[[10, 45], [10, 45]]] }, /at least 4 positions/],
    ];
    for (const [area, re] of cases) expect(() => checkArea(area), JSON.stringify(area).slice(0, 60)).toThrow(re);
  });

  it('measures ring area on the sphere: a 0.01° square at 45° N is about 0.874 km²', () => {
    // Reference computed by hand on a sphere of radius 6371008.8 m:
    // R² · Δλ · (sin 45.01° - sin 45°) = 0.8744 km² (an ellipsoidal area differs by ~0.3 %).
    const R = 6371008.8;
    const ref = R * R * (0.01 * Math.PI / 180) * (Math.sin(45.01 * Math.PI / 180) - Math.sin(45 * Math.PI / 180));
    expect(ringAreaM2(square(10, 45, 0.01)[0])).toBeCloseTo(ref, 0);
    expect(ref / 1e6).toBeCloseTo(0.8744, 3);
  });
});

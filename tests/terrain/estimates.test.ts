import { describe, expect, it } from 'vitest';
import { estimateMission } from '../../terrain/estimates';
import { TerrainError } from '../../terrain/errors';

const base = { photoCount: 500, lineDistanceM: 12_000, transitDistanceM: 1_000, lineCount: 10, speedMps: 10, turnTimeS: 8, enduranceMin: 20, batteryReserve: 0.25 };

describe('estimateMission', () => {
  it('adds distance over speed, a turn per change of line and the vertical legs at the vertical speeds (by hand)', () => {
    const e = estimateMission({ ...base, climbM: 90, climbMps: 3, descentM: 60, descentMps: 2 });
    // 13 000 m / 10 m/s = 1300 s; 9 turns x 8 s = 72 s; 90/3 + 60/2 = 60 s
    expect(e.flightDistanceM).toBe(13_000);
    expect(e.flightTimeS).toBeCloseTo(1432, 9);
    expect(e.photoCount).toBe(500);
  });

  it('counts batteries from the endurance less the reserve, rounding up', () => {
    const e = estimateMission(base); // 1372 s; 20 min x 0.75 = 900 s usable
    expect(e.usablePerBatteryS).toBe(900);
    expect(e.batteries).toBe(2);
    expect(estimateMission({ ...base, lineDistanceM: 7_000, transitDistanceM: 1_280, turnTimeS: 0 }).batteries).toBe(1); // 828 s
    expect(estimateMission({ ...base, lineDistanceM: 0, transitDistanceM: 0, lineCount: 0 }).batteries).toBe(1);
  });

  it('throws invalid-input on impossible figures', () => {
    expect(() => estimateMission({ ...base, speedMps: 0 })).toThrow(TerrainError);
    expect(() => estimateMission({ ...base, batteryReserve: 1 })).toThrow(/reserve/);
    expect(() => estimateMission({ ...base, enduranceMin: -1 })).toThrow(/endurance/);
    expect(() => estimateMission({ ...base, lineDistanceM: -5 })).toThrow(TerrainError);
  });
});

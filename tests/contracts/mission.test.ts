import { describe, expect, it } from 'vitest';
import { missionSchema } from '../../contracts/mission';
import { resolveMission, type Mission } from '../../terrain/mission';
import { baseMission } from '../terrain/plan-fixtures';

describe('mission contract', () => {
  it('applies the same defaults as the terrain core', () => {
    const parsed = missionSchema.parse(baseMission());
    const resolved: Mission = resolveMission(baseMission());
    expect(parsed).toEqual(resolved);
  });

  it('accepts exactly what the terrain core accepts', () => {
    const patches: Array<Record<string, unknown>> = [
      {}, { targetGsdCm: 0 }, { forwardOverlap: 0.95 }, { forwardOverlap: 0.951 }, { headingDeg: 'advise' }, { headingDeg: -1 },
      { maxAglM: 0 }, { maxLegsPerLine: 1 }, { maxLegsPerLine: 1.5 }, { clearanceM: 119 }, { clearanceM: 120 }, { stationStepM: null },
      { stationStepM: 0.1 }, { mode: 'hold' }, { mode: 'up' }, { batteryReserve: 0.9 }, { speedMps: 60 }, { speedMps: 61 },
      { area: { type: 'Polygon', coordinates: [[[10, 45], [10.01, 45.01], [10.01, 45], [10, 45.01], [10, 45]]] } },
      { camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472.5, imageHeightPx: 3648 } },
    ];
    for (const p of patches) {
      const input = { ...baseMission(), ...p };
      let coreOk = true;
      try { resolveMission(input); } catch { coreOk = false; }
      expect(missionSchema.safeParse(input).success, JSON.stringify(p)).toBe(coreOk);
    }
  });

  it('says what is wrong in its messages', () => {
    const r = missionSchema.safeParse({ ...baseMission(), forwardOverlap: 80 });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].message).toMatch(/forwardOverlap must be a number from 0 to 0\.95/);
    const a = missionSchema.safeParse({ ...baseMission(), area: { type: 'Polygon', coordinates: [[[10, 45], [10.01, 45.01], [10.01, 45], [10, 45.01], [10, 45]]] } });
    expect(a.error!.issues[0].message).toMatch(/crosses itself/);
  });
});

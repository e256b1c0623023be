import { describe, expect, it } from 'vitest';
import { planResultSchema } from '../../contracts/plan-result';
import { TerrainError } from '../../terrain/errors';
import { analysePlan } from '../../terrain/plan';
import { lonLatOf, missionOver, utmGrid } from './plan-fixtures';

// A grid whose northern strip has no data (as where a source survey did not reach), east-west lines over it.
const holeF = (_x: number, y: number) => (y > 500 ? NaN : 300 + 0.02 * y);
const holed = utmGrid({ width: 800, height: 800, f: holeF });

describe('analysePlan over ground the grid does not know', () => {
  it('leaves out lines with no known ground at all, says so, and still meets the result contract', () => {
    const r = analysePlan(holed, missionOver(holed, 150, 150, 650, 700, { headingDeg: 90, mode: 'follow' }));
    expect(() => planResultSchema.parse(r)).not.toThrow();
    const leftOut = r.warnings.find((w) => w.code === 'lines-left-out');
    expect(leftOut?.message).toMatch(/entirely over ground the grid has no data for/);
    const full = analysePlan(
      utmGrid({ width: 800, height: 800, f: (x, y) => holeF(x, Math.min(y, 500)) }),
      missionOver(holed, 150, 150, 650, 700, { headingDeg: 90, mode: 'follow' }),
    );
    expect(r.lines.length).toBeLessThan(full.lines.length);
    for (const l of r.lines) for (const s of l.stations) expect(Number.isFinite(s.altitudeM)).toBe(true);
  });

  it('refuses an area with no known ground under any line', () => {
    const [lon, lat] = lonLatOf(holed, 300, 300);
    let err: unknown;
    try {
      analysePlan(holed, missionOver(holed, 150, 560, 650, 750, { headingDeg: 90, takeoff: { lon, lat } }));
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(TerrainError);
    expect((err as TerrainError).code).toBe('all-nodata');
    expect((err as TerrainError).message).toMatch(/no data under any flight line/);
  });
});

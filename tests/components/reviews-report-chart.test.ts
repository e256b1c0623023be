import { describe, expect, it } from 'vitest';
import { gsdChartGeometry, type ChartBox } from '../../components/reports/gsd-chart-geometry';
import { niceStep } from '../../contracts/format/ticks';

const box: ChartBox = { widthPx: 300, heightPx: 150, padLeftPx: 40, padRightPx: 10, padTopPx: 10, padBottomPx: 40 };

describe('GSD chart geometry (compliance report)', () => {
  it('picks 1, 2 or 5 times a power of ten as the tick step (Heckbert, Graphics Gems 1990)', () => {
    expect(niceStep(10, 4)).toBe(5); // raw 2.5 → 5
    expect(niceStep(1, 4)).toBeCloseTo(0.5, 12); // raw 0.25 → 0.5
    expect(niceStep(700, 4)).toBe(200); // raw 175 → 200
    expect(niceStep(0.4, 4)).toBeCloseTo(0.1, 12); // raw 0.1 → 0.1
  });

  it('maps the first station to the left edge and the last to the right edge of the plot', () => {
    const g = gsdChartGeometry(
      [
        { distanceM: 0, gsdCm: 3 },
        { distanceM: 700, gsdCm: 3 },
      ],
      [2.7, 3.3],
      3,
      box,
    );
    expect(g.path).toBe(`M40,${Math.round(g.targetY! * 10) / 10}L290,${Math.round(g.targetY! * 10) / 10}`);
  });

  it('draws a line that stays inside the band inside the band rectangle', () => {
    const pts = Array.from({ length: 20 }, (_, i) => ({ distanceM: i * 10, gsdCm: 2.8 + (i % 5) * 0.1 }));
    const g = gsdChartGeometry(pts, [2.7, 3.3], 3, box);
    const ys = [...g.path.matchAll(/[ML][\d.]+,([\d.]+)/g)].map((m) => Number(m[1]));
    expect(ys).toHaveLength(20);
    for (const y of ys) {
      expect(y).toBeGreaterThanOrEqual(g.band!.y - 0.1);
      expect(y).toBeLessThanOrEqual(g.band!.y + g.band!.height + 0.1);
    }
  });

  it('breaks the line where stations have no GSD and reports the gap', () => {
    const g = gsdChartGeometry(
      [
        { distanceM: 0, gsdCm: 3 },
        { distanceM: 10, gsdCm: 3.1 },
        { distanceM: 20, gsdCm: null },
        { distanceM: 30, gsdCm: 2.9 },
        { distanceM: 40, gsdCm: null },
        { distanceM: 50, gsdCm: 3 },
        { distanceM: 60, gsdCm: 3 },
      ],
      [2.7, 3.3],
      3,
      box,
    );
    expect(g.path.match(/M/g)).toHaveLength(2);
    expect(g.dots).toHaveLength(1);
    expect(g.gaps).toHaveLength(2);
    expect(g.gaps[0]!.x0).toBeCloseTo(40 + (20 / 60) * 250, 6);
    expect(g.gaps[0]!.x1).toBeCloseTo(40 + (30 / 60) * 250, 6);
  });

  it('keeps the band in view when the data sit far outside it', () => {
    const g = gsdChartGeometry([{ distanceM: 0, gsdCm: 6 }, { distanceM: 10, gsdCm: 6.2 }], [2.7, 3.3], 3, box);
    expect(g.domainCm[0]).toBeLessThanOrEqual(2.7);
    expect(g.domainCm[1]).toBeGreaterThanOrEqual(6.2);
    expect(g.band).not.toBeNull();
  });

  it('does not mutate the points', () => {
    const pts = [{ distanceM: 0, gsdCm: 3 }, { distanceM: 5, gsdCm: null }];
    const copy = structuredClone(pts);
    gsdChartGeometry(pts, [2.7, 3.3], 3, box);
    expect(pts).toEqual(copy);
  });
});

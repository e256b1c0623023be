import { describe, expect, it } from 'vitest';
import { adviseHeading, evaluateHeading, layoutDistanceM } from '../../terrain/heading';
import { planFlightLines } from '../../terrain/lines';
import { localFrameFor, localHeights } from '../../terrain/local-frame';
import { lonLatOf, utmGrid } from './plan-fixtures';

const area = [[[-300, -200], [300, -200], [300, 200], [-300, 200], [-300, -200]]] as Array<Array<[number, number]>>;
const opts = { lineSpacingM: 40, triggerDistanceM: 15, runInM: 10 };

function heightsOf(f: (x: number, y: number) => number) {
  const grid = utmGrid({ width: 1000, height: 1000, f });
  const [lon, lat] = lonLatOf(grid, 500, 500);
  return localHeights(grid, localFrameFor(lon, lat));
}

describe('heading advice', () => {
  it('recommends lines along the contours: a slope rising to the east gives north-south lines', () => {
    const hs = heightsOf((x) => 100 + 0.3 * x);
    const advice = adviseHeading(area, hs.sampleMany, opts);
    expect(advice.recommendedDeg).toBe(0);
    const best = advice.options.find((o) => o.headingDeg === 0)!;
    expect(best.aglSpreadM).toBeLessThan(0.01); // each north-south line is level
    const across = advice.options.find((o) => o.headingDeg === 90)!;
    // an east-west line over 600 m rises 180 m; sampled every 10 m (61 points) the spread about its mean is
    // 180 / sqrt(12) * sqrt(62 / 60) = 52.8 m (the standard deviation of an evenly spaced ramp, by hand)
    expect(across.aglSpreadM).toBeCloseTo((180 / Math.sqrt(12)) * Math.sqrt(62 / 60), 0);
    expect(across.aglRangeMaxM).toBeCloseTo(180, 0);
  });

  it('follows a ridge running north-east (contours at 45°)', () => {
    const hs = heightsOf((x, y) => 200 + 0.25 * (x - y)); // rises to the south-east; level along north-east lines
    expect(adviseHeading(area, hs.sampleMany, opts).recommendedDeg).toBe(45);
  });

  it('prefers the shorter flight when the ground is flat (fewer, longer lines along the long side)', () => {
    const hs = heightsOf(() => 50);
    const advice = adviseHeading(area, hs.sampleMany, opts);
    expect(advice.recommendedDeg).toBe(90);
    const ew = advice.options.find((o) => o.headingDeg === 90)!;
    const ns = advice.options.find((o) => o.headingDeg === 0)!;
    expect(ew.lineCount).toBe(10);
    expect(ns.lineCount).toBe(15);
    expect(ew.flightDistanceM).toBeLessThan(ns.flightDistanceM);
  });

  it('reports line count and distance as the layout itself does', () => {
    const hs = heightsOf(() => 0);
    const o = evaluateHeading(area, hs.sampleMany, 30, opts);
    const lines = planFlightLines(area, { headingDeg: 30, ...opts, clip: 'centre' });
    expect(o.lineCount).toBe(lines.length);
    expect(o.flightDistanceM).toBeCloseTo(layoutDistanceM(lines), 9);
  });

  it('tries every coarse heading 0–179 and refines around the best', () => {
    const hs = heightsOf((x, y) => 0.2 * x + 0.1 * y);
    const advice = adviseHeading(area, hs.sampleMany, { ...opts, stepDeg: 10 });
    const degs = advice.options.map((o) => o.headingDeg);
    for (let d = 0; d < 180; d += 10) expect(degs).toContain(d);
    // contours of 0.2 x + 0.1 y run at atan2(-0.2, 0.1) -> heading 153.4° (mod 180)
    expect(Math.abs(advice.recommendedDeg - 153.43)).toBeLessThanOrEqual(1);
    expect(() => adviseHeading(area, hs.sampleMany, { ...opts, stepDeg: 0 })).toThrow(/step/);
  });
});

describe('heading advice and its list agree', () => {
  it('recommends the first of the tried headings in the order the list is shown in', async () => {
    const { compareHeadingOptions } = await import('../../terrain/heading');
    // an irregular hill: many headings with close spreads
    const hs = heightsOf((x, y) => 150 + 30 * Math.sin(x / 170) * Math.cos(y / 230) + 0.05 * x);
    const advice = adviseHeading(area, hs.sampleMany, opts);
    const listed = [...advice.options].sort(compareHeadingOptions);
    expect(listed[0].headingDeg).toBe(advice.recommendedDeg);
    const best = advice.options.find((o) => o.headingDeg === advice.recommendedDeg)!;
    for (const o of advice.options) expect(Math.round(o.aglSpreadM * 1000)).toBeGreaterThanOrEqual(Math.round(best.aglSpreadM * 1000));
  });
});

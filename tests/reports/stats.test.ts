import { describe, expect, it } from 'vitest';
import { distribution, maxKnown, minKnown, percentileSorted, shareWithin, sortedKnown } from '../../server/reports/stats';
import references from './stats-references.json';

// Reference values: numpy 1.24.2 from Debian 12 (python3-numpy), numpy.percentile with its default method 'linear',
// made by tests/reports/make-stats-references.py.
describe('report statistics match numpy', () => {
  it('names the numpy version that made the references', () => {
    expect(references.tool).toMatch(/^numpy 1\.24\.2/);
  });

  for (const c of references.cases) {
    it(`gives numpy's percentiles, median, min, max and band share for "${c.name}"`, () => {
      const sorted = sortedKnown(c.values);
      for (const [q, want] of Object.entries(c.percentiles)) {
        expect(percentileSorted(sorted, Number(q)), `q=${q}`).toBeCloseTo(want, 12);
      }
      const d = distribution(c.values);
      expect(d.median).toBeCloseTo(c.median, 12);
      expect(d.p5).toBeCloseTo(c.percentiles['5'], 12);
      expect(d.min).toBe(c.min);
      expect(d.max).toBe(c.max);
      expect(shareWithin(c.values, c.band[0], c.band[1])).toBeCloseTo(c.shareWithinBand, 12);
    });
  }
});

describe('report statistics with unknown stations', () => {
  it('skips nulls and NaN for the distribution but counts them against the share', () => {
    const values = [3, null, 2.9, Number.NaN, 3.05];
    const d = distribution(values);
    // Known values sorted: 2.9, 3, 3.05; the 5th percentile sits at rank (3 - 1) * 0.05 = 0.1: 2.9 + 0.1 * 0.1 = 2.91.
    expect(d.p5).toBeCloseTo(2.91, 12);
    expect([d.min, d.median, d.max]).toEqual([2.9, 3, 3.05]);
    expect(shareWithin(values, 2.95, 3.1)).toBeCloseTo(2 / 5, 15);
    expect(minKnown(values)).toBe(2.9);
    expect(maxKnown(values)).toBe(3.05);
  });

  it('answers null when nothing is known', () => {
    expect(distribution([null, null])).toEqual({ min: null, p5: null, median: null, max: null });
    expect(shareWithin([], 1, 2)).toBeNull();
    expect(minKnown([])).toBeNull();
    expect(percentileSorted([], 50)).toBeNull();
  });

  it('throws on a percentile outside 0..100 and on an inverted band', () => {
    expect(() => percentileSorted([1, 2], 101)).toThrow(/0\.\.100, got 101/);
    expect(() => shareWithin([1], 3, 2)).toThrow(/lo <= hi/);
  });

  it('does not mutate its input', () => {
    const values = [3, 1, 2];
    distribution(values);
    expect(values).toEqual([3, 1, 2]);
  });
});

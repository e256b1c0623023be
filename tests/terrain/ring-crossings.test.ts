import { kinks, polygon } from '@turf/turf';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkArea } from '../../terrain/mission';
import { findRingCrossing } from '../../terrain/ring-crossings';
import { wavyRing, withSwappedCorners } from '../support/area-rings';

describe('findRingCrossing', () => {
  it('finds the crossing of a bow tie and says where the edges cross', () => {
    const bow = [[10, 45], [10.01, 45.01], [10.01, 45], [10, 45.01], [10, 45]];
    const x = findRingCrossing([bow]);
    expect(x).toMatchObject({ ringA: 0, edgeA: 0, ringB: 0, edgeB: 2 });
    // the diagonals of the 0.01° square cross at its centre (worked by hand)
    expect(x!.at[0]).toBeCloseTo(10.005, 9);
    expect(x!.at[1]).toBeCloseTo(45.005, 9);
  });

  it('accepts neighbouring edges that share a corner, including the closing edge', () => {
    expect(findRingCrossing([[[0, 0], [1, 0], [1, 1], [0, 1], [0, 0]]])).toBeNull();
    expect(findRingCrossing([wavyRing(1999)])).toBeNull();
  });

  it('finds a hole that crosses the outer ring', () => {
    const outer = [[0, 0], [4, 0], [4, 4], [0, 4], [0, 0]];
    const hole = [[1, 1], [5, 1], [5, 2], [1, 2], [1, 1]];
    expect(findRingCrossing([outer, hole])).toMatchObject({ ringA: 0, ringB: 1 });
  });

  it('locates the one crossing in a 1,999-corner non-convex outline where turf kinks (an independent implementation) does', () => {
    const ring = withSwappedCorners(wavyRing(1999), 1200);
    const started = performance.now();
    const x = findRingCrossing([ring]);
    const ms = performance.now() - started;
    // turf's kinks compares every edge with every other: slow, but an independent answer for the place
    const reference = kinks(polygon([ring])).features.map((f) => f.geometry.coordinates);
    expect(reference.length).toBeGreaterThan(0);
    expect(x).not.toBeNull();
    expect([x!.edgeA, x!.edgeB]).toEqual([1199, 1201]);
    expect(reference.some(([lon, lat]) => Math.abs(lon - x!.at[0]) < 1e-12 && Math.abs(lat - x!.at[1]) < 1e-12)).toBe(true);
    console.info(`findRingCrossing on 1,999 corners: ${ms.toFixed(1)} ms (benchmark figure, not a test bound)`);
  });

  it('agrees with turf kinks on random small rings (fast-check, fixed seed)', () => {
    const pt = fc.tuple(fc.integer({ min: 0, max: 20 }), fc.integer({ min: 0, max: 20 }));
    fc.assert(
      fc.property(fc.array(pt, { minLength: 3, maxLength: 9 }), (corners) => {
        const ring = [...corners, corners[0]];
        // turf also reports touching and overlapping edges; compare only rings whose edges meet nowhere but at
        // their shared corners or properly cross, by skipping rings with repeated or collinear corner triples
        const distinct = new Set(corners.map((c) => c.join(','))).size === corners.length;
        const collinear = corners.some((a, i) => corners.some((b, j) => j > i && corners.some((c, k) => k > j && (b[0] - a[0]) * (c[1] - a[1]) === (b[1] - a[1]) * (c[0] - a[0]))));
        fc.pre(distinct && !collinear);
        const ours = findRingCrossing([ring]) !== null;
        const theirs = kinks(polygon([ring])).features.length > 0;
        expect(ours).toBe(theirs);
      }),
      { numRuns: 300 },
    );
  });
});

describe('checkArea over large outlines', () => {
  it('refuses a 1,999-corner outline with one crossing, naming the edges and the place', () => {
    const ring = withSwappedCorners(wavyRing(1999), 1200);
    expect(() => checkArea({ type: 'Polygon', coordinates: [ring] })).toThrow(/area ring 0 crosses itself \(edges 1199 and 1201, near lon 4\.\d{5}, lat 46\.\d{5}\)/);
    expect(() => checkArea({ type: 'Polygon', coordinates: [wavyRing(1999)] })).not.toThrow();
  });
});

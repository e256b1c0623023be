import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { booleanPointInPolygon, point, polygon } from '@turf/turf';
import { planFlightLines, pointAlong, type LocalPolygon } from '../../terrain/lines';

// Random simple polygons: 3..12 corners around the origin at distinct angles (at least 0.15 rad apart),
// joined in angle order, which gives a simple (star-shaped) ring.
const polygonArb = fc.array(fc.record({ a: fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), r: fc.double({ min: 80, max: 1500, noNaN: true }) }), { minLength: 3, maxLength: 12 })
  .map((pts) => {
    const sorted = [...pts].sort((p, q) => p.a - q.a);
    const kept = sorted.filter((p, i) => i === 0 || p.a - sorted[i - 1].a >= 0.15);
    if (kept.length > 2 && 2 * Math.PI - kept[kept.length - 1].a + kept[0].a < 0.15) kept.pop();
    const ring = kept.map(({ a, r }) => [r * Math.cos(a), r * Math.sin(a)] as [number, number]);
    ring.push(ring[0]);
    return [ring] as LocalPolygon;
  })
  .filter((p) => {
    const r = p[0];
    if (r.length < 4) return false;
    let s = 0;
    for (let i = 0; i + 1 < r.length; i++) s += r[i][0] * r[i + 1][1] - r[i + 1][0] * r[i][1];
    return Math.abs(s) / 2 > 1e4;
  });

/** Distance from a point to the polygon's boundary. */
function boundaryDistance(area: LocalPolygon, [px, py]: [number, number]): number {
  let d = Infinity;
  for (const ring of area) {
    for (let i = 0; i + 1 < ring.length; i++) {
      const [ax, ay] = ring[i], [bx, by] = ring[i + 1];
      const L = (bx - ax) ** 2 + (by - ay) ** 2;
      const t = L > 0 ? Math.max(0, Math.min(1, ((px - ax) * (bx - ax) + (py - ay) * (by - ay)) / L)) : 0;
      d = Math.min(d, Math.hypot(px - ax - t * (bx - ax), py - ay - t * (by - ay)));
    }
  }
  return d;
}

describe('flight lines (properties)', () => {
  it('photograph every point of the area: each lies in some flat-ground photo footprint', () => {
    fc.assert(fc.property(
      polygonArb, fc.double({ min: 0, max: 359.9, noNaN: true }), fc.double({ min: 30, max: 200, noNaN: true }),
      fc.double({ min: 0, max: 0.9, noNaN: true }), fc.double({ min: 0, max: 0.9, noNaN: true }), fc.double({ min: 0, max: 60, noNaN: true }),
      fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: 20, maxLength: 20 }),
      (area, headingDeg, footprint, side, forward, runInM, probes) => {
        // a square footprint `footprint` metres on a side, at the overlaps asked
        const lineSpacingM = (1 - side) * footprint;
        const triggerDistanceM = (1 - forward) * footprint;
        const lines = planFlightLines(area, { headingDeg, lineSpacingM, triggerDistanceM, runInM, maxLines: 10_000 });
        const th = (headingDeg * Math.PI) / 180;
        const poly = polygon(area);
        const xs = area[0].map((p) => p[0]), ys = area[0].map((p) => p[1]);
        for (const [u, v] of probes) {
          const px = Math.min(...xs) + u * (Math.max(...xs) - Math.min(...xs));
          const py = Math.min(...ys) + v * (Math.max(...ys) - Math.min(...ys));
          if (!booleanPointInPolygon(point([px, py]), poly)) continue;
          const a = px * Math.sin(th) + py * Math.cos(th), c = px * Math.cos(th) - py * Math.sin(th);
          const seen = lines.some((l) => [...l.stationsM].some((d) => {
            const [sx, sy] = pointAlong(l, d);
            const sa = sx * Math.sin(th) + sy * Math.cos(th), sc = sx * Math.cos(th) - sy * Math.sin(th);
            return Math.abs(sa - a) <= footprint / 2 + 1e-6 && Math.abs(sc - c) <= footprint / 2 + 1e-6;
          }));
          expect(seen, `point (${px}, ${py})`).toBe(true);
        }
      }), { numRuns: 60 });
  });

  it('keep lines parallel to the heading, stations on the line at the trigger distance, and the area part ending within half a spacing of the polygon', () => {
    fc.assert(fc.property(polygonArb, fc.double({ min: 0, max: 359.9, noNaN: true }), fc.double({ min: 20, max: 300, noNaN: true }), fc.double({ min: 5, max: 80, noNaN: true }), (area, headingDeg, S, B) => {
      const lines = planFlightLines(area, { headingDeg, lineSpacingM: S, triggerDistanceM: B, runInM: 15, maxLines: 10_000 });
      const poly = polygon(area);
      for (const l of lines) {
        const dir = (Math.atan2(l.end[0] - l.start[0], l.end[1] - l.start[1]) * 180) / Math.PI;
        const diff = (((dir - l.headingDeg) % 360) + 540) % 360 - 180;
        expect(Math.abs(diff)).toBeLessThan(1e-6);
        for (let i = 1; i < l.stationsM.length; i++) expect(l.stationsM[i] - l.stationsM[i - 1]).toBeCloseTo(B, 6);
        expect(Math.hypot(l.end[0] - l.start[0], l.end[1] - l.start[1])).toBeCloseTo(l.lengthM, 6);
        // the part over the area starts and ends where the polygon is, within the line's strip of one spacing
        for (const d of [l.areaStartM, l.areaEndM]) {
          const p = pointAlong(l, d);
          expect(booleanPointInPolygon(point(p), poly) || boundaryDistance(area, p) <= S / 2 + 1e-6).toBe(true);
        }
      }
    }), { numRuns: 150 });
  });
});

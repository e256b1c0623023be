/** Heading advice: for headings 0–179°, line count, flight distance and the spread of height above ground under `hold`; least spread wins. */
import type { LocalPolygon, FlightLine } from './lines';
import { planFlightLines, pointAlong } from './lines';
import { check } from './errors';

/** One evaluated layout heading. */
export interface HeadingOption {
  headingDeg: number;
  lineCount: number;
  /** Lines plus the straight transits between them, metres. */
  flightDistanceM: number;
  /**
   * Spread of height above ground if each line were flown at one altitude (`hold`): the standard deviation
   * of the ground about each line's mean, pooled over all lines (metres; smaller = steadier GSD and overlap).
   */
  aglSpreadM: number;
  /** Largest ground range (max - min) along any one line, metres. */
  aglRangeMaxM: number;
}

/** The advice: every heading tried and the recommended one. */
export interface HeadingAdvice {
  recommendedDeg: number;
  options: HeadingOption[];
}

/** Options for the heading search. */
export interface HeadingSearchOptions {
  lineSpacingM: number;
  triggerDistanceM: number;
  runInM?: number;
  /** Coarse search step (default 5°), refined to 1° around the best. */
  stepDeg?: number;
  /** Ground sample step along lines (default 10 m). */
  sampleStepM?: number;
}

/** Lines plus transits: the distance flown over a layout (takeoff legs excluded). */
export function layoutDistanceM(lines: FlightLine[]): number {
  let d = 0;
  for (let i = 0; i < lines.length; i++) {
    d += lines[i].lengthM;
    if (i > 0) d += Math.hypot(lines[i].start[0] - lines[i - 1].end[0], lines[i].start[1] - lines[i - 1].end[1]);
  }
  return d;
}

/** Evaluate one heading: lay the lines out and measure the ground's spread along them. */
export function evaluateHeading(
  area: LocalPolygon,
  sampleMany: (xs: Float64Array, ys: Float64Array, out: Float64Array) => number,
  headingDeg: number,
  o: HeadingSearchOptions,
): HeadingOption {
  // centre-line clipping: a fifth of the work of the full layout, and the same ground to within a strip's edge
  const lines = planFlightLines(area, { headingDeg, lineSpacingM: o.lineSpacingM, triggerDistanceM: o.triggerDistanceM, runInM: o.runInM ?? 0, clip: 'centre' });
  const step = o.sampleStepM ?? 10;
  const counts = lines.map((l) => Math.max(2, Math.ceil((l.areaEndM - l.areaStartM) / step) + 1));
  const total = counts.reduce((a, b) => a + b, 0);
  const xs = new Float64Array(total), ys = new Float64Array(total), h = new Float64Array(total);
  let k = 0;
  lines.forEach((l, li) => {
    const n = counts[li];
    for (let i = 0; i < n; i++, k++) {
      const [x, y] = pointAlong(l, l.areaStartM + ((l.areaEndM - l.areaStartM) * i) / (n - 1));
      xs[k] = x;
      ys[k] = y;
    }
  });
  sampleMany(xs, ys, h);
  let ss = 0, known = 0, rangeMax = 0;
  k = 0;
  for (let li = 0; li < lines.length; li++) {
    const n = counts[li];
    let sum = 0, m = 0, lo = Infinity, hi = -Infinity;
    for (let i = 0; i < n; i++) {
      const v = h[k + i];
      if (v === v) { sum += v; m++; if (v < lo) lo = v; if (v > hi) hi = v; }
    }
    if (m > 0) {
      const mean = sum / m;
      for (let i = 0; i < n; i++) { const v = h[k + i]; if (v === v) ss += (v - mean) ** 2; }
      known += m;
      rangeMax = Math.max(rangeMax, hi - lo);
    }
    k += n;
  }
  return {
    headingDeg,
    lineCount: lines.length,
    flightDistanceM: layoutDistanceM(lines),
    aglSpreadM: known > 0 ? Math.sqrt(ss / known) : NaN,
    aglRangeMaxM: rangeMax,
  };
}

/** Degrees between a layout heading and the first heading tried (0°), lines having no direction (mod 180°). */
const fromFirstDeg = (h: number): number => Math.min(h % 180, 180 - (h % 180));

/**
 * The one order of heading options, used to choose and to list them: the smaller spread wins (spreads compared
 * to the millimetre, so the order is total and rounding noise cannot flip it: a larger spread never beats a
 * smaller one); on equal spread the shorter flight (to the metre: fewer lines on flat ground); then the
 * heading nearer the first candidate (0°, mod 180°); then the smaller heading. Negative when `a` comes first.
 */
export function compareHeadingOptions(a: HeadingOption, b: HeadingOption): number {
  const sa = Number.isFinite(a.aglSpreadM) ? Math.round(a.aglSpreadM * 1000) : Infinity;
  const sb = Number.isFinite(b.aglSpreadM) ? Math.round(b.aglSpreadM * 1000) : Infinity;
  if (sa !== sb) return sa < sb ? -1 : 1;
  const fa = Math.round(a.flightDistanceM), fb = Math.round(b.flightDistanceM);
  if (fa !== fb) return fa - fb;
  const da = fromFirstDeg(a.headingDeg), db = fromFirstDeg(b.headingDeg);
  if (da !== db) return da - db;
  return a.headingDeg - b.headingDeg;
}

const better = (a: HeadingOption, b: HeadingOption): boolean => compareHeadingOptions(a, b) < 0;

/** Try headings 0–179° (coarse, then 1° around the best) and recommend the first in `compareHeadingOptions` order: the least spread of height above ground. */
export function adviseHeading(
  area: LocalPolygon,
  sampleMany: (xs: Float64Array, ys: Float64Array, out: Float64Array) => number,
  o: HeadingSearchOptions,
): HeadingAdvice {
  const step = o.stepDeg ?? 5;
  check(Number.isInteger(step) && step >= 1 && step <= 45, `heading search step must be a whole number of degrees 1..45, got ${step}.`);
  const seen = new Map<number, HeadingOption>();
  const tryDeg = (d: number) => {
    const deg = ((d % 180) + 180) % 180;
    if (!seen.has(deg)) seen.set(deg, evaluateHeading(area, sampleMany, deg, o));
    return seen.get(deg)!;
  };
  let best: HeadingOption | null = null;
  for (let d = 0; d < 180; d += step) {
    const r = tryDeg(d);
    if (r.aglSpreadM === r.aglSpreadM && (best === null || better(r, best))) best = r;
  }
  check(best !== null, 'No heading gives flight lines over known ground; the survey area may lie off the grid.');
  const centre = best.headingDeg;
  for (let d = centre - step + 1; d < centre + step; d++) {
    const r = tryDeg(d);
    if (r.aglSpreadM === r.aglSpreadM && better(r, best!)) best = r;
  }
  const options = [...seen.values()].sort((a, b) => a.headingDeg - b.headingDeg);
  // the recommendation is the first of every heading tried in the one order (never one the list would rank lower)
  const first = [...options].sort(compareHeadingOptions)[0];
  return { recommendedDeg: first.headingDeg, options };
}

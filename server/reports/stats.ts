/**
 * Pure figures over station values: minimum, maximum, percentiles and shares. Percentiles use linear interpolation
 * between closest ranks, numpy's default (`numpy.percentile(a, q)`, method="linear"; Hyndman & Fan 1996, type 7).
 */

/** The percentile definition used, as printed in reports. */
export const percentileMethod =
  'linear interpolation between closest ranks (numpy.percentile default, method "linear"; Hyndman & Fan type 7)';

/** Known (finite) values of a list that may hold nulls, sorted ascending into a new Float64Array. */
export function sortedKnown(values: ArrayLike<number | null>): Float64Array {
  let n = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v !== null && Number.isFinite(v)) n++;
  }
  const out = new Float64Array(n);
  let k = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v !== null && Number.isFinite(v)) out[k++] = v;
  }
  return out.sort();
}

/** The q-th percentile (0..100) of ascending `sorted`, or null when empty. Position (n - 1) * q / 100, interpolated. */
export function percentileSorted(sorted: ArrayLike<number>, q: number): number | null {
  if (!(q >= 0 && q <= 100)) throw new RangeError(`percentile q must be within 0..100, got ${q}`);
  const n = sorted.length;
  if (n === 0) return null;
  const pos = ((n - 1) * q) / 100;
  const lo = Math.floor(pos);
  const hi = Math.min(lo + 1, n - 1);
  const f = pos - lo;
  return f === 0 ? sorted[lo] : sorted[lo] + (sorted[hi] - sorted[lo]) * f;
}

/** Min, 5th percentile, median and max of the known values (nulls and NaN skipped); all null when none is known. */
export function distribution(values: ArrayLike<number | null>): { min: number | null; p5: number | null; median: number | null; max: number | null } {
  const s = sortedKnown(values);
  if (s.length === 0) return { min: null, p5: null, median: null, max: null };
  return { min: s[0], p5: percentileSorted(s, 5), median: percentileSorted(s, 50), max: s[s.length - 1] };
}

/** Smallest known value, or null. */
export function minKnown(values: ArrayLike<number | null>): number | null {
  let m = Infinity;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v !== null && v < m) m = v;
  }
  return m === Infinity ? null : m;
}

/** Largest known value, or null. */
export function maxKnown(values: ArrayLike<number | null>): number | null {
  let m = -Infinity;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v !== null && v > m) m = v;
  }
  return m === -Infinity ? null : m;
}

/**
 * Share 0..1 of ALL entries whose value lies in [lo, hi] (a relative 1e-9 slack absorbs rounding at the edges);
 * unknown entries count against the share. Null for an empty list.
 */
export function shareWithin(values: ArrayLike<number | null>, lo: number, hi: number): number | null {
  if (!(lo <= hi)) throw new RangeError(`shareWithin needs lo <= hi, got ${lo} > ${hi}`);
  if (values.length === 0) return null;
  const slack = 1e-9 * Math.max(Math.abs(lo), Math.abs(hi), 1);
  let k = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v !== null && v >= lo - slack && v <= hi + slack) k++;
  }
  return k / values.length;
}

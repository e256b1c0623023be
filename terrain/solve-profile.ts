/** Piecewise-linear profile lookups shared by the solver's modules. */

/** Value of the profile (xs, zs) at x, linear between samples, clamped at the ends. */
export function evaluate(xs: ArrayLike<number>, zs: ArrayLike<number>, x: number): number {
  const n = xs.length;
  if (n === 0) return NaN;
  if (x <= xs[0]) return zs[0];
  if (x >= xs[n - 1]) return zs[n - 1];
  let lo = 0, hi = n - 1;
  while (hi - lo > 1) { const m = (lo + hi) >> 1; if (xs[m] <= x) lo = m; else hi = m; }
  const f = (x - xs[lo]) / (xs[hi] - xs[lo] || 1);
  return zs[lo] + (zs[hi] - zs[lo]) * f;
}

/**
 * Axis ticks of every chart (the PDF report's, the GSD chart and the altitude profile on screen): steps of 1, 2 or
 * 5 times a power of ten (the classic graph-labelling rule, P. Heckbert, "Nice numbers for graph labels",
 * Graphics Gems, 1990).
 */

/** The nice step giving about `count` ticks over `span` (1 when there is nothing to divide). */
export function niceStep(span: number, count = 1): number {
  if (!(span > 0) || !(count > 0)) return 1;
  const raw = span / count;
  const p = 10 ** Math.floor(Math.log10(raw));
  const f = raw / p;
  return (f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10) * p;
}

/** About `count` nice ticks covering [lo, hi]: the first at or below `lo`, the last at or above `hi`. */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!(Number.isFinite(lo) && Number.isFinite(hi))) throw new RangeError(`niceTicks needs finite bounds, got ${lo}, ${hi}`);
  if (hi < lo) [lo, hi] = [hi, lo];
  if (hi === lo) {
    const pad = Math.abs(lo) > 0 ? Math.abs(lo) * 0.05 : 1;
    lo -= pad;
    hi += pad;
  }
  const step = niceStep(hi - lo, Math.max(1, count));
  const out: number[] = [];
  for (let t = Math.floor(lo / step) * step; t <= hi + step * 1e-9; t += step) out.push(Number(t.toFixed(12)));
  if (out[out.length - 1] < hi) out.push(Number((out[out.length - 1] + step).toFixed(12)));
  return out;
}

/** [lo, hi] widened to whole multiples of a nice step, so axis ticks fall on round values. */
export function niceDomain(lo: number, hi: number, ticks = 5): [number, number] {
  const step = niceStep(hi - lo, ticks);
  return [Math.floor(lo / step) * step, Math.ceil(hi / step) * step];
}

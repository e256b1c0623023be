/**
 * One rounding rule for every figure shown against a target: round toward failing. A figure that must reach
 * a minimum (overlap, share of stations in the GSD band, height above ground against the clearance, GSD
 * against the band's fine end) is rounded down; one that must stay under a maximum (height above ground
 * against the height limit, GSD against the band's coarse end) is rounded up. So 79.8 % against an 80 %
 * target shows "79 %" (or "79.8 %" with one decimal), never "80 %", and 120.04 m against a 120 m limit shows
 * "120.1 m", never "120.0 m". Shared by the screens and the PDF report.
 */

/** Which way a figure must lie against its target: 'min' = at least the target, 'max' = at most. */
export type TargetBound = 'min' | 'max';

/**
 * `value` rounded to `digits` decimals toward failing `bound`. Values within 1e-9 of a displayed step (float
 * noise, e.g. 0.8 * 100 = 80.00000000000001) keep that step, so a figure exactly on target shows the target.
 */
export function roundTowardFailing(value: number, digits: number, bound: TargetBound): number {
  const k = 10 ** digits;
  const scaled = value * k;
  const nearest = Math.round(scaled);
  if (Math.abs(scaled - nearest) <= 1e-9 * Math.max(1, Math.abs(scaled))) return nearest / k;
  return (bound === 'min' ? Math.floor(scaled) : Math.ceil(scaled)) / k;
}

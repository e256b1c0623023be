/** Number formats of the documents the server writes (PDF report, leg sheet, exports) and their tests, so printed figures can be matched to the API's. */
import { roundTowardFailing, type TargetBound } from '../target-rounding';

/** A fixed-decimals figure with its unit, or an en dash when unknown; against a target (`bound`) rounded toward failing. */
function fixed(v: number | null | undefined, digits: number, unit: string, bound?: TargetBound): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '–';
  return `${(bound ? roundTowardFailing(v, digits, bound) : v).toFixed(digits)}${unit}`;
}

export const fmt = {
  gsdCm: (v: number | null | undefined, bound?: TargetBound) => fixed(v, 2, ' cm', bound),
  metres: (v: number | null | undefined, bound?: TargetBound) => fixed(v, 1, ' m', bound),
  /** A fraction 0..1 as a percentage with one decimal. */
  percent: (v: number | null | undefined, bound?: TargetBound) => fixed(v === null || v === undefined ? v : v * 100, 1, ' %', bound),
  degrees: (v: number | null | undefined) => fixed(v, 0, '°'),
  minutes: (seconds: number | null | undefined) => fixed(seconds === null || seconds === undefined ? seconds : seconds / 60, 1, ' min'),
  /** UTC date and time to the minute, e.g. 2026-12-01 22:58 UTC. */
  utc: (iso: string | null | undefined) => (iso ? `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC` : '–'),
};

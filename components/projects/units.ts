/** Display units of a project: heights, lengths and speeds in metres or feet; values are stored in SI always. */
import type { UnitSystem } from '../../contracts/projects';
import { roundTowardFailing, type TargetBound } from '../../contracts/target-rounding';
import { METRES_PER_FOOT } from '../../terrain/length-units';

/** The international foot in metres (terrain/length-units.ts: the one definition, also for grids in feet). */
export const metresPerFoot = METRES_PER_FOOT;

/** The unit label for lengths and heights. */
export function lengthUnit(units: UnitSystem): 'm' | 'ft' {
  return units === 'imperial' ? 'ft' : 'm';
}

/** The unit label for speeds and vertical rates. */
function speedUnit(units: UnitSystem): 'm/s' | 'ft/s' {
  return units === 'imperial' ? 'ft/s' : 'm/s';
}

/** A length in metres as a number in the display unit. */
export function toDisplayLength(metres: number, units: UnitSystem): number {
  return units === 'imperial' ? metres / metresPerFoot : metres;
}

/** A number in the display unit back to metres. */
export function fromDisplayLength(value: number, units: UnitSystem): number {
  return units === 'imperial' ? value * metresPerFoot : value;
}

// One formatter per (minimum, maximum) decimals: toLocaleString with options builds a new Intl.NumberFormat on
// every call, which was a tenth of the time to draw a leg sheet.
const formatters = new Map<string, Intl.NumberFormat>();

/** `v` in British English digits ("1,234.5") with `minDigits`..`maxDigits` decimals (default: exactly `minDigits`). */
export function formatDecimal(v: number, minDigits: number, maxDigits = minDigits): string {
  const key = `${minDigits}/${maxDigits}`;
  let f = formatters.get(key);
  if (!f) {
    f = new Intl.NumberFormat('en-GB', { minimumFractionDigits: minDigits, maximumFractionDigits: maxDigits });
    formatters.set(key, f);
  }
  const out = f.format(v);
  // a small negative figure rounds to "-0": it is zero as shown, with no sign
  return /^-0([.,]0+)?$/.test(out) ? out.slice(1) : out;
}

/** `bound`: the figure is shown against a target it must reach ('min') or stay under ('max'): rounded toward failing. */
function fixed(v: number, digits: number, bound?: TargetBound): string {
  if (!Number.isFinite(v)) return '–';
  const shown = bound ? roundTowardFailing(v, digits, bound) : v;
  return formatDecimal(shown, digits);
}

/** "123 m" or "404 ft"; `digits` decimals (default 0); a dash for a missing value; `bound` for a figure against a target. */
export function formatLength(metres: number | null | undefined, units: UnitSystem, digits = 0, bound?: TargetBound): string {
  if (metres === null || metres === undefined || !Number.isFinite(metres)) return '–';
  return `${fixed(toDisplayLength(metres, units), digits, bound)} ${lengthUnit(units)}`;
}

/** "10.0 m/s" or "32.8 ft/s". */
export function formatSpeed(mps: number | null | undefined, units: UnitSystem, digits = 1): string {
  if (mps === null || mps === undefined || !Number.isFinite(mps)) return '–';
  return `${fixed(toDisplayLength(mps, units), digits)} ${speedUnit(units)}`;
}

/** A fraction (0.75) as a percentage ("75 %"); `bound` for a figure against a target (an achieved overlap: 'min'). */
export function formatPercent(fraction: number | null | undefined, digits = 0, bound?: TargetBound): string {
  if (fraction === null || fraction === undefined || !Number.isFinite(fraction)) return '–';
  return `${fixed(fraction * 100, digits, bound)} %`;
}

/** GSD stays in centimetres in both systems: it is how survey specifications state it. */
export function formatGsd(cm: number | null | undefined, digits = 2, bound?: TargetBound): string {
  if (cm === null || cm === undefined || !Number.isFinite(cm)) return '–';
  return `${fixed(cm, digits, bound)} cm`;
}

/** Plain number with thousands separators. */
export function formatCount(n: number | null | undefined): string {
  if (n === null || n === undefined || !Number.isFinite(n)) return '–';
  return fixed(n, 0);
}

/** A duration in seconds as "1 h 05 min" or "12 min 30 s". */
export function formatDuration(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds) || seconds < 0) return '–';
  const s = Math.round(seconds);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  if (h > 0) return `${h} h ${String(m).padStart(2, '0')} min`;
  return `${m} min ${String(s % 60).padStart(2, '0')} s`;
}

/** Leg-sheet wording: altitudes in the project's units, ranges, coordinates, leg kinds and battery packs. */
import type { BatteryPlan, SheetLeg } from '../../contracts/flights';
import type { UnitSystem } from '../../contracts/projects';
import { formatDecimal, formatDuration, formatLength, lengthUnit, toDisplayLength } from '../projects/units';

/** Below this difference (in metres) a leg's start and end altitude print as one figure: the server calls it level too. */
const levelToleranceM = 0.05;

function whole(metres: number, units: UnitSystem): string {
  return formatDecimal(Math.round(toDisplayLength(metres, units)), 0, 0);
}

/** "62 m" for a level leg, "62 → 75 m" for a climb or descent; whole units, as a pilot sets them. */
export function formatAltitudePair(pair: { start: number; end: number }, units: UnitSystem): string {
  const unit = lengthUnit(units);
  if (Math.abs(pair.end - pair.start) < levelToleranceM) return `${whole(pair.start, units)} ${unit}`;
  return `${whole(pair.start, units)} → ${whole(pair.end, units)} ${unit}`;
}

/** The same with one decimal, for the datum altitude (it is compared with survey heights, not set on a controller). */
export function formatDatumPair(pair: { start: number; end: number }, units: UnitSystem): string {
  if (Math.abs(pair.end - pair.start) < levelToleranceM) return formatLength(pair.start, units, 1);
  const unit = lengthUnit(units);
  const one = (m: number) => formatDecimal(toDisplayLength(m, units), 1);
  return `${one(pair.start)} → ${one(pair.end)} ${unit}`;
}

/** "58–66 m"; a single figure when both ends agree; a dash when unknown. */
export function formatRange(r: { min: number | null; max: number | null }, units: UnitSystem): string {
  if (r.min === null || r.max === null) return '–';
  const unit = lengthUnit(units);
  const lo = whole(r.min, units);
  const hi = whole(r.max, units);
  return lo === hi ? `${lo} ${unit}` : `${lo}–${hi} ${unit}`;
}

/** "2.9–3.1 cm" (GSD stays in centimetres in both unit systems). */
export function formatGsdRange(r: { min: number | null; max: number | null }): string {
  if (r.min === null || r.max === null) return '–';
  const f = (v: number) => formatDecimal(v, 1);
  return f(r.min) === f(r.max) ? `${f(r.min)} cm` : `${f(r.min)}–${f(r.max)} cm`;
}

/** Latitude, longitude in decimal degrees, six places (about 0.1 m), in the order map apps accept when pasted. */
export function formatLatLon(p: { lat: number; lon: number }): string {
  return `${p.lat.toFixed(6)}, ${p.lon.toFixed(6)}`;
}

/** "Level", "Climb 3.2 %" or "Descent 2.1 %". */
export function legKindLabel(leg: Pick<SheetLeg, 'kind' | 'gradientPct'>): string {
  if (leg.kind === 'level') return 'Level';
  const pct = formatDecimal(Math.abs(leg.gradientPct), 0, 1);
  return `${leg.kind === 'climb' ? 'Climb' : 'Descent'} ${pct} %`;
}

/** "Lines 1–3" or "Line 4" or "Lines 1, 3, 5" for a battery pack. */
export function packLinesLabel(lines: readonly number[]): string {
  if (lines.length === 0) return 'No lines';
  if (lines.length === 1) return `Line ${lines[0]}`;
  const consecutive = lines.every((n, i) => i === 0 || n === lines[i - 1]! + 1);
  return consecutive ? `Lines ${lines[0]}–${lines[lines.length - 1]}` : `Lines ${lines.join(', ')}`;
}

/**
 * "Home from line 12 at 86 m above takeoff", and where the ground on the straight way home needs the pack to climb
 * over that line's end first, by how much; empty for a sheet stored without the figure.
 */
export function packHomeLabel(pack: BatteryPlan['packs'][number], units: UnitSystem): string {
  if (pack.homeAboveTakeoffM === undefined || pack.lines.length === 0) return '';
  const unit = lengthUnit(units);
  const last = pack.lines[pack.lines.length - 1];
  const home = `Home from line ${last} at ${whole(pack.homeAboveTakeoffM, units)} ${unit} above takeoff`;
  const climb = pack.homeClimbM ?? 0;
  return climb >= 0.5 ? `${home}: climb ${whole(climb, units)} ${unit} over its end first, the ground on the way needs it` : home;
}

/** One sentence for the battery plan's head: count, usable time per battery and the reserve kept. */
export function batterySummary(b: BatteryPlan): string {
  const reserve = `${Math.round(b.reserve * 100)} %`;
  return `${b.count} ${b.count === 1 ? 'battery' : 'batteries'}: ${formatDuration(b.usablePerBatteryS)} usable each of ${b.enduranceMin} min, keeping ${reserve} in reserve.`;
}

/** Plan warnings: the standing safety cautions, plan-specific cautions, and clearance checks of the transits between lines. */
import type { Mission } from './mission';
import type { FlightLine } from './lines';
import type { AltitudeLeg } from './altitude';
import type { HeightAt } from './footprint';

/** A warning with a stable code (for programs) and a message (for people). */
export interface PlanWarning {
  code: string;
  message: string;
}

/** Visual line of sight is often judged to end near 500 m for small aircraft (common practice; rules differ). */
const LINE_OF_SIGHT_HINT_M = 500;

/** Cautions every flight-facing plan carries, plus the ones this mission triggers. */
export function planSafetyWarnings(m: Mission, s: { maxDistanceFromTakeoffM: number; targetHeightM: number }): PlanWarning[] {
  const w: PlanWarning[] = [
    { code: 'bare-earth', message: 'Elevation grids, bare-earth models above all, miss trees, masts, power lines and buildings: clearances here are above the grid surface only. Set an obstacle allowance and check the site before flying.' },
    { code: 'local-rules', message: `Local rules govern: altitude limits, visual line of sight, airspace and permissions. The ${m.maxAglM} m height limit used here is a setting, not a permission.` },
    { code: 'wind', message: 'Wind moves the aircraft off the planned track and tilts the camera: overlaps and clearances here assume calm air. Add margin on windy days.' },
  ];
  if (s.maxDistanceFromTakeoffM > LINE_OF_SIGHT_HINT_M) {
    w.push({ code: 'line-of-sight', message: `Parts of the plan are ${Math.round(s.maxDistanceFromTakeoffM)} m from the takeoff point: check that the aircraft stays in sight wherever your rules require it.` });
  }
  if (s.targetHeightM * (1 - m.gsdTolerance) > m.maxAglM) {
    w.push({ code: 'band-above-max-agl', message: `The target GSD needs ${Math.round(s.targetHeightM)} m above ground, above the ${m.maxAglM} m height limit: the plan flies at the limit and the GSD is finer than the target.` });
  }
  if (m.clearanceM + m.obstacleAllowanceM > s.targetHeightM * (1 + m.gsdTolerance)) {
    w.push({ code: 'clearance-above-band', message: `Clearance plus obstacle allowance (${m.clearanceM + m.obstacleAllowanceM} m) is above the height the GSD band allows (${Math.round(s.targetHeightM * (1 + m.gsdTolerance))} m): the GSD will be coarser than the target.` });
  }
  return w;
}

/**
 * How far a level transit from a to b at `altM` comes inside the clearance over the ground between them, sampled
 * every `stepM` (default 5 m: the solver's many trial hops; the plan's own transits and its return altitude take
 * 1 m, so a crest between samples hides at most a metre of run) (negative: clear by that much; −Infinity over
 * unknown ground only).
 */
export function transitShortfallM(a: readonly number[], b: readonly number[], altM: number, heightAt: HeightAt, clearanceM: number, stepM = 5): number {
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
  const n = Math.max(2, Math.ceil(len / stepM) + 1);
  let worst = -Infinity;
  for (let i = 0; i < n; i++) {
    const f = i / (n - 1);
    const h = heightAt(a[0] + (b[0] - a[0]) * f, a[1] + (b[1] - a[1]) * f);
    if (h === h) worst = Math.max(worst, h + clearanceM - altM);
  }
  return worst;
}

/**
 * Clearance over the transits (takeoff to the first line, between lines, last line back to takeoff), flown
 * straight at the higher of the two end altitudes (climb before, descend after; at the takeoff point the
 * aircraft climbs and descends vertically): warn where the ground plus clearance rises above that.
 */
export function transitWarnings(
  lines: FlightLine[], legs: AltitudeLeg[][], takeoff: [number, number], takeoffGroundM: number, heightAt: HeightAt, clearanceM: number,
): PlanWarning[] {
  const out: PlanWarning[] = [];
  const startAlt = (i: number) => legs[i][0]?.altitudeStartM ?? NaN;
  const endAlt = (i: number) => legs[i][legs[i].length - 1]?.altitudeEndM ?? NaN;
  const check = (label: string, a: [number, number], b: [number, number], altM: number, note = '') => {
    if (!Number.isFinite(altM)) return;
    const worst = transitShortfallM(a, b, altM, heightAt, clearanceM, 1);
    if (worst > 0) {
      // Both heights name their reference: the pilot sets the one above takeoff, the datum figure ties it to the grid.
      const flown = `${Math.round(altM)} m above the datum (${Math.round(altM - takeoffGroundM)} m above takeoff)`;
      const needed = `${Math.ceil(altM + worst)} m above the datum (${Math.ceil(altM + worst - takeoffGroundM)} m above takeoff)`;
      out.push({ code: 'transit-clearance', message: `${label}: flown straight at ${flown} the transit comes ${worst.toFixed(1)} m inside the clearance; fly it at ${needed} or route around${note}.` });
    }
  };
  if (lines.length === 0) return out;
  check('Takeoff to line 1', takeoff, lines[0].start, startAlt(0));
  for (let i = 1; i < lines.length; i++) check(`Line ${i} to line ${i + 1}`, lines[i - 1].end, lines[i].start, Math.max(endAlt(i - 1), startAlt(i)));
  check(`Line ${lines.length} to takeoff`, lines[lines.length - 1].end, takeoff, endAlt(lines.length - 1), ' (the MAVLink export climbs to it over the end of the line before the return; check that the autopilot\'s own return settings do not take it lower)');
  return out;
}

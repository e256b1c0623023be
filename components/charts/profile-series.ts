/** Chart data of one flight line: ground, suggested altitude, clearance floor and GSD along the line, in display units. */
import type { UnitSystem } from '../../contracts/projects';
import type { PlanLine } from '../../terrain/plan';
import { toDisplayLength } from '../projects/units';
import { niceDomain } from '../../contracts/format/ticks';

/** One chart row; the chart joins each series over its own rows (null = no value of that series here). */
interface ProfileRow extends Record<string, unknown> {
  /** Distance from the line start, display unit. */
  distance: number;
  ground: number | null;
  altitude: number | null;
  clearance: number | null;
  /** The height limit over this ground: ground + the mission's maximum height above ground (display unit). */
  limit: number | null;
  gsd: number | null;
}

interface LegMark {
  number: number;
  startDistance: number;
  endDistance: number;
}

export interface ProfileSeries {
  rows: ProfileRow[];
  legs: LegMark[];
  /** Height axis domain (display unit), with a little room above and below. */
  heightDomain: [number, number];
  gsdDomain: [number, number];
  /** [min, max] distance along the line. */
  distanceDomain: [number, number];
}

/**
 * Rows at every station (ground, clearance floor = ground + clearance + obstacle allowance, GSD) and at every
 * leg end (altitude), sorted by distance; heights stay in the grid's vertical datum. With `maxAglM`, also the
 * height limit at every station: the engine caps the altitude at that height above the ground under it.
 */
export function profileSeries(line: PlanLine, clearanceTotalM: number, units: UnitSystem, maxAglM?: number | null): ProfileSeries {
  const hasLimit = typeof maxAglM === 'number' && Number.isFinite(maxAglM) && maxAglM > 0;
  const L = (m: number) => toDisplayLength(m, units);
  const rows: ProfileRow[] = [];
  for (const s of line.stations) {
    rows.push({
      distance: L(s.distanceM),
      ground: s.groundM === null ? null : L(s.groundM),
      altitude: null,
      clearance: s.groundM === null ? null : L(s.groundM + clearanceTotalM),
      limit: s.groundM === null || !hasLimit ? null : L(s.groundM + maxAglM),
      gsd: s.gsdCm,
    });
  }
  for (const leg of line.legs) {
    rows.push({ distance: L(leg.start.distanceM), ground: null, altitude: L(leg.altitudeStartM), clearance: null, limit: null, gsd: null });
    rows.push({ distance: L(leg.end.distanceM), ground: null, altitude: L(leg.altitudeEndM), clearance: null, limit: null, gsd: null });
  }
  rows.sort((a, b) => a.distance - b.distance);
  const heights: number[] = [];
  const gsds: number[] = [];
  for (const r of rows) {
    for (const v of [r.ground, r.altitude, r.clearance, r.limit]) if (v !== null) heights.push(v);
    if (r.gsd !== null) gsds.push(r.gsd);
  }
  const span = (vs: number[], padShare: number, fallback: [number, number]): [number, number] => {
    if (vs.length === 0) return fallback;
    const lo = Math.min(...vs);
    const hi = Math.max(...vs);
    const pad = Math.max((hi - lo) * padShare, 1e-6 + (hi === lo ? Math.abs(hi) * 0.05 + 1 : 0));
    return niceDomain(lo - pad, hi + pad);
  };
  return {
    rows,
    legs: line.legs.map((leg, i) => ({ number: i + 1, startDistance: L(leg.start.distanceM), endDistance: L(leg.end.distanceM) })),
    heightDomain: span(heights, 0.08, [0, 1]),
    gsdDomain: span(gsds, 0.15, [0, 1]),
    distanceDomain: rows.length ? [rows[0].distance, rows[rows.length - 1].distance] : [0, 1],
  };
}

/**
 * Spot photos: where the solved lines still leave reachable cells short of the spec's GSD (the foot and the lip
 * of steep faces, which photos from lines beside them see too obliquely), one photo taken straight above the
 * cell at the height its slope allows, flown as a short line of its own after the layout.
 */
import type { FlightLine } from './lines';
import type { AltitudeLimits } from './altitude';
import type { Mission } from './mission';
import type { ViewGeometry } from './solve-geometry';
import type { HeightAt } from './footprint';
import { transitShortfallM } from './plan-warnings';
import { gsdStretch } from './solve-line';

const DEG = Math.PI / 180;

/** One spot photo: where (local metres), over what ground, and the height above it that meets the spec's GSD there. */
export interface Spot {
  x: number;
  y: number;
  groundM: number;
  slopeDeg: number;
  /** Heading of the spot's short line, degrees: along the contour, so the ground under it is the cell's own height. */
  headingDeg: number;
  /** Height above the ground under the aircraft the photo is planned at, metres. */
  heightM: number;
  /** Short cells it was placed for (within its reach). */
  cells: number;
}

/** A short cell the spots must serve: local position, ground height and slope. */
interface ShortCell { x: number; y: number; z: number; slopeDeg: number; finestGsdCm: number; item: 'gsd' | 'views' }

/** Half length of a spot's line, metres: long enough for the altitude fit's samples, short enough that the ground under it is the cell's. */
const SPOT_HALF_M = 0.5;

/**
 * Height above the cell for a nadir photo meeting the spec's GSD on ground sloping at β: a photo at height h
 * spans h·p/f / cos β along the slope (the incidence factor of `view-gsd.ts`), so h ≤ H·cos β with H the
 * spec's flat-ground height; `factor` (below 1) leaves a margin for the slope estimate and the envelope's tilt.
 * Never below the clearance and allowance, never above the height limit.
 */
export function spotHeightM(geometry: ViewGeometry, mission: Mission, slopeDeg: number, factor: number): number {
  const low = mission.clearanceM + mission.obstacleAllowanceM;
  const h = geometry.specHeightM * Math.cos(slopeDeg * DEG) * factor;
  return Math.min(mission.maxAglM, Math.max(low, h));
}

/**
 * Spots for the short cells, steepest first: each cell not yet within reach of a spot gets one straight above
 * it; the cells within reach of it count as served (the raster check that follows decides). A cell still short
 * under an earlier round's spot gets that spot again, lowered by the ratio of the spec's GSD to the GSD the raster
 * found there (a nadir photo's GSD is proportional to its height), with a 2 % margin.
 */
export function placeSpots(short: ShortCell[], geometry: ViewGeometry, mission: Mission, factor: number, existing: Spot[], heightAt: HeightAt, layoutHeadingDeg: number): Spot[] {
  const low = mission.clearanceM + mission.obstacleAllowanceM;
  const order = [...short].sort((p, q) => q.slopeDeg - p.slopeDeg);
  const out: Spot[] = [];
  // a cell within a tenth of a spot's height of it (at least 4.5 m) is seen by it at nearly the same slant; further
  // off, one whose ground the spot's photo sees, by the raster's own GSD formula (`gsdStretch`), within the spec with
  // the margin, inside half the guaranteed footprint (the raster check that follows decides)
  const reach = (s: Spot) => Math.max(4.5, 0.12 * s.heightM);
  const specCm = geometry.specHeightM * geometry.gsdPerM;
  const sees = (s: Spot, c: ShortCell) => {
    const alt = s.groundM + s.heightM, h = alt - c.z;
    if (!(h > low)) return false;
    const ux = Math.sin(s.headingDeg * DEG), uy = Math.cos(s.headingDeg * DEG);
    const dx = c.x - s.x, dy = c.y - s.y;
    const along = dx * ux + dy * uy, across = dx * uy - dy * ux;
    if (Math.abs(across) > 0.5 * h * geometry.tanAcross || Math.abs(along) > 0.5 * h * geometry.tanAlong) return false;
    const [gx, gy] = gradientAt(heightAt, c.x, c.y);
    if (!(gx === gx && gy === gy)) return false;
    return h * geometry.gsdPerM * gsdStretch(ux, uy, dx, dy, h, gx, gy) <= specCm * factor;
  };
  const near = (s: Spot, c: ShortCell) => (Math.hypot(s.x - c.x, s.y - c.y) <= reach(s) && Math.abs(s.groundM - c.z) <= reach(s)) || (c.item === 'gsd' && sees(s, c));
  for (const c of order) {
    const served = out.find((s) => near(s, c));
    if (served) { served.cells++; continue; }
    const before = existing.find((s) => Math.hypot(s.x - c.x, s.y - c.y) <= 2);
    if (before && c.item === 'views') {
      // one more view: another photo beside the earlier one (a lower one would not add a view)
      const x = before.x + 2.5, y = before.y;
      out.push({ x, y, groundM: heightAt(x, y), slopeDeg: c.slopeDeg, headingDeg: contourDeg(heightAt, x, y, layoutHeadingDeg), heightM: spotHeightM(geometry, mission, c.slopeDeg, factor), cells: 1 });
      continue;
    }
    if (before) {
      // already at the clearance: no lower photo is allowed, the cell stays short
      if (before.heightM <= low + 1e-6 || !(c.finestGsdCm > 0)) continue;
      const heightM = Math.max(low, before.heightM * (geometry.specHeightM * geometry.gsdPerM / c.finestGsdCm) * 0.98);
      out.push({ ...before, heightM, cells: 1 });
      continue;
    }
    out.push({ x: c.x, y: c.y, groundM: c.z, slopeDeg: c.slopeDeg, headingDeg: contourDeg(heightAt, c.x, c.y, layoutHeadingDeg), heightM: spotHeightM(geometry, mission, c.slopeDeg, factor), cells: 1 });
  }
  return out;
}

/** Where the tour starts and ends: a point and the altitude there (metres above the grid's datum). */
type Anchor = [number, number, number];

/** Whether a transit from a to b, flown level at the higher of the two altitudes (climb before, descend after, as `transitWarnings` checks it), keeps the clearance. */
function hopClears(a: Anchor, b: Anchor, heightAt: HeightAt, clearanceM: number): boolean {
  return !(transitShortfallM(a, b, Math.max(a[2], b[2]), heightAt, clearanceM) > 0);
}

/** Time of a transit as it is flown: the level distance at the speed plus the change of height at the vertical speeds. */
function hopTimeS(a: Anchor, b: Anchor, mission: Pick<Mission, 'speedMps' | 'climbMps' | 'descentMps'>): number {
  const dz = b[2] - a[2];
  return Math.hypot(b[0] - a[0], b[1] - a[1]) / mission.speedMps + (dz > 0 ? dz / mission.climbMps : -dz / mission.descentMps);
}

/** Greedy order from `start`: the quickest next spot whose transit keeps the clearance (any spot when none does). */
function greedy(spots: Spot[], start: Anchor, mission: Pick<Mission, 'speedMps' | 'climbMps' | 'descentMps'>, clears: (a: Anchor, b: Anchor) => boolean): Spot[] {
  const left = [...spots];
  const out: Spot[] = [];
  let at = start;
  while (left.length) {
    let k = -1, best = Infinity;
    for (let i = 0; i < left.length; i++) {
      const s = left[i];
      const t = hopTimeS(at, where(s), mission);
      if (t < best && clears(at, where(s))) { best = t; k = i; }
    }
    if (k < 0) k = 0;
    const s = left.splice(k, 1)[0];
    out.push(s);
    at = where(s);
  }
  return out;
}

const where = (s: Spot): Anchor => [s.x, s.y, s.groundM + s.heightM];

/**
 * The flying order of spots between two anchors (the end of one layout line and the start of the next): the
 * quickest next spot first (level distance at the speed plus the change of height at the vertical speeds, as the
 * transit is flown), among those whose transit keeps the clearance, so spots at one level are flown together.
 * Built from either anchor; the order with fewer transits inside the clearance wins (the plan warns of any left).
 */
export function tourOrder(spots: Spot[], from: Anchor, to: Anchor, mission: Pick<Mission, 'speedMps' | 'climbMps' | 'descentMps' | 'clearanceM' | 'obstacleAllowanceM'>, heightAt: HeightAt): Spot[] {
  const clearanceM = mission.clearanceM + mission.obstacleAllowanceM;
  const clears = (a: Anchor, b: Anchor) => hopClears(a, b, heightAt, clearanceM);
  const bad = (order: Spot[]) => {
    const stops = [from, ...order.map(where), to];
    let n = 0;
    for (let i = 1; i < stops.length; i++) if (!clears(stops[i - 1], stops[i])) n++;
    return n;
  };
  const forward = greedy(spots, from, mission, clears);
  const fb = bad(forward);
  if (fb === 0) return forward;
  const backward = greedy(spots, to, mission, clears).reverse();
  return bad(backward) < fb ? backward : forward;
}

/**
 * Where a spot tour goes in the flying order: the gap between two lines (`gaps[k]` from the end of line k to the
 * start of line k + 1) and the direction in which its transits in and out keep the clearance, the least extra
 * time first; the last gap when none does (the plan warns of the transit).
 */
export function tourGap(tour: Spot[], gaps: Array<{ from: Anchor; to: Anchor }>, mission: Pick<Mission, 'speedMps' | 'climbMps' | 'descentMps' | 'clearanceM' | 'obstacleAllowanceM'>, heightAt: HeightAt): { gap: number; reversed: boolean } {
  const clearanceM = mission.clearanceM + mission.obstacleAllowanceM;
  const time = (a: Anchor, b: Anchor) => hopTimeS(a, b, mission);
  const first = where(tour[0]), last = where(tour[tour.length - 1]);
  let best = { gap: gaps.length - 1, reversed: false }, bestT = Infinity;
  gaps.forEach((g, k) => {
    for (const reversed of [false, true]) {
      const a = reversed ? last : first, b = reversed ? first : last;
      const t = time(g.from, a) + time(b, g.to) - time(g.from, g.to);
      if (t < bestT && hopClears(g.from, a, heightAt, clearanceM) && hopClears(b, g.to, heightAt, clearanceM)) { bestT = t; best = { gap: k, reversed }; }
    }
  });
  return best;
}

/** Ground gradient at a point: central differences 1 m either side (NaN over unknown ground). */
function gradientAt(heightAt: HeightAt, x: number, y: number): [number, number] {
  return [(heightAt(x + 1, y) - heightAt(x - 1, y)) / 2, (heightAt(x, y + 1) - heightAt(x, y - 1)) / 2];
}

/**
 * Heading along the contour at a point (perpendicular to the steepest slope, from central differences 1 m either
 * side): the altitude fit keeps the clearance over the highest ground within a sample of the photo, which along
 * the contour is the cell's own height. Level ground keeps the layout's heading.
 */
function contourDeg(heightAt: HeightAt, x: number, y: number, fallbackDeg: number): number {
  const [gx, gy] = gradientAt(heightAt, x, y);
  if (!(Math.hypot(gx, gy) > 1e-3)) return fallbackDeg;
  // (−gy, gx) is perpendicular to the gradient; a heading is atan2(east, north)
  return ((Math.atan2(-gy, gx) / DEG) % 360 + 360) % 360;
}

/** A spot as a flight line along the contour: 1 m long, its one photo at the middle, straight above the cell. */
export function spotLine(s: Spot, offsetM: number): FlightLine {
  const headingDeg = s.headingDeg;
  const ux = Math.sin(headingDeg * DEG), uy = Math.cos(headingDeg * DEG);
  return {
    index: 0, headingDeg, offsetM,
    start: [s.x - ux * SPOT_HALF_M, s.y - uy * SPOT_HALF_M], end: [s.x + ux * SPOT_HALF_M, s.y + uy * SPOT_HALF_M],
    lengthM: 2 * SPOT_HALF_M, areaStartM: 0, areaEndM: 2 * SPOT_HALF_M, stationsM: Float64Array.of(SPOT_HALF_M),
  };
}

/** How far above its height a spot's hover may sit before the analysis calls it off the height (metres). */
const SPOT_HEIGHT_SLACK_M = 0.05;

/** Altitude limits of a spot's line: held at the spot's height above the ground under it (a hover, so any gradient). */
export function spotLimits(s: Spot, mission: Mission): AltitudeLimits {
  const clearanceM = mission.clearanceM + mission.obstacleAllowanceM;
  return {
    targetHeightM: s.heightM,
    bandLowM: clearanceM,
    // a centimetre of slack: the ground under the 1 m hover varies by about that, which is no departure from the height
    bandHighM: Math.max(clearanceM, s.heightM) + SPOT_HEIGHT_SLACK_M,
    clearanceM,
    maxAglM: mission.maxAglM,
    climbGradient: 10,
    descentGradient: 10,
    minLegLengthM: 0,
    maxLegsPerLine: 1,
    roundingM: 0,
  };
}

/** One candidate line of a solved layout: laid at a cross-track offset, its ground profile and its altitude legs, flown as fast as the vertical-speed limits let it hold the GSD band. */
import type { Mission } from './mission';
import type { LocalHeights } from './local-frame';
import { planFlightLines, type FlightLine, type LocalPolygon } from './lines';
import { fitAltitudes, type AltitudeLimits, type AltitudeProfile } from './altitude';
import { profileDistances } from './plan';
import type { ViewGeometry } from './solve-geometry';

/** What every line fit needs. */
export interface LineContext {
  area: LocalPolygon;
  headingDeg: number;
  mission: Mission;
  heights: LocalHeights;
  stepM: number;
  geometry: ViewGeometry;
  minSpeedMps: number;
}

/** Stretches the fitted profile misses for a reason a slower leg (a steeper climb or descent) can cure. */
const SPEED_REASONS = new Set(['climb-limit', 'descent-limit', 'max-agl-ahead', 'above-max-agl']);

/** A fitted line: the laid line, its samples, legs and the speed the legs were fitted for. */
export interface FittedLine {
  line: FlightLine;
  x: Float64Array;
  groundM: Float64Array;
  fit: AltitudeProfile;
  limits: AltitudeLimits;
  /** Slowest speed a leg of this line needs (the fit's gradients are the vertical limits over it). */
  fitSpeedMps: number;
  /** Length missed for gradient reasons at the mission's speed (why the line was slowed), metres. */
  slowedForM: number;
  /** The stretches missed for those reasons at the mission's speed (where a cut at a face may help: `solve-cut.ts`). */
  missedAtSpeed: Array<{ startM: number; endM: number }>;
  /** Height factor applied to the spec's GSD height. */
  heightFactor: number;
}

/** Altitude limits of a solved line: the band's top at the spec's GSD height times `factor` (never above the height limit), the gradients at `speedMps`. */
function solvedLimits(ctx: LineContext, factor: number, speedMps: number): AltitudeLimits {
  const m = ctx.mission;
  const clearanceM = m.clearanceM + m.obstacleAllowanceM;
  const top = Math.max(clearanceM + 1, Math.min(m.maxAglM, ctx.geometry.specHeightM * factor));
  const target = Math.max(clearanceM + 0.5, top - Math.max(1, m.altitudeRoundingM));
  return {
    targetHeightM: target,
    bandLowM: Math.min(target, Math.max(clearanceM, 0.6 * top)),
    bandHighM: top,
    clearanceM,
    maxAglM: m.maxAglM,
    climbGradient: m.climbMps / speedMps,
    descentGradient: m.descentMps / speedMps,
    minLegLengthM: m.minLegLengthM,
    maxLegsPerLine: m.maxLegsPerLine,
    roundingM: m.altitudeRoundingM,
  };
}

/** How far a line's photos must reach either side of it: half way to its neighbours. */
export interface Strip { belowM: number; aboveM: number }

/**
 * The ground the GSD band of a line is measured from at each sample distance: across the line's strip, the lowest
 * of g − top · (1 − cos β) (g the ground, β its slope, top the band's top above it). A nadir photo at height h above
 * ground sloping at β spans h·p/f / cos β along the slope (`view-gsd.ts`), so a band top of top · cos β over that
 * ground keeps the spec's GSD there; the lowest ground and the steepest slopes the photos must serve set the band.
 * Cells too steep for any nadir photo above the clearance (`solve-reach.ts`) are left out: they are unreachable.
 */
export function stripLowM(ctx: LineContext, line: FlightLine, x: Float64Array, strip: Strip, bandTopM: number): Float64Array {
  const n = x.length;
  const ux = (line.end[0] - line.start[0]) / (line.lengthM || 1), uy = (line.end[1] - line.start[1]) / (line.lengthM || 1);
  const across = [-strip.belowM, -strip.belowM / 2, 0, strip.aboveM / 2, strip.aboveM];
  const k = across.length, mid = 2;
  const d = Math.max(1, ctx.stepM);
  // five samples per point: the point and its neighbours d away east, west, north and south (for the slope)
  const xs = new Float64Array(n * k * 5), ys = new Float64Array(n * k * 5), g = new Float64Array(n * k * 5);
  const offs = [[0, 0], [d, 0], [-d, 0], [0, d], [0, -d]];
  for (let i = 0; i < n; i++) for (let j = 0; j < k; j++) {
    // right of the flying direction is (uy, -ux)
    const px = line.start[0] + ux * x[i] + uy * across[j], py = line.start[1] + uy * x[i] - ux * across[j];
    for (let o = 0; o < 5; o++) { const q = ((i * k + j) * 5 + o); xs[q] = px + offs[o][0]; ys[q] = py + offs[o][1]; }
  }
  ctx.heights.sampleMany(xs, ys, g);
  const lowest = ctx.mission.clearanceM + ctx.mission.obstacleAllowanceM;
  const low = new Float64Array(n).fill(NaN);
  for (let i = 0; i < n; i++) for (let j = 0; j < k; j++) {
    const q = (i * k + j) * 5;
    const v = g[q];
    if (!(v === v)) continue;
    const gx = g[q + 1] === g[q + 1] && g[q + 2] === g[q + 2] ? (g[q + 1] - g[q + 2]) / (2 * d) : 0;
    const gy = g[q + 3] === g[q + 3] && g[q + 4] === g[q + 4] ? (g[q + 3] - g[q + 4]) / (2 * d) : 0;
    const cosB = 1 / Math.sqrt(1 + gx * gx + gy * gy);
    if (lowest / cosB > ctx.geometry.specHeightM) continue; // unreachable for a nadir photo
    // the point is seen from this line and the neighbour on its side (a strip side away beyond the strip's edge):
    // the better view of the two serves it
    const own = gsdStretch(ux, uy, uy * across[j], -ux * across[j], bandTopM, gx, gy);
    const far = j === mid ? own : across[j] - Math.sign(across[j]) * 2 * (across[j] < 0 ? strip.belowM : strip.aboveM);
    const stretch = j === mid ? own : Math.min(own, gsdStretch(ux, uy, uy * far, -ux * far, bandTopM, gx, gy));
    // seen from this line too obliquely for the GSD even at the clearance: left to its neighbours and spot photos
    if (j !== mid && lowest * stretch > ctx.geometry.specHeightM) continue;
    const e = v - bandTopM * (1 - 1 / stretch);
    if (!(e >= low[i])) low[i] = e;
  }
  return low;
}

/**
 * How much coarser than h·p/f (h the height above the point) a vertical photo sees a ground point offset (hx, hy)
 * across from the point straight below the camera, on ground with gradient (gx, gy): the coarser pixel side of
 * `view-gsd.ts`'s GSD_e = (R·cos α / f)·|e − r̂ (n·e)/(n·r̂)| with R·cos α = h for a vertical camera, over the
 * image axes along (ux, uy) and across the line. Straight below, 1/cos β on a slope β; off to the side, more on
 * ground facing away from the line (the ray meets it at a grazing angle) and less on ground facing it. Infinity
 * where the ray meets the back of the ground.
 */
export function gsdStretch(ux: number, uy: number, hx: number, hy: number, h: number, gx: number, gy: number): number {
  // unnormalised normal n = (−gx, −gy, 1) and ray d = (hx, hy, −h): r̂ (n·e)/(n·r̂) = d (n·e)/(n·d)
  const nd = -gx * hx - gy * hy - h;
  if (!(nd < 0)) return Infinity;
  // along the line (ux, uy) and across it (uy, −ux), written out: called for every sample of every strip
  const ka = (-gx * ux - gy * uy) / nd, kc = (-gx * uy + gy * ux) / nd;
  const ax = ux - hx * ka, ay = uy - hy * ka, az = h * ka;
  const cx = uy - hx * kc, cy = -ux - hy * kc, cz = h * kc;
  return Math.sqrt(Math.max(ax * ax + ay * ay + az * az, cx * cx + cy * cy + cz * cz));
}

/** Ground profile of a laid line at the plan analysis's sample distances, and the ground its band is measured from. */
function lineProfile(ctx: LineContext, line: FlightLine, strip: Strip, bandTopM: number): { x: Float64Array; groundM: Float64Array; bandGroundM: Float64Array } {
  const { x } = profileDistances(line, ctx.stepM);
  const xs = new Float64Array(x.length), ys = new Float64Array(x.length), g = new Float64Array(x.length);
  const dx = (line.end[0] - line.start[0]) / (line.lengthM || 1), dy = (line.end[1] - line.start[1]) / (line.lengthM || 1);
  for (let i = 0; i < x.length; i++) { xs[i] = line.start[0] + dx * x[i]; ys[i] = line.start[1] + dy * x[i]; }
  ctx.heights.sampleMany(xs, ys, g);
  return { x, groundM: g, bandGroundM: stripLowM(ctx, line, x, strip, bandTopM) };
}

/** Speeds tried, fastest first: the mission's, then slower steps down to the slowest allowed. */
function speedSteps(missionSpeedMps: number, minSpeedMps: number): number[] {
  const out: number[] = [];
  for (const f of [1, 0.75, 0.5, 0.35, 0.25, 0.15, 0.1]) {
    const v = missionSpeedMps * f;
    if (v >= minSpeedMps - 1e-9) out.push(v);
  }
  if (out[out.length - 1] > minSpeedMps + 1e-9) out.push(minSpeedMps);
  return out;
}

const gradientMisses = (fit: AltitudeProfile) => fit.unmet.filter((u) => SPEED_REASONS.has(u.reason)).map((u) => ({ startM: u.startM, endM: u.endM }));
/** Length of a fitted line that misses the GSD band for a reason a slower leg (or a cut at a face) can cure, metres. */
export const gradientMissM = (fit: AltitudeProfile) => gradientMisses(fit).reduce((t, u) => t + (u.endM - u.startM), 0);

/** Fit a laid line at the fastest speed step whose gradients hold the band (or the slowest, when none does). */
export function fitAtBestSpeed(ctx: LineContext, line: FlightLine, heightFactor: number, strip: Strip): FittedLine {
  const speeds = speedSteps(ctx.mission.speedMps, ctx.minSpeedMps);
  // the band's top does not depend on the speed: one profile for every speed tried
  const p = lineProfile(ctx, line, strip, solvedLimits(ctx, heightFactor, speeds[0]).bandHighM);
  let first: FittedLine | null = null;
  let best: FittedLine | null = null;
  for (const v of speeds) {
    const limits = solvedLimits(ctx, heightFactor, v);
    const f = { x: p.x, groundM: p.groundM, fit: fitAltitudes(p.x, p.groundM, 'follow', limits, p.bandGroundM) };
    const miss = gradientMissM(f.fit);
    const cand: FittedLine = { line, x: f.x, groundM: f.groundM, fit: f.fit, limits, fitSpeedMps: v, slowedForM: first ? first.slowedForM : miss, missedAtSpeed: first ? first.missedAtSpeed : gradientMisses(f.fit), heightFactor };
    if (!first) first = cand;
    if (!best || miss < gradientMissM(best.fit) - 1e-6) best = cand;
    if (miss <= 1e-6) return cand;
  }
  return best!;
}

/** The pieces of the line at cross-track offset `cM` whose strip reaches `belowM` and `aboveM` either side. */
export function layRow(ctx: LineContext, cM: number, belowM: number, aboveM: number, triggerM: number): FlightLine[] {
  // a lone row's strip is symmetric; give a neighbour on the wider side so the strip spans both halves
  const offsets = [cM - 2 * belowM, cM, cM + 2 * aboveM];
  const lines = planFlightLines(ctx.area, { headingDeg: ctx.headingDeg, lineSpacingM: 2 * Math.max(belowM, aboveM), triggerDistanceM: triggerM, runInM: ctx.mission.runInM, offsetsM: offsets });
  const forward = (l: FlightLine) => { const d = (((l.headingDeg - ctx.headingDeg) % 360) + 360) % 360; return d < 90 || d > 270; };
  return lines.filter((l) => Math.abs(l.offsetM - cM) < 1e-9).map((l) => (forward(l) ? l : reverse(l)));
}

/** The same line flown the other way (distances measured from the other end). */
function reverse(l: FlightLine): FlightLine {
  const st = new Float64Array(l.stationsM.length);
  for (let i = 0; i < st.length; i++) st[i] = l.lengthM - l.stationsM[l.stationsM.length - 1 - i];
  return { ...l, headingDeg: (l.headingDeg + 180) % 360, start: l.end, end: l.start, areaStartM: l.lengthM - l.areaEndM, areaEndM: l.lengthM - l.areaStartM, stationsM: st };
}

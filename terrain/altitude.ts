/** Terrain-following altitudes along a line: the safe gradient-limited floor, the GSD band, leg fitting (`hold`, `steps`, `follow`) and unmet stretches. */
import type { Breakpoints, Corridor } from './altitude-fit';
import { fitFollow, fitHold, fitSteps } from './altitude-fit';
import { check } from './errors';
import type { UnmetReason } from './unmet-words';

/** Altitude modes (Loftline's names): one altitude per line, a few level legs, sloped legs that track the ground. */
export type AltitudeMode = 'hold' | 'steps' | 'follow';

/** Limits for one line's profile; heights in metres, gradients as rise (or fall) over run. */
export interface AltitudeLimits {
  targetHeightM: number;
  /** Band of heights above ground that keep the GSD within tolerance. */
  bandLowM: number;
  bandHighM: number;
  /** Clearance above ground plus the obstacle allowance: the profile never goes below ground + this. */
  clearanceM: number;
  maxAglM: number;
  climbGradient: number;
  descentGradient: number;
  minLegLengthM: number;
  maxLegsPerLine: number;
  roundingM: number;
}

/** One straight altitude leg; distances along the line, altitudes in the grid's vertical datum. */
export interface AltitudeLeg {
  startM: number;
  endM: number;
  altitudeStartM: number;
  altitudeEndM: number;
  /** Rise over run in the flying direction (climb positive). */
  gradient: number;
  aglMinM: number;
  aglMaxM: number;
}

/** A stretch of a line where the profile leaves the GSD band (or the height cap), with the reason. */
export interface UnmetStretch {
  startM: number;
  endM: number;
  reason: UnmetReason;
  message: string;
}

/** The fitted profile of one line. */
export interface AltitudeProfile {
  legs: AltitudeLeg[];
  /** Altitude at each input sample. */
  altitudeM: Float64Array;
  /** Ground used at each sample (unknown samples carried over from known neighbours). */
  groundM: Float64Array;
  /** The lowest safe profile (clearance floor made gradient-feasible). */
  safeFloorM: Float64Array;
  unmet: UnmetStretch[];
  unknownCount: number;
}

/** Throw `invalid-input` unless the limits make sense together. */
function checkAltitudeLimits(l: AltitudeLimits): void {
  const pos = (name: keyof AltitudeLimits) => check(Number.isFinite(l[name]) && l[name] > 0, `${name} must be a positive number, got ${l[name]}.`);
  pos('targetHeightM'); pos('bandLowM'); pos('bandHighM'); pos('maxAglM'); pos('climbGradient'); pos('descentGradient');
  check(l.bandLowM <= l.targetHeightM && l.targetHeightM <= l.bandHighM, `the band ${l.bandLowM}..${l.bandHighM} m must contain the target height ${l.targetHeightM} m.`);
  check(Number.isFinite(l.clearanceM) && l.clearanceM >= 0, `clearance must be zero or more metres, got ${l.clearanceM}.`);
  check(l.clearanceM < l.maxAglM, `clearance plus obstacle allowance (${l.clearanceM} m) must be below the maximum height above ground (${l.maxAglM} m).`);
  check(Number.isFinite(l.minLegLengthM) && l.minLegLengthM >= 0, `minLegLengthM must be zero or more, got ${l.minLegLengthM}.`);
  check(Number.isInteger(l.maxLegsPerLine) && l.maxLegsPerLine >= 1, `maxLegsPerLine must be a whole number of at least 1, got ${l.maxLegsPerLine}.`);
  check(Number.isFinite(l.roundingM) && l.roundingM >= 0, `roundingM must be zero or more, got ${l.roundingM}.`);
}

/** Carry known ground over unknown samples (the higher of the nearest known values on either side). */
function fillUnknown(h: Float64Array): { filled: Float64Array; unknown: Uint8Array; count: number } {
  const n = h.length;
  const filled = new Float64Array(n);
  const unknown = new Uint8Array(n);
  let count = 0;
  let prev = NaN;
  for (let i = 0; i < n; i++) {
    if (h[i] === h[i]) prev = h[i];
    else { unknown[i] = 1; count++; }
    filled[i] = prev;
  }
  let next = NaN;
  for (let i = n - 1; i >= 0; i--) {
    if (!unknown[i]) next = h[i];
    else filled[i] = filled[i] === filled[i] ? (next === next ? Math.max(filled[i], next) : filled[i]) : next;
  }
  return { filled, unknown, count };
}

/**
 * The smallest profile above `floor` whose climbs stay within `climb` and descents within `descent`
 * (rise or fall over run): a forward pass bounds descents, a backward pass bounds climbs
 * (the two-pass lower envelope of DOMAIN.md, with separate climb and descent limits).
 */
export function safeProfile(x: Float64Array, floor: Float64Array, climb: number, descent: number): { safe: Float64Array; forward: Float64Array } {
  const n = x.length;
  const f = new Float64Array(n);
  const z = new Float64Array(n);
  for (let i = 0; i < n; i++) f[i] = i === 0 ? floor[0] : Math.max(floor[i], f[i - 1] - descent * (x[i] - x[i - 1]));
  for (let i = n - 1; i >= 0; i--) z[i] = i === n - 1 ? f[i] : Math.max(f[i], z[i + 1] - climb * (x[i + 1] - x[i]));
  return { safe: z, forward: f };
}

/**
 * The largest profile below `ceiling` within the climb and descent limits (the mirror of `safeProfile`):
 * a forward pass bounds climbs, a backward pass bounds descents.
 */
function ceilingProfile(x: Float64Array, ceiling: Float64Array, climb: number, descent: number): { high: Float64Array; forward: Float64Array } {
  const n = x.length;
  const f = new Float64Array(n);
  const z = new Float64Array(n);
  for (let i = 0; i < n; i++) f[i] = i === 0 ? ceiling[0] : Math.min(ceiling[i], f[i - 1] + climb * (x[i] - x[i - 1]));
  for (let i = n - 1; i >= 0; i--) z[i] = i === n - 1 ? f[i] : Math.min(f[i], z[i + 1] + descent * (x[i + 1] - x[i]));
  return { high: z, forward: f };
}

/** Ground at distance `d` by linear interpolation between samples (clamped at the ends). */
function groundAt(x: Float64Array, h: Float64Array, d: number): number {
  const n = x.length;
  if (d <= x[0]) return h[0];
  if (d >= x[n - 1]) return h[n - 1];
  let lo = 0, hi = n - 1;
  while (hi - lo > 1) { const m = (lo + hi) >> 1; if (x[m] <= d) lo = m; else hi = m; }
  return h[lo] + ((h[hi] - h[lo]) * (d - x[lo])) / (x[hi] - x[lo]);
}

/** Linear interpolation of breakpoints at increasing sample positions. */
function evaluate(bp: Breakpoints, x: Float64Array): Float64Array {
  const out = new Float64Array(x.length);
  let k = 0;
  for (let i = 0; i < x.length; i++) {
    while (k < bp.x.length - 2 && x[i] > bp.x[k + 1]) k++;
    const x0 = bp.x[k], x1 = bp.x[k + 1];
    out[i] = x1 > x0 ? bp.z[k] + ((bp.z[k + 1] - bp.z[k]) * (x[i] - x0)) / (x1 - x0) : bp.z[k];
  }
  return out;
}

/**
 * Fit the legs of one line. `x` are distances along the line in the flying direction (increasing, at least
 * two), `ground` the heights under them (NaN unknown). The profile never goes below ground + clearance at a
 * sample (nor at a neighbouring sample: the floor is the highest of three), keeps climbs and descents within
 * their gradients, and reports every stretch outside the GSD band or the height cap with its reason.
 */
export function fitAltitudes(x: Float64Array, ground: Float64Array, mode: AltitudeMode, lim: AltitudeLimits, bandGround?: Float64Array): AltitudeProfile {
  checkAltitudeLimits(lim);
  check(mode === 'hold' || mode === 'steps' || mode === 'follow', `mode must be "hold", "steps" or "follow", got ${JSON.stringify(mode)}.`);
  const n = x.length;
  check(n >= 2 && ground.length === n, `need at least two samples with a ground height each, got ${n} and ${ground.length}.`);
  for (let i = 1; i < n; i++) check(x[i] > x[i - 1], `sample distances must increase, got ${x[i - 1]} then ${x[i]}.`);
  const { filled: h, unknown, count: unknownCount } = fillUnknown(ground);
  if (unknownCount === n) {
    return { legs: [], altitudeM: new Float64Array(n).fill(NaN), groundM: h, safeFloorM: new Float64Array(n).fill(NaN), unknownCount,
      unmet: [{ startM: x[0], endM: x[n - 1], reason: 'ground-unknown', message: 'No elevation data under this line: it cannot be planned over this grid.' }] };
  }
  const floor = new Float64Array(n);
  for (let i = 0; i < n; i++) floor[i] = Math.max(h[i], h[i > 0 ? i - 1 : i], h[i < n - 1 ? i + 1 : i]) + lim.clearanceM;
  const { safe, forward } = safeProfile(x, floor, lim.climbGradient, lim.descentGradient);
  // the GSD band may be measured from lower ground than the line's own (the lowest ground its photos must reach);
  // clearance and the height limit stay with the ground under the aircraft
  let bg = h;
  if (bandGround) {
    check(bandGround.length === n, `band ground needs one height per sample, got ${bandGround.length} for ${n}.`);
    bg = new Float64Array(n);
    for (let i = 0; i < n; i++) bg[i] = bandGround[i] === bandGround[i] ? Math.min(bandGround[i], h[i]) : h[i];
  }
  const { c, b } = corridor(x, h, floor, safe, lim, bg);
  const g = { climb: lim.climbGradient, descent: lim.descentGradient };
  const lengthM = x[n - 1] - x[0];
  const fit = (minLeg: number): Breakpoints => {
    const legLim = { minLegLengthM: minLeg, roundingM: lim.roundingM };
    return mode === 'hold' ? fitHold(c, legLim) : mode === 'steps' ? fitSteps(c, g, legLim) : fitFollow(c, g, legLim);
  };
  let bp = fit(lim.minLegLengthM);
  let limitedByLegs = false;
  if (bp.x.length - 1 > lim.maxLegsPerLine) {
    // a longer minimum leg bounds the count: follow makes at most length / minLeg legs, steps 2 levels - 1
    const pieces = mode === 'steps' ? Math.max(1, Math.floor((lim.maxLegsPerLine + 1) / 2)) : lim.maxLegsPerLine;
    bp = fit(Math.max(lim.minLegLengthM, lengthM / pieces));
    limitedByLegs = true;
    if (bp.x.length - 1 > lim.maxLegsPerLine) bp = fitHold(c, { minLegLengthM: lengthM, roundingM: lim.roundingM });
  }
  const z = evaluate(bp, x);
  for (let i = 0; i < n; i++) {
    if (z[i] < floor[i] - 1e-6) throw new Error(`altitude fit left the clearance floor at ${x[i].toFixed(1)} m (${z[i]} < ${floor[i]}): a bug, please report.`);
  }
  const legs: AltitudeLeg[] = [];
  let i = 0;
  for (let k = 0; k + 1 < bp.x.length; k++) {
    const x0 = bp.x[k], x1 = bp.x[k + 1];
    // height above ground at both leg ends (ground interpolated there) and at every sample between
    let aMin = Math.min(bp.z[k] - groundAt(x, h, x0), bp.z[k + 1] - groundAt(x, h, x1));
    let aMax = Math.max(bp.z[k] - groundAt(x, h, x0), bp.z[k + 1] - groundAt(x, h, x1));
    while (i < n && x[i] < x0 - 1e-9) i++;
    for (let j = i; j < n && x[j] <= x1 + 1e-9; j++) {
      const agl = z[j] - h[j];
      if (agl < aMin) aMin = agl;
      if (agl > aMax) aMax = agl;
    }
    legs.push({ startM: x0, endM: x1, altitudeStartM: bp.z[k], altitudeEndM: bp.z[k + 1], gradient: (bp.z[k + 1] - bp.z[k]) / (x1 - x0), aglMinM: aMin, aglMaxM: aMax });
  }
  const unmet = classify(x, h, z, unknown, c, b, forward, mode, limitedByLegs, lim, bg);
  return { legs, altitudeM: z, groundM: h, safeFloorM: safe, unmet, unknownCount };
}

/** Gradient-feasible bounds behind the corridor, kept for telling why the band was left. */
interface Bounds {
  capHigh: Float64Array; // highest feasible profile under the height cap (never below the safe profile)
  bandLow: Float64Array; // lowest feasible profile above the band's lower edge and the safe profile
  bandLowForward: Float64Array;
  bandLowBase: Float64Array;
  bandHigh: Float64Array; // highest feasible profile under the band's upper edge (and capHigh)
  bandHighForward: Float64Array;
  bandHighBase: Float64Array;
}

/**
 * The corridor the legs are fitted in, with both edges gradient-feasible so a leg can always go on:
 * lower edge the lowest feasible profile above the band and the safe profile, but never above the highest
 * feasible profile under the height cap (the cap outranks the band); upper edge the highest feasible profile
 * under the band and the cap. Where the two cross (the band cannot be held within the gradients) the corridor
 * is the lower edge and a little room above it. The safe profile is never given up.
 */
function corridor(x: Float64Array, h: Float64Array, floor: Float64Array, safe: Float64Array, lim: AltitudeLimits, bg: Float64Array = h): { c: Corridor; b: Bounds } {
  const n = x.length;
  const mk = () => new Float64Array(n);
  const c: Corridor = { x, lo: mk(), hi: mk(), hardLo: safe, floor, target: mk(), bandLo: mk(), bandHi: mk(), cap: mk(), capHigh: mk() };
  const { climbGradient: gc, descentGradient: gd } = lim;
  for (let i = 0; i < n; i++) {
    c.cap[i] = h[i] + lim.maxAglM;
    c.bandLo[i] = bg[i] + lim.bandLowM;
    c.bandHi[i] = bg[i] + lim.bandHighM;
    c.target[i] = bg[i] + lim.targetHeightM;
  }
  const capHigh = ceilingProfile(x, c.cap, gc, gd).high;
  for (let i = 0; i < n; i++) capHigh[i] = Math.max(capHigh[i], safe[i]);
  c.capHigh = capHigh;
  // Lower edge at the target height, not the band's: below the target the footprints shrink and the overlaps
  // fall under their targets, so the band's lower half is left to where the limits force it (unmet stretches
  // and forced legs are judged against the whole band).
  const lowBase = mk();
  for (let i = 0; i < n; i++) lowBase[i] = Math.max(c.target[i], safe[i]);
  const low = safeProfile(x, lowBase, gc, gd);
  // every mode rounds altitudes up: aim one rounding step under the band top
  const highBase = mk();
  for (let i = 0; i < n; i++) highBase[i] = Math.min(c.bandHi[i] - lim.roundingM, capHigh[i]);
  const high = ceilingProfile(x, highBase, gc, gd);
  // Where the band cannot be held the corridor is the lower edge plus a little room (capped by the height
  // limit): a zero-width corridor along a ramp of exactly the limit gradient would make every leg end at
  // the first rounding error.
  const room = Math.max(lim.roundingM, 0.25 * (lim.bandHighM - lim.bandLowM), 0.1);
  for (let i = 0; i < n; i++) {
    const lo = Math.min(low.safe[i], capHigh[i]);
    c.lo[i] = lo;
    let hi = high.high[i];
    if (hi < lo + room && high.high[i] < low.safe[i] - 1e-9) hi = capHigh[i] - lo >= 1e-3 ? Math.min(lo + room, capHigh[i]) : lo + 1e-6;
    c.hi[i] = Math.max(hi, lo + 1e-6);
  }
  return { c, b: { capHigh, bandLow: low.safe, bandLowForward: low.forward, bandLowBase: lowBase, bandHigh: high.high, bandHighForward: high.forward, bandHighBase: highBase } };
}

const fmt = (v: number) => (Math.round(v * 10) / 10).toString();

/** Per-sample reason for leaving the band, merged into stretches with messages. */
function classify(
  x: Float64Array, h: Float64Array, z: Float64Array, unknown: Uint8Array, c: Corridor, b: Bounds, safeForward: Float64Array,
  mode: AltitudeMode, limitedByLegs: boolean, lim: AltitudeLimits, bg: Float64Array = h,
): UnmetStretch[] {
  const n = x.length;
  const eps = 1e-6;
  const reasons: Array<UnmetReason | null> = new Array(n).fill(null);
  const byMode = new Uint8Array(n); // above the cap by the mode's choice, not forced by clearance and gradients
  for (let i = 0; i < n; i++) {
    const agl = z[i] - h[i];
    const aglB = z[i] - bg[i]; // height above the ground the band is measured from (the line's own unless given)
    if (unknown[i]) { reasons[i] = 'ground-unknown'; continue; }
    if (aglB >= lim.bandLowM - eps && aglB <= lim.bandHighM + eps && agl <= lim.maxAglM + eps) continue;
    if (lim.bandLowM > lim.maxAglM) { reasons[i] = 'band-above-max-agl'; continue; }
    if (agl > lim.maxAglM + eps) { reasons[i] = 'above-max-agl'; byMode[i] = c.hardLo[i] <= c.cap[i] + eps ? 1 : 0; continue; }
    const safe = c.hardLo[i];
    if (aglB > lim.bandHighM && safe > c.bandHi[i] + eps) {
      reasons[i] = lim.clearanceM > lim.bandHighM + eps ? 'clearance-above-band' : safe > safeForward[i] + eps ? 'climb-limit' : 'descent-limit';
      continue;
    }
    if (aglB < lim.bandLowM && b.capHigh[i] < c.bandLo[i] - eps) { reasons[i] = 'max-agl-ahead'; continue; }
    if (b.bandLow[i] > b.bandHigh[i] + eps) {
      // the band cannot be held within the gradients here: which limit bent the edge the profile left by?
      if (aglB > lim.bandHighM) reasons[i] = b.bandLow[i] > b.bandLowForward[i] + eps ? 'climb-limit' : 'descent-limit';
      else reasons[i] = b.bandHigh[i] < b.bandHighForward[i] - eps ? 'descent-limit' : 'climb-limit';
      continue;
    }
    reasons[i] = limitedByLegs ? 'leg-limits' : mode === 'hold' ? 'hold' : mode === 'steps' ? 'steps' : 'leg-limits';
  }
  const out: UnmetStretch[] = [];
  let i = 0;
  while (i < n) {
    const r = reasons[i];
    if (r === null) { i++; continue; }
    let j = i;
    let worst = 0;
    while (j + 1 < n && reasons[j + 1] === r && byMode[j + 1] === byMode[i]) j++;
    for (let k = i; k <= j; k++) worst = Math.max(worst, Math.abs(z[k] - h[k] - lim.targetHeightM));
    const msg = r === 'above-max-agl' && byMode[i] ? modeCapMessage(mode, limitedByLegs, lim) : message(r, lim, worst);
    out.push({ startM: x[i], endM: x[j], reason: r, message: msg });
    i = j + 1;
  }
  return out;
}

function modeCapMessage(mode: AltitudeMode, limitedByLegs: boolean, lim: AltitudeLimits): string {
  const why = limitedByLegs ? 'the maximum legs per line or the minimum leg length'
    : mode === 'hold' ? 'one altitude for the whole line' : mode === 'steps' ? 'level legs' : 'the minimum leg length';
  return `The aircraft is above the ${fmt(lim.maxAglM)} m height limit here because of ${why}; a terrain-following mode or shorter legs would keep under it.`;
}

function message(r: UnmetReason, lim: AltitudeLimits, worstM: number): string {
  switch (r) {
    case 'ground-unknown': return 'No elevation data here (nodata or off the grid): ground carried over from the nearest known samples; check this stretch by other means.';
    case 'above-max-agl': return `The aircraft is above the ${fmt(lim.maxAglM)} m height limit here: clearance and the climb/descent limits leave no lower way (up to ${fmt(worstM)} m off the target height).`;
    case 'max-agl-ahead': return `Keeping under the ${fmt(lim.maxAglM)} m height limit over lower ground nearby makes the aircraft fly below the GSD band here (up to ${fmt(worstM)} m off the target height).`;
    case 'band-above-max-agl': return `The target GSD needs at least ${fmt(lim.bandLowM)} m above ground, more than the ${fmt(lim.maxAglM)} m height limit.`;
    case 'clearance-above-band': return `Clearance plus obstacle allowance (${fmt(lim.clearanceM)} m) needs more height than the GSD band allows (up to ${fmt(lim.bandHighM)} m).`;
    case 'climb-limit': return `The climb limit (gradient ${lim.climbGradient.toFixed(3)}) makes the aircraft climb early ahead of rising ground, up to ${fmt(worstM)} m off the target height.`;
    case 'descent-limit': return `The descent limit (gradient ${lim.descentGradient.toFixed(3)}) keeps the aircraft high after a crest, up to ${fmt(worstM)} m off the target height.`;
    case 'hold': return `One altitude for the whole line cannot stay in the GSD band over this relief (up to ${fmt(worstM)} m off the target height).`;
    case 'steps': return `Level legs and the climbs between them leave the GSD band here (up to ${fmt(worstM)} m off the target height).`;
    case 'leg-limits': return `The minimum leg length or the maximum legs per line keep the profile from following the ground here (up to ${fmt(worstM)} m off the target height).`;
  }
}

/** Leg fitting inside an altitude corridor: level legs (`hold`, `steps`) and sloped legs (`follow`), all gradient-limited. */

/** Per-sample corridor along a line, in the flying direction; all arrays the same length. */
export interface Corridor {
  x: Float64Array; // distance along the line, increasing
  lo: Float64Array; // soft lower bound (band, never below hardLo)
  hi: Float64Array; // soft upper bound (band and height cap)
  hardLo: Float64Array; // lowest safe, gradient-feasible profile
  floor: Float64Array; // clearance floor (ground + clearance)
  target: Float64Array; // altitude giving the target GSD
  bandLo: Float64Array; // band bounds without the safety terms, for choosing levels
  bandHi: Float64Array;
  cap: Float64Array; // ground + maximum height above ground
  capHigh: Float64Array; // highest gradient-feasible profile under the cap (never below hardLo)
}

/** Climb and descent limits as positive gradients (rise or fall over run). */
interface Gradients {
  climb: number;
  descent: number;
}

/** A continuous piecewise-linear profile: breakpoints (x, z). */
export interface Breakpoints {
  x: number[];
  z: number[];
}

/** Slack when comparing slopes (rise over run): far below any gradient that matters, far above rounding noise. */
const SLOPE_TOL = 1e-9;

/** Slack on band edges when counting samples inside their band, in metres. */
const BAND_EPS_M = 1e-6;

/** Leg-shape limits. */
interface LegLimits {
  minLegLengthM: number;
  roundingM: number;
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Round an altitude up to the next multiple of `step` (no rounding when step is 0). */
function roundUp(z: number, step: number): number {
  return step > 0 ? Math.ceil(z / step - 1e-9) * step : z;
}

/**
 * The one altitude for samples [i0, i1] that keeps the most samples inside their band, never below the
 * highest clearance floor there; ties go to the altitude nearest the median target. A sweep over the band
 * interval ends (an O(n log n) "most overlapping intervals" count).
 */
function bestLevel(c: Corridor, i0: number, i1: number): number {
  let zMin = -Infinity;
  let capMin = Infinity;
  const targets: number[] = [];
  const vals: number[] = [];
  const kinds: number[] = [];
  for (let i = i0; i <= i1; i++) {
    if (c.floor[i] > zMin) zMin = c.floor[i];
    if (c.cap[i] < capMin) capMin = c.cap[i];
    targets.push(c.target[i]);
    const lo = c.bandLo[i], hi = Math.min(c.bandHi[i], c.cap[i]);
    // widened by a micrometre so that bands meeting exactly (a zero GSD tolerance) still meet after rounding noise
    if (lo <= hi) { vals.push(lo - BAND_EPS_M, hi + BAND_EPS_M); kinds.push(1, -1); }
  }
  const t = median(targets);
  const order = vals.map((_, k) => k).sort((p, q) => vals[p] - vals[q] || kinds[q] - kinds[p]); // opens first: closed intervals
  const m = order.length;
  const nextClose = new Float64Array(m + 1).fill(Infinity); // value of the first close at or after position k
  for (let k = m - 1; k >= 0; k--) nextClose[k] = kinds[order[k]] < 0 ? vals[order[k]] : nextClose[k + 1];
  let count = 0, bestCount = 0, bestZ = NaN, bestDist = Infinity;
  for (let k = 0; k < m; k++) {
    count += kinds[order[k]];
    const v = vals[order[k]];
    const lastOpenHere = kinds[order[k]] > 0 && !(k + 1 < m && kinds[order[k + 1]] > 0 && vals[order[k + 1]] === v);
    if (!lastOpenHere) continue;
    // on [v, next close] exactly `count` intervals hold
    const from = Math.max(v, zMin), to = nextClose[k + 1];
    if (from > to) continue;
    const z = Math.min(Math.max(t, from), to);
    const dist = Math.abs(z - t);
    // ties go to the lower altitude, so that the choice does not depend on rounding noise
    if (count > bestCount || (count === bestCount && (dist < bestDist - 1e-9 || (Math.abs(dist - bestDist) <= 1e-9 && z < bestZ)))) { bestCount = count; bestZ = z; bestDist = dist; }
  }
  if (bestCount === 0) return Math.max(zMin, Math.min(t, capMin));
  return Math.max(bestZ, zMin);
}

/** `hold`: one level over the whole line. */
export function fitHold(c: Corridor, lim: LegLimits): Breakpoints {
  const n = c.x.length;
  const z = roundUp(bestLevel(c, 0, n - 1), lim.roundingM);
  return { x: [c.x[0], c.x[n - 1]], z: [z, z] };
}

/**
 * `steps`: greedy level stretches (as long as one altitude fits the corridor, at least the minimum leg
 * length), each at its best level, then joined by climbs and descents at the gradient limits. The joined
 * profile is the smallest gradient-feasible profile above the levels, computed exactly: on stretch k it is
 * max(z_k, R_k + g_c x, L_k - g_d x) with R_k, L_k the suffix and prefix maxima of the neighbours' cones.
 */
export function fitSteps(c: Corridor, g: Gradients, lim: LegLimits): Breakpoints {
  const n = c.x.length;
  const seg: Array<{ a: number; b: number; z: number }> = [];
  let a = 0;
  while (a < n - 1) {
    let maxLo = -Infinity, minHi = Infinity, ok = a;
    for (let j = a; j < n; j++) {
      const lo = Math.max(maxLo, c.lo[j]), hi = Math.min(minHi, c.hi[j]);
      if (lo > hi + 1e-9) break;
      maxLo = lo; minHi = hi; ok = j;
    }
    let b = ok;
    let forced = false;
    if (c.x[b] - c.x[a] < lim.minLegLengthM || b === a) {
      while (b < n - 1 && (c.x[b] - c.x[a] < lim.minLegLengthM || b === a)) b++;
      forced = b > ok;
    }
    if (n - 1 - b > 0 && c.x[n - 1] - c.x[b] < lim.minLegLengthM) { b = n - 1; forced = forced || b > ok; }
    let z: number;
    if (!forced) {
      const t: number[] = [];
      for (let i = a; i <= b; i++) t.push(c.target[i]);
      z = Math.min(Math.max(median(t), maxLo), minHi);
    } else z = bestLevel(c, a, b);
    let floorMax = -Infinity;
    for (let i = a; i <= b; i++) if (c.floor[i] > floorMax) floorMax = c.floor[i];
    seg.push({ a, b, z: roundUp(Math.max(z, floorMax), lim.roundingM) });
    a = b;
  }
  if (seg.length === 0) seg.push({ a: 0, b: n - 1, z: roundUp(bestLevel(c, 0, n - 1), lim.roundingM) });
  // Climbs and descents eat into the level stretches: merge a stretch whose level part ends up shorter than
  // the minimum leg into its nearer-in-altitude neighbour (re-levelled over both, never below their floors).
  for (;;) {
    for (let k = seg.length - 1; k > 0; k--) {
      if (Math.abs(seg[k].z - seg[k - 1].z) < 1e-9) { seg[k - 1].b = seg[k].b; seg.splice(k, 1); }
    }
    const lv = seg.map((s) => ({ x0: c.x[s.a], x1: c.x[s.b], z: s.z }));
    const { flatM } = levelCones(lv, g);
    // the shortest offender: a level part or a climb/descent between two levels shorter than the minimum leg
    let worst = -1, nb = -1, worstLen = Infinity;
    for (let k = 0; k < lv.length; k++) {
      // equal offenders (to a nanometre) go in line order, so that rounding noise cannot pick among them
      if (flatM[k] < lim.minLegLengthM - 1e-9 && flatM[k] < worstLen - 1e-9) {
        worstLen = flatM[k];
        worst = k;
        nb = k === 0 ? 1 : k === lv.length - 1 ? k - 1 : Math.abs(lv[k - 1].z - lv[k].z) <= Math.abs(lv[k + 1].z - lv[k].z) + 1e-9 ? k - 1 : k + 1;
      }
      if (k + 1 < lv.length) {
        const dz = lv[k + 1].z - lv[k].z;
        const ramp = dz > 0 ? dz / g.climb : -dz / g.descent;
        if (ramp < lim.minLegLengthM - 1e-9 && ramp < worstLen - 1e-9) { worstLen = ramp; worst = k; nb = k + 1; }
      }
    }
    if (worst < 0 || seg.length === 1) return joinLevels(lv, g);
    const a0 = Math.min(seg[worst].a, seg[nb].a), b0 = Math.max(seg[worst].b, seg[nb].b);
    let floorMax = -Infinity;
    for (let i = a0; i <= b0; i++) if (c.floor[i] > floorMax) floorMax = c.floor[i];
    const merged = { a: a0, b: b0, z: roundUp(Math.max(bestLevel(c, a0, b0), floorMax), lim.roundingM) };
    seg.splice(Math.min(worst, nb), 2, merged);
  }
}

/** Prefix and suffix cone maxima of level stretches, and the length each level keeps flat once joined. */
function levelCones(lv: Array<{ x0: number; x1: number; z: number }>, g: Gradients): { R: Float64Array; L: Float64Array; flatM: Float64Array } {
  const m = lv.length;
  const R = new Float64Array(m).fill(-Infinity); // max over j > k of (z_j - gc * x0_j)
  const L = new Float64Array(m).fill(-Infinity); // max over j < k of (z_j + gd * x1_j)
  for (let k = m - 2; k >= 0; k--) R[k] = Math.max(R[k + 1], lv[k + 1].z - g.climb * lv[k + 1].x0);
  for (let k = 1; k < m; k++) L[k] = Math.max(L[k - 1], lv[k - 1].z + g.descent * lv[k - 1].x1);
  const flatM = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    const from = Math.max(lv[k].x0, (L[k] - lv[k].z) / g.descent);
    const to = Math.min(lv[k].x1, (lv[k].z - R[k]) / g.climb);
    flatM[k] = Math.max(0, to - from);
  }
  return { R, L, flatM };
}

/** Smallest gradient-feasible profile above a sequence of level stretches, as exact breakpoints. */
function joinLevels(lv: Array<{ x0: number; x1: number; z: number }>, g: Gradients): Breakpoints {
  const m = lv.length;
  const { R, L } = levelCones(lv, g);
  const xs: number[] = [];
  const zs: number[] = [];
  const at = (k: number, x: number) => Math.max(lv[k].z, R[k] + g.climb * x, L[k] - g.descent * x);
  const push = (x: number, z: number) => {
    // breakpoints closer than a micrometre are one (a shorter piece would turn rounding noise into slope)
    if (xs.length && Math.abs(x - xs[xs.length - 1]) < 1e-6) { zs[zs.length - 1] = Math.max(zs[zs.length - 1], z); return; }
    xs.push(x); zs.push(z);
  };
  for (let k = 0; k < m; k++) {
    const { x0, x1, z } = lv[k];
    const cuts = [x0];
    const xL = (L[k] - z) / g.descent; // descent line meets the level
    const xR = (z - R[k]) / g.climb; // climb line leaves the level
    const xX = (L[k] - R[k]) / (g.climb + g.descent); // descent meets climb
    for (const xc of [xL, xR, xX]) if (Number.isFinite(xc) && xc > x0 && xc < x1) cuts.push(xc);
    cuts.push(x1);
    cuts.sort((p, q) => p - q);
    for (const xc of cuts) push(xc, at(k, xc));
  }
  if (xs.length === 1) { xs.push(lv[m - 1].x1); zs.push(zs[0]); }
  xs[xs.length - 1] = lv[m - 1].x1; // the line's end exactly
  return enforceGradients(simplify({ x: xs, z: zs }), g);
}

/**
 * Raise the lower end of any leg that rounding noise left a hair steeper than the limits (raising only,
 * so clearance is kept); legs are otherwise built at or inside the limits.
 */
function enforceGradients(bp: Breakpoints, g: Gradients): Breakpoints {
  const { x, z } = bp;
  for (let pass = 0; pass < 1000; pass++) {
    let changed = false;
    for (let i = 0; i + 1 < x.length; i++) {
      const dx = x[i + 1] - x[i];
      if (z[i + 1] - z[i] > g.climb * dx) { z[i] = z[i + 1] - g.climb * dx; changed = true; }
      else if (z[i] - z[i + 1] > g.descent * dx) { z[i + 1] = z[i] - g.descent * dx; changed = true; }
    }
    if (!changed) break;
  }
  return bp;
}

/** Drop breakpoints where the slope does not change. */
function simplify(bp: Breakpoints): Breakpoints {
  const x = [bp.x[0]], z = [bp.z[0]];
  for (let i = 1; i < bp.x.length - 1; i++) {
    const s0 = (bp.z[i] - z[z.length - 1]) / (bp.x[i] - x[x.length - 1]);
    const s1 = (bp.z[i + 1] - bp.z[i]) / (bp.x[i + 1] - bp.x[i]);
    if (Math.abs(s0 - s1) > 1e-9) { x.push(bp.x[i]); z.push(bp.z[i]); }
  }
  x.push(bp.x[bp.x.length - 1]);
  z.push(bp.z[bp.z.length - 1]);
  return { x, z };
}

/**
 * `follow`: greedy longest sloped legs. From each leg start, the leg grows while one slope keeps every
 * sample inside the corridor and within the gradients (the feasible slope interval shrinks sample by
 * sample, as in O'Rourke's stabbing of intervals by a line); its end is the point nearest the target there.
 * A leg shorter than the minimum is forced on to the minimum length under the hard limits only (above the
 * safe profile, within the gradients); a leg that would leave less than the minimum to the line's end is
 * ended earlier where it can be, so only a forced last leg can be shorter than the minimum.
 */
export function fitFollow(c: Corridor, g: Gradients, lim: LegLimits): Breakpoints {
  const n = c.x.length;
  const xs = [c.x[0]];
  const zs = [Math.min(Math.max(c.target[0], c.lo[0]), c.hi[0])];
  const minLeg = lim.minLegLengthM;
  let a = 0;
  while (a < n - 1) {
    const za = zs[zs.length - 1];
    const interval = (upTo: number): [number, number, number] => {
      let sLo = -g.descent, sHi = g.climb, ok = a;
      for (let j = a + 1; j <= upTo; j++) {
        const dx = c.x[j] - c.x[a];
        const lo = Math.max(sLo, (c.lo[j] - za) / dx), hi = Math.min(sHi, (c.hi[j] - za) / dx);
        // a ramp of exactly the limit gradient meets the limit itself: compare with a tolerance, not bit for bit
        if (lo > hi + SLOPE_TOL) break;
        sLo = lo; sHi = hi; ok = j;
      }
      return [ok, sLo, sHi];
    };
    let [ok, sLo, sHi] = interval(n - 1);
    let b = ok;
    let slope: number;
    if (ok === a || (c.x[ok] - c.x[a] < minLeg && ok < n - 1)) {
      b = a + 1;
      while (b < n - 1 && c.x[b] - c.x[a] < minLeg) b++;
      slope = hardSlope(c, g, a, b, za);
    } else {
      if (ok < n - 1 && c.x[n - 1] - c.x[ok] < minLeg) {
        // leave the last leg its minimum length: end this one earlier (any prefix of a feasible leg is feasible)
        let e = ok;
        while (e > a && c.x[n - 1] - c.x[e] < minLeg) e--;
        if (e > a && c.x[e] - c.x[a] >= minLeg) { b = e; [, sLo, sHi] = interval(b); }
      }
      const want = (Math.min(Math.max(c.target[b], c.lo[b]), c.hi[b]) - za) / (c.x[b] - c.x[a]);
      slope = Math.min(Math.max(want, sLo), sHi, g.climb);
      if (slope < -g.descent) slope = -g.descent;
    }
    xs.push(c.x[b]);
    zs.push(za + slope * (c.x[b] - c.x[a]));
    a = b;
  }
  return enforceGradients(roundFollow(simplify({ x: xs, z: zs }), g, lim.roundingM), g);
}

/**
 * Slope from (x_a, za) to sample b that stays above the safe profile and within the gradients, under the
 * height cap too where that is still possible, nearest the target's.
 */
function hardSlope(c: Corridor, g: Gradients, a: number, b: number, za: number): number {
  let lo = -g.descent, capHi = g.climb;
  for (let i = a + 1; i <= b; i++) {
    const dx = c.x[i] - c.x[a];
    lo = Math.max(lo, (c.hardLo[i] - za) / dx);
    capHi = Math.min(capHi, (c.capHigh[i] - za) / dx);
  }
  const hi = capHi >= lo ? capHi : Math.max(lo, g.climb);
  const want = (Math.min(Math.max(c.target[b], c.lo[b]), c.hi[b]) - za) / (c.x[b] - c.x[a]);
  return Math.min(Math.max(want, lo), hi);
}

/**
 * Round breakpoint altitudes up to the rounding step, then raise the lower end of any leg the rounding made
 * too steep, until every leg is within the gradients again (raising only, so clearance is kept).
 */
function roundFollow(bp: Breakpoints, g: Gradients, step: number): Breakpoints {
  if (!(step > 0)) return bp;
  const z = bp.z.map((v) => roundUp(v, step));
  const x = bp.x;
  for (let pass = 0; pass < 100_000; pass++) {
    let changed = false;
    for (let i = 0; i + 1 < x.length; i++) {
      const dx = x[i + 1] - x[i];
      const s = (z[i + 1] - z[i]) / dx;
      if (s > g.climb + 1e-12) { z[i] = roundUp(z[i + 1] - g.climb * dx, step); changed = true; }
      else if (-s > g.descent + 1e-12) { z[i + 1] = roundUp(z[i] - g.descent * dx, step); changed = true; }
    }
    if (!changed) break;
  }
  return { x: [...x], z };
}

/** Distance-based photo spacing that varies along a line with the height above the highest ground under the photo. */
import type { FlightLine } from './lines';
import type { LocalHeights } from './local-frame';

/** Photo spacing along one line and what set its tightest step. */
interface LineTriggers {
  stationsM: Float64Array;
  /** Smallest and largest spacing used, metres. */
  minM: number;
  maxM: number;
  /** Where the smallest spacing is (distance along the line) and the highest ground that set it. */
  tightestAtM: number;
  tightestGroundM: number;
}

/**
 * Stations from the start of the area less half a spacing to its end plus half a spacing (inside the line's
 * run-in and run-out): each step is (1 − forward overlap) × the along-track footprint guaranteed under the
 * envelope's pitch, 2 · tan(half-angle − pitch) · (altitude − highest ground within the photo's reach across the
 * strip and half a footprint along) — the smallest step over the stretch the step spans, so no photo pair
 * falls under the overlap anywhere between them.
 */
export function placeTriggers(
  line: FlightLine, x: Float64Array, altitudeM: Float64Array, heights: LocalHeights,
  strip: { belowM: number; aboveM: number }, tanAlong: number, forwardOverlap: number, nominalAlongM: number,
): LineTriggers {
  const n = x.length;
  const ux = (line.end[0] - line.start[0]) / (line.lengthM || 1), uy = (line.end[1] - line.start[1]) / (line.lengthM || 1);
  // right of the flying direction: (uy, -ux)
  const across = [-strip.belowM, -strip.belowM / 2, 0, strip.aboveM / 2, strip.aboveM];
  const k = across.length;
  const xs = new Float64Array(n * k), ys = new Float64Array(n * k), g = new Float64Array(n * k);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < k; j++) {
      xs[i * k + j] = line.start[0] + ux * x[i] + uy * across[j];
      ys[i * k + j] = line.start[1] + uy * x[i] - ux * across[j];
    }
  }
  heights.sampleMany(xs, ys, g);
  const strip1 = new Float64Array(n).fill(-Infinity);
  for (let i = 0; i < n; i++) for (let j = 0; j < k; j++) { const v = g[i * k + j]; if (v === v && v > strip1[i]) strip1[i] = v; }
  // highest ground within half a footprint along (a plain window maximum: lines have a few thousand samples)
  const half = nominalAlongM / 2;
  const high = new Float64Array(n);
  let lo = 0, hi = 0;
  for (let i = 0; i < n; i++) {
    while (x[lo] < x[i] - half) lo++;
    while (hi + 1 < n && x[hi + 1] <= x[i] + half) hi++;
    let m = -Infinity;
    for (let j = lo; j <= hi; j++) if (strip1[j] > m) m = strip1[j];
    high[i] = m;
  }
  const base = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const h = Number.isFinite(high[i]) ? altitudeM[i] - high[i] : nominalAlongM / (2 * tanAlong);
    base[i] = Math.max(1, (1 - forwardOverlap) * 2 * tanAlong * Math.max(1, h));
  }
  const idx = (d: number) => { let a = 0, b = n - 1; while (a < b) { const m = (a + b + 1) >> 1; if (x[m] <= d) a = m; else b = m - 1; } return a; };
  const stepFrom = (d: number) => {
    let s = base[idx(d)];
    // the smallest spacing over the stretch the step spans (tightened until it holds)
    for (let pass = 0; pass < 4; pass++) {
      let m = Infinity;
      for (let i = idx(d); i < n && x[i] <= d + s; i++) if (base[i] < m) m = base[i];
      if (!(m < s - 1e-9)) break;
      s = m;
    }
    return s;
  };
  const st: number[] = [];
  let d = Math.max(0, line.areaStartM - stepFrom(line.areaStartM) / 2);
  let minM = Infinity, maxM = 0, tightestAtM = d, tightestGroundM = NaN;
  for (let guard = 0; guard < 100_000; guard++) {
    st.push(d);
    if (d >= line.lengthM - 1e-9) break;
    const s = stepFrom(d);
    if (d >= line.areaEndM + s / 2 - 1e-9) break;
    if (s < minM) {
      // the highest ground the step spans set it
      let g = -Infinity;
      for (let i = idx(d); i < n && x[i] <= d + s; i++) if (high[i] > g) g = high[i];
      minM = s; tightestAtM = d; tightestGroundM = g;
    }
    if (s > maxM) maxM = s;
    d = Math.min(line.lengthM, d + s);
  }
  if (st.length === 1) st.push(Math.min(line.lengthM, st[0] + 1));
  return { stationsM: Float64Array.from(st), minM: Number.isFinite(minM) ? minM : 0, maxM, tightestAtM, tightestGroundM };
}

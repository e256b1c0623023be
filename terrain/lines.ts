/** Flight lines over a survey polygon: spacing, clipping (turf, local metric frame), run-in/run-out, flying order, exposure stations. */
// The three turf packages, not the @turf/turf umbrella: the web app bundles this file (heading advice), and the
// umbrella would carry every turf module (and JSTS) into the first screen's JavaScript.
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { lineString, point, polygon as turfPolygon } from '@turf/helpers';
import { lineIntersect } from '@turf/line-intersect';
import type { Polygon } from 'geojson';
import { check } from './errors';

/** A survey polygon in local metric coordinates (outer ring first, then holes; rings closed). */
export type LocalPolygon = Array<Array<[number, number]>>;

/** Options for laying out flight lines. */
interface FlightLineOptions {
  /** Flight direction of the first line, degrees clockwise from north; lines alternate from there. */
  headingDeg: number;
  lineSpacingM: number;
  /** Distance between exposure stations along a line (air base). */
  triggerDistanceM: number;
  /** Straight flight before the first and after the last photo of a line (default 0). */
  runInM?: number;
  /** Local position of the takeoff point: the flying order starts at the line end nearest to it. */
  takeoff?: [number, number];
  /** Refuse layouts with more lines than this (default 2000). */
  maxLines?: number;
  /** Clip each line to the polygon within its whole strip (default) or only where its centre line crosses (quick estimates). */
  clip?: 'strip' | 'centre';
  /**
   * Cross-track positions of the lines (metres to the right of the layout heading, measured from the local
   * origin: c = x cos θ − y sin θ), ascending, instead of lines every `lineSpacingM`: spacing that varies line by
   * line. Each line's strip then reaches half way to its neighbours (`lineSpacingM` wide for a lone line).
   */
  offsetsM?: number[];
}

/** One straight flight line in the local frame, with its exposure stations. */
export interface FlightLine {
  /** Position in the flying order (0 first). */
  index: number;
  /** Flight direction, degrees clockwise from north in [0, 360). */
  headingDeg: number;
  /** Cross-track offset of the line from the area centre, metres, to the right of the layout heading. */
  offsetM: number;
  /** Start (run-in start) and end (run-out end), local metres. */
  start: [number, number];
  end: [number, number];
  lengthM: number;
  /** Part of the line over the polygon, as distances from the start. */
  areaStartM: number;
  areaEndM: number;
  /** Exposure stations as distances from the start. */
  stationsM: Float64Array;
  /**
   * Tilt of the camera on its mount along this line, degrees from straight down towards the nose (oblique
   * capture); absent or 0: straight down.
   */
  mountTiltDeg?: number;
}

const DEG = Math.PI / 180;

/** Normalise an angle to [0, 360). */
export function normaliseDeg(deg: number): number {
  const d = deg % 360;
  return d < 0 ? d + 360 : d;
}

/** Project a WGS 84 GeoJSON polygon into a local frame (`toLocal` maps lon/lat to x/y metres). */
export function polygonToLocal(area: Polygon, toLocal: (lon: number, lat: number) => [number, number]): LocalPolygon {
  return area.coordinates.map((ring) => ring.map(([lon, lat]) => toLocal(lon, lat)));
}

/** Point at distance `d` along a line from its start, local metres. */
export function pointAlong(line: Pick<FlightLine, 'start' | 'end' | 'lengthM'>, d: number): [number, number] {
  const f = line.lengthM > 0 ? d / line.lengthM : 0;
  return [line.start[0] + (line.end[0] - line.start[0]) * f, line.start[1] + (line.end[1] - line.start[1]) * f];
}

/** Stretches [a0, a1] of the line c = const inside the polygon (rotated coordinates), found with turf. */
function clipAtOffset(rotated: ReturnType<typeof turfPolygon>, c: number, aMin: number, aMax: number): Array<[number, number]> {
  const probe = lineString([[aMin - 1, c], [aMax + 1, c]]);
  const hits = lineIntersect(probe, rotated).features.map((f) => f.geometry.coordinates[0]).sort((p, q) => p - q);
  const cuts: number[] = [];
  for (const a of hits) if (cuts.length === 0 || a - cuts[cuts.length - 1] > 1e-6) cuts.push(a);
  const out: Array<[number, number]> = [];
  for (let i = 0; i + 1 < cuts.length; i++) {
    const mid = (cuts[i] + cuts[i + 1]) / 2;
    if (booleanPointInPolygon(point([mid, c]), rotated)) {
      const last = out[out.length - 1];
      if (last && Math.abs(last[1] - cuts[i]) < 1e-6) last[1] = cuts[i + 1];
      else out.push([cuts[i], cuts[i + 1]]);
    }
  }
  return out;
}

/** Evenly spaced stations at exactly `base` apart that cover [a0, a1], centred on it. */
function stationPositions(a0: number, a1: number, base: number): Float64Array {
  const n = Math.max(1, Math.ceil((a1 - a0) / base - 1e-9) + 1);
  const first = (a0 + a1) / 2 - ((n - 1) * base) / 2;
  const s = new Float64Array(n);
  for (let i = 0; i < n; i++) s[i] = first + i * base;
  return s;
}

/**
 * Parallel flight lines over the polygon: lines every `lineSpacingM` across the layout heading, the outer ones
 * at most half a spacing inside the area's edges (so the outer photos still reach past it); each line clipped
 * to the polygon's extent within its strip of one spacing (several pieces where a concave polygon is crossed
 * twice, merged where the gap is at most two run-ins); ordered back and forth (boustrophedon) starting at
 * the end nearest the takeoff.
 */
export function planFlightLines(area: LocalPolygon, opts: FlightLineOptions): FlightLine[] {
  const { lineSpacingM: S, triggerDistanceM: B } = opts;
  const runIn = opts.runInM ?? 0;
  check(Number.isFinite(opts.headingDeg), `headingDeg must be a number, got ${opts.headingDeg}.`);
  check(Number.isFinite(S) && S > 0, `line spacing must be a positive number of metres, got ${S}.`);
  check(Number.isFinite(B) && B > 0, `trigger distance must be a positive number of metres, got ${B}.`);
  check(Number.isFinite(runIn) && runIn >= 0, `run-in must be zero or more metres, got ${runIn}.`);
  check(Array.isArray(area) && area.length > 0 && area[0].length >= 4, 'The survey polygon needs an outer ring of at least three distinct corners.');
  const th = normaliseDeg(opts.headingDeg) * DEG;
  const sin = Math.sin(th), cos = Math.cos(th);
  // rotated frame: a along the layout heading, c to its right
  const rotatedRings = area.map((ring) => ring.map(([x, y]) => [x * sin + y * cos, x * cos - y * sin]));
  let aMin = Infinity, aMax = -Infinity, cMin = Infinity, cMax = -Infinity;
  for (const [a, c] of rotatedRings[0]) {
    if (a < aMin) aMin = a;
    if (a > aMax) aMax = a;
    if (c < cMin) cMin = c;
    if (c > cMax) cMax = c;
  }
  const widthM = cMax - cMin;
  const given = opts.offsetsM;
  if (given) {
    check(given.length > 0 && given.every((v, i) => Number.isFinite(v) && (i === 0 || v > given[i - 1])), 'line offsets must be finite numbers in ascending order.');
  }
  const count = given ? given.length : Math.max(1, Math.ceil(widthM / S - 1e-9));
  check(count <= (opts.maxLines ?? 2000), `The layout needs ${count} flight lines (spacing ${S.toFixed(1)} m over ${widthM.toFixed(0)} m); fly higher, lower the side overlap or split the area.`);
  const rotated = turfPolygon(rotatedRings);
  const cMid = (cMin + cMax) / 2;
  type Piece = { c: number; a0: number; a1: number };
  const rows: Piece[][] = [];
  for (let k = 0; k < count; k++) {
    const c = given ? given[k] : cMid + (k - (count - 1) / 2) * S;
    // strip edges: half a spacing either side, or half way to the neighbouring lines when their places are given
    const below = given ? (k > 0 ? (c - given[k - 1]) / 2 : k + 1 < count ? (given[k + 1] - c) / 2 : S / 2) : S / 2;
    const above = given ? (k + 1 < count ? (given[k + 1] - c) / 2 : below) : S / 2;
    // The line photographs the strip c ± S/2: fly it over the polygon's whole extent within that strip
    // (probes across the strip plus the corners inside it), not only where the centre line crosses.
    const inside = (v: number) => Math.min(Math.max(v, cMin + 1e-7 * (1 + Math.abs(cMin))), cMax - 1e-7 * (1 + Math.abs(cMax)));
    const spans: Array<[number, number]> = [];
    const probes = opts.clip === 'centre' ? [0] : [-1, -0.5, 0, 0.5, 1];
    for (const f of probes) spans.push(...clipAtOffset(rotated, inside(c + (f < 0 ? f * below : f * above)), aMin, aMax));
    if (opts.clip !== 'centre') for (const ring of rotatedRings) for (const [va, vc] of ring) if (vc >= c - below && vc <= c + above) spans.push([va, va]);
    spans.sort((p, q) => p[0] - q[0]);
    const merged: Array<[number, number]> = [];
    for (const sp of spans) {
      const last = merged[merged.length - 1];
      if (last && sp[0] - last[1] <= 2 * runIn) last[1] = Math.max(last[1], sp[1]);
      else merged.push([sp[0], sp[1]]);
    }
    if (merged.length > 0) rows.push(merged.map(([a0, a1]) => ({ c, a0, a1 })));
  }
  check(rows.length > 0, 'No flight line crosses the survey polygon; check that it is a valid polygon in longitude/latitude.');
  const toLocal = (a: number, c: number): [number, number] => [a * sin + c * cos, a * cos - c * sin];
  // four orderings (first row at either side, first direction either way); keep the one starting nearest the takeoff
  const orderings: Array<{ rows: Piece[][]; forward: boolean }> = [
    { rows, forward: true },
    { rows, forward: false },
    { rows: [...rows].reverse(), forward: true },
    { rows: [...rows].reverse(), forward: false },
  ];
  let best = orderings[0];
  if (opts.takeoff) {
    let bestD = Infinity;
    for (const o of orderings) {
      const p = o.rows[0][o.forward ? 0 : o.rows[0].length - 1];
      const [x, y] = toLocal(o.forward ? p.a0 - runIn : p.a1 + runIn, p.c);
      const d = Math.hypot(x - opts.takeoff[0], y - opts.takeoff[1]);
      if (d < bestD - 1e-9) { bestD = d; best = o; }
    }
  }
  const lines: FlightLine[] = [];
  best.rows.forEach((row, r) => {
    const forward = best.forward === (r % 2 === 0);
    const pieces = forward ? row : [...row].reverse();
    for (const p of pieces) {
      const st = stationPositions(p.a0, p.a1, B);
      const sFirst = st[0], sLast = st[st.length - 1];
      const aStart = sFirst - runIn, aEnd = sLast + runIn;
      const lengthM = aEnd - aStart;
      const stationsM = new Float64Array(st.length);
      for (let i = 0; i < st.length; i++) stationsM[i] = forward ? st[i] - aStart : aEnd - st[st.length - 1 - i];
      lines.push({
        index: lines.length,
        headingDeg: normaliseDeg(opts.headingDeg + (forward ? 0 : 180)),
        offsetM: p.c,
        start: forward ? toLocal(aStart, p.c) : toLocal(aEnd, p.c),
        end: forward ? toLocal(aEnd, p.c) : toLocal(aStart, p.c),
        lengthM,
        areaStartM: forward ? p.a0 - aStart : aEnd - p.a1,
        areaEndM: forward ? p.a1 - aStart : aEnd - p.a0,
        stationsM,
      });
    }
  });
  return lines;
}

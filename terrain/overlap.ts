/** Per-station GSD and forward/side overlap from the terrain actually under each photo (edge rays cast onto the grid). */
import type { Camera } from './camera';
import { pixelPitchMm } from './camera';
import type { HeightAt } from './footprint';
import { cameraToLocal, castPixel } from './footprint';
import type { GuaranteedExtents } from './guaranteed-extents';

/** The photos of one flight line: station positions (local metres), altitudes and the flight direction. */
export interface LinePhotos {
  headingDeg: number;
  /** Lines with the same row number fly the same track (pieces of one line over a concave area); rows are numbered across the area. */
  row: number;
  x: Float64Array;
  y: Float64Array;
  altitudeM: Float64Array;
  /** Camera tilt on its mount towards the nose, degrees (absent: straight down). */
  mountTiltDeg?: number;
}

/**
 * GSD of a station's photo, cm: straight down, height above the ground under it × pixel pitch / focal length; a
 * tilted camera, at the image centre where its ray meets the ground, on the ground's horizontal plane there:
 * R·p/f / cos θ with R the slant range and θ the ray's angle from the vertical (R²·p / (f·Δz)), the coarser side of
 * the pixel's footprint (h·p / (f·cos² t) on level ground: the scale of a tilted photograph at its principal point
 * along the tilt, Wolf, Dewitt & Wilkinson, Elements of Photogrammetry, ch. 10, from memory). Null where unknown.
 */
function stationGsdCm(camera: Camera, heightAt: HeightAt, line: LinePhotos, s: number, aglM: number | null, pitchOverF: number): number | null {
  if (aglM === null || aglM <= 0) return null;
  const t = line.mountTiltDeg ?? 0;
  if (t === 0) return aglM * pitchOverF * 100;
  const pose = { xM: line.x[s], yM: line.y[s], altitudeM: line.altitudeM[s], yawDeg: line.headingDeg, mountTiltDeg: t };
  const g = castPixel(camera, pose, cameraToLocal(camera, pose), camera.imageWidthPx / 2, camera.imageHeightPx / 2, heightAt, { startHeightM: heightAt(pose.xM, pose.yM) });
  if (!g) return null;
  const dx = g[0] - pose.xM, dy = g[1] - pose.yM, dz = pose.altitudeM - g[2];
  if (!(dz > 0)) return null;
  return ((dx * dx + dy * dy + dz * dz) / dz) * pitchOverF * 100;
}

/** Targets that stations are checked against. */
export interface OverlapTargets {
  forwardOverlap: number;
  sideOverlap: number;
  gsdMinCm: number;
  gsdMaxCm: number;
  maxAglM: number;
  clearanceM: number;
  /** The planned height above ground the layout was made for (for the reasons' wording). */
  plannedHeightM: number;
}

/** Why a station is flagged. */
type StationFlagCode =
  | 'ground-unknown'
  | 'footprint-off-grid'
  | 'forward-overlap-low'
  | 'side-overlap-low'
  | 'forward-overlap-envelope'
  | 'side-overlap-envelope'
  | 'gsd-coarse'
  | 'gsd-fine'
  | 'above-max-agl'
  | 'below-clearance';

/** A flag with the reason in words. */
export interface StationFlag {
  code: StationFlagCode;
  reason: string;
}

/** What one photo achieves over the real terrain. */
export interface StationResult {
  groundM: number | null;
  aglM: number | null;
  gsdCm: number | null;
  /** Overlap with the previous photo of the line (null for the first photo or where unknown), fraction. */
  forwardOverlap: number | null;
  /** Least overlap with the nearest photo of a neighbouring line (null where the line has no neighbour there). */
  sideOverlap: number | null;
  /**
   * The same overlaps as guaranteed: the least over every attitude of the mission's envelope applied to each
   * photo of the pair (`overlap-envelope.ts`); null without an envelope or where unknown.
   */
  forwardOverlapGuaranteed: number | null;
  sideOverlapGuaranteed: number | null;
  flags: StationFlag[];
}

/** The attitude envelope's figures for the guaranteed overlaps: per line its guaranteed extents, and the envelope in words. */
interface GuaranteedOverlapInput {
  extentsFor: (lineIndex: number, planned: Float64Array) => GuaranteedExtents;
  words: string;
}

const DEG = Math.PI / 180;
/** Numbers stored per station by `photoExtents`. */
export const STRIDE = 15;
const f2 = (v: number) => v.toFixed(2);
const f1 = (v: number) => v.toFixed(1);
/** An overlap said against a minimum: two decimals rounded down (toward failing), as the screens round it. */
const down2 = (v: number) => (Math.floor(v * 100 + 1e-7) / 100).toFixed(2);

/** Another attitude than the planned one (the same for every photo of the line) and an inset of the image edges. */
interface ExtentOptions {
  /** Camera-to-local rotation used for every photo instead of the planned one (level, yaw along the line). */
  rot?: Float64Array;
  /** Pixels the edge points move into the image (negative: out of it). */
  insetPx?: number;
}

/** Image points cast along the front and the back image edge of every photo for its forward overlap (16 segments each). */
const EDGE_SEGMENTS = 8;

/**
 * Ground extents of each photo in the layout frame (a along `layoutHeadingDeg`, c to its right):
 * for three image columns (left edge, centre, right edge) the along-track interval, for three image rows
 * (front edge, centre, back edge) the across-track interval and the row's along-track position; 15 numbers
 * a station (STRIDE), NaN where a ray missed.
 * Rays go through the image edge points (Brown distortion included) to the grid for the photo's real pose.
 */
export function photoExtents(camera: Camera, heightAt: HeightAt, line: LinePhotos, layoutHeadingDeg: number, opts: ExtentOptions = {}): Float64Array {
  return castPhotos(camera, heightAt, line, layoutHeadingDeg, opts).ext;
}

/**
 * The photos' extents (see photoExtents) and their front and back image edges on the ground: per station
 * 2 × (EDGE_SEGMENTS + 1) points (a, c), front edge first, each from the image's left to its right; NaN where a ray missed.
 */
function castPhotos(camera: Camera, heightAt: HeightAt, line: LinePhotos, layoutHeadingDeg: number, opts: ExtentOptions = {}): { ext: Float64Array; edges: Float64Array } {
  const n = line.x.length;
  const out = new Float64Array(n * STRIDE).fill(NaN);
  const P = EDGE_SEGMENTS + 1;
  const edges = new Float64Array(n * 4 * P).fill(NaN);
  const W = camera.imageWidthPx, H = camera.imageHeightPx;
  const alongIsWidth = camera.alongTrackSide === 'width';
  // image point at across fraction p and along fraction q (q = 0 front), in pixels
  // the edges pulled in by the inset (pushed out when negative)
  const m = opts.insetPx ?? 0;
  const px = (p: number, q: number): [number, number] => (alongIsWidth ? [m + (W - 2 * m) * (1 - q), m + (H - 2 * m) * p] : [m + (W - 2 * m) * p, m + (H - 2 * m) * q]);
  const th = layoutHeadingDeg * DEG;
  const sa = Math.sin(th), ca = Math.cos(th);
  // the front edge (q = 0) and the back edge (q = 1), P points each, then the centre row's two side points
  const pts: Array<[number, number]> = [];
  for (const q of [0, 1]) for (let i = 0; i < P; i++) pts.push(px(i / EDGE_SEGMENTS, q));
  pts.push(px(0, 0.5), px(1, 0.5));
  const A = new Float64Array(pts.length), C = new Float64Array(pts.length);
  const mid = EDGE_SEGMENTS / 2;
  // the 3 x 3 image points of the extents: rows front, centre, back; columns left, centre, right
  const grid9 = [0, mid, P - 1, 2 * P, -1, 2 * P + 1, P, P + mid, 2 * P - 1];
  for (let s = 0; s < n; s++) {
    const pose = { xM: line.x[s], yM: line.y[s], altitudeM: line.altitudeM[s], yawDeg: line.headingDeg, mountTiltDeg: line.mountTiltDeg };
    const rot = opts.rot ?? cameraToLocal(camera, pose);
    const startHeightM = heightAt(pose.xM, pose.yM);
    for (let k = 0; k < pts.length; k++) {
      const g = castPixel(camera, pose, rot, pts[k][0], pts[k][1], heightAt, { startHeightM });
      A[k] = g ? g[0] * sa + g[1] * ca : NaN;
      C[k] = g ? g[0] * ca - g[1] * sa : NaN;
    }
    const eo = s * 4 * P;
    for (let k = 0; k < 2 * P; k++) {
      edges[eo + k * 2] = A[k];
      edges[eo + k * 2 + 1] = C[k];
    }
    const a9 = (k: number) => A[grid9[k]], c9 = (k: number) => C[grid9[k]];
    const o = s * STRIDE;
    for (let col = 0; col < 3; col++) {
      const front = a9(col), back = a9(6 + col); // rows q = 0 and q = 1 of this column
      out[o + col * 2] = Math.min(front, back);
      out[o + col * 2 + 1] = Math.max(front, back);
    }
    for (let row = 0; row < 3; row++) {
      const left = c9(row * 3), right = c9(row * 3 + 2);
      out[o + 6 + row * 2] = Math.min(left, right);
      out[o + 6 + row * 2 + 1] = Math.max(left, right);
      out[o + 12 + row] = (a9(row * 3) + a9(row * 3 + 2)) / 2;
    }
  }
  return { ext: out, edges };
}

/**
 * Along-track position where the ground edge polyline (P points (a, c) from `o` in `edges`) crosses the
 * across-track position c; of several crossings (an edge folded by a ridge) the one nearest `aRef` (the photo's
 * inside), NaN where the edge does not reach c.
 */
function edgeAt(edges: Float64Array, o: number, P: number, c: number, aRef: number): number {
  let best = NaN;
  for (let i = 0; i + 1 < P; i++) {
    const c0 = edges[o + i * 2 + 1], c1 = edges[o + i * 2 + 3];
    if (!((c0 <= c && c <= c1) || (c1 <= c && c <= c0))) continue;
    const a0 = edges[o + i * 2], a1 = edges[o + i * 2 + 2];
    const a = c1 === c0 ? (aRef < a0 ? Math.min(a0, a1) : Math.max(a0, a1)) : a0 + ((a1 - a0) * (c - c0)) / (c1 - c0);
    if (Number.isNaN(best) || Math.abs(a - aRef) < Math.abs(best - aRef)) best = a;
  }
  return best;
}

/**
 * Forward overlap of two photos from their ground footprints: along every along-track ground line across the
 * width both photos cover from edge to edge, the length inside both footprints over the mean of the lengths
 * inside each (intervalOverlap), and the least of these. The footprints' front and back edges are polylines of
 * cast rays, so between their vertices every end of both intervals moves linearly across the track and the
 * ratio is monotonic there: the least is found exactly at the vertices, the range ends and where two edges cross.
 * NaN where a ray missed.
 */
function forwardFromEdges(edges: Float64Array, ext: Float64Array, p: number, q: number): number {
  const P = EDGE_SEGMENTS + 1;
  const op = p * 4 * P, oq = q * 4 * P;
  for (let k = 0; k < 4 * P; k++) if (Number.isNaN(edges[op + k]) || Number.isNaN(edges[oq + k])) return NaN;
  // across-track range covered edge to edge by both photos: inside the side edges' innermost points
  let lo = -Infinity, hi = Infinity;
  for (const s of [p, q]) {
    const o = s * 4 * P, e = s * STRIDE;
    // the side edges' corners (first and last point of the front and back edges) and the centre row's side
    // points (the extents' across-track interval of the centre row); the near side is the one with lower c
    const first = [edges[o + 1], edges[o + 2 * P + 1]], last = [edges[o + 2 * P - 1], edges[o + 4 * P - 1]];
    const [low, high] = first[0] + first[1] < last[0] + last[1] ? [first, last] : [last, first];
    lo = Math.max(lo, low[0], low[1], ext[e + 8]);
    hi = Math.min(hi, high[0], high[1], ext[e + 9]);
  }
  if (!(hi > lo)) return 0;
  const centre = (o: number) => (edges[o + EDGE_SEGMENTS] + edges[o + 2 * P + EDGE_SEGMENTS]) / 2;
  const refP = centre(op), refQ = centre(oq);
  const ends = (o: number, ref: number, c: number): [number, number] => {
    const f = edgeAt(edges, o, P, c, ref), b = edgeAt(edges, o + 2 * P, P, c, ref);
    return f < b ? [f, b] : [b, f];
  };
  const cs = [lo, hi];
  for (const o of [op, oq]) for (let k = 0; k < 2 * P; k++) {
    const c = edges[o + k * 2 + 1];
    if (c > lo && c < hi) cs.push(c);
  }
  cs.sort((x, y) => x - y);
  let least = Infinity;
  let prev: [number, number, number, number] | null = null;
  let prevC = NaN;
  const at = (c: number): [number, number, number, number] => [...ends(op, refP, c), ...ends(oq, refQ, c)] as [number, number, number, number];
  const ratio = (v: number[]) => intervalOverlap(v[0], v[1], v[2], v[3]);
  for (const c of cs) {
    const v = at(c);
    if (v.some(Number.isNaN)) return NaN;
    least = Math.min(least, ratio(v));
    if (prev) {
      // where the two photos' starts or ends cross between the samples, the shared length has a kink
      for (const k of [0, 1]) {
        const d0 = prev[k] - prev[k + 2], d1 = v[k] - v[k + 2];
        if (d0 * d1 < 0) {
          const cx = prevC + ((c - prevC) * d0) / (d0 - d1);
          const vx = at(cx);
          if (!vx.some(Number.isNaN)) least = Math.min(least, ratio(vx));
        }
      }
    }
    prev = v;
    prevC = c;
  }
  return least;
}

/**
 * Shared part of two intervals as a fraction of their mean length, in [0, 1]; NaN if either is unknown.
 * For equal photos this is the textbook overlap 1 - B / G; over uneven ground (photos of different sizes)
 * the mean keeps it symmetric and growing as either photo grows, as the overlap physically does.
 */
export function intervalOverlap(a0: number, a1: number, b0: number, b1: number): number {
  const shared = Math.min(a1, b1) - Math.max(a0, b0);
  const mean = (a1 - a0 + (b1 - b0)) / 2;
  if (!(mean > 0) || Number.isNaN(shared)) return NaN;
  return shared <= 0 ? 0 : Math.min(1, shared / mean);
}

/**
 * Like `intervalOverlap`, with each interval's length given apart from its ends: the guaranteed overlap takes the
 * ground every attitude sees (the ends) over the longest footprint any attitude gives (the lengths), so neither
 * half of the fraction is optimistic.
 */
function sharedOverlap(a0: number, a1: number, aLen: number, b0: number, b1: number, bLen: number): number {
  const shared = Math.min(a1, b1) - Math.max(a0, b0);
  const mean = (aLen + bLen) / 2;
  if (!(mean > 0) || Number.isNaN(shared)) return NaN;
  return shared <= 0 ? 0 : Math.min(1, shared / mean);
}

/**
 * GSD, forward and side overlap and flags at every station of every line. Both overlaps are the least across
 * the footprint, so a compliance figure is never optimistic: forward overlap is the least along-track overlap with
 * the previous photo over the ground lines both footprints span (forwardFromEdges, from rays cast along the front
 * and back image edges); side overlap the lowest across-track overlap of the front, centre and back image rows
 * against each neighbouring row's strip, the lesser of the two neighbours. (A mean over image columns overstated
 * the shared ground on cross-slopes.) Every figure comes from the photos' ground extents over the real terrain;
 * tests/terrain/overlap-footprints.test.ts checks the forward overlap against shapely on a steep grid.
 */
export function stationOverlaps(camera: Camera, heightAt: HeightAt, lines: LinePhotos[], layoutHeadingDeg: number, t: OverlapTargets, guaranteed: GuaranteedOverlapInput | null = null): StationResult[][] {
  const cast = lines.map((l) => castPhotos(camera, heightAt, l, layoutHeadingDeg));
  const ext = cast.map((x) => x.ext);
  const gext = guaranteed ? ext.map((e, li) => guaranteed.extentsFor(li, e)) : null;
  const th = layoutHeadingDeg * DEG;
  const sa = Math.sin(th);
  const ca = Math.cos(th);
  // every row's photos sorted by along-track position, for the nearest-neighbour search
  const rows = new Map<number, Array<{ line: number; s: number; a: number }>>();
  lines.forEach((l, li) => {
    const list = rows.get(l.row) ?? [];
    for (let s = 0; s < l.x.length; s++) list.push({ line: li, s, a: l.x[s] * sa + l.y[s] * ca });
    rows.set(l.row, list);
  });
  for (const list of rows.values()) list.sort((p, q) => p.a - q.a);
  const rowKeys = [...rows.keys()].sort((p, q) => p - q);
  const pitchOverF = pixelPitchMm(camera) / camera.focalLengthMm;
  return lines.map((l, li) => {
    const e = ext[li];
    const ri = rowKeys.indexOf(l.row);
    const neighbours = [rowKeys[ri - 1], rowKeys[ri + 1]].filter((r) => r !== undefined).map((r) => rows.get(r)!);
    const out: StationResult[] = [];
    for (let s = 0; s < l.x.length; s++) {
      const flags: StationFlag[] = [];
      const g = heightAt(l.x[s], l.y[s]);
      const groundM = Number.isFinite(g) ? g : null;
      const aglM = groundM === null ? null : l.altitudeM[s] - groundM;
      const gsdCm = stationGsdCm(camera, heightAt, l, s, aglM, pitchOverF);
      const o = s * STRIDE;
      let complete = true;
      for (let k = 0; k < STRIDE; k++) if (Number.isNaN(e[o + k])) complete = false;
      const eo = s * 4 * (EDGE_SEGMENTS + 1);
      for (let k = 0; k < 4 * (EDGE_SEGMENTS + 1); k++) if (Number.isNaN(cast[li].edges[eo + k])) complete = false;
      let forwardOverlap: number | null = null;
      if (s > 0) {
        // the least overlap across the footprints on the ground (a weighted mean of image columns overstated
        // the shared ground on cross-slopes; a compliance figure must not)
        const m = forwardFromEdges(cast[li].edges, e, s - 1, s);
        forwardOverlap = Number.isNaN(m) ? null : m;
      }
      let sideOverlap: number | null = null;
      for (const list of neighbours) {
        const v = sideWith(e, o, list, ext, (r, p, q, f) => {
          const ep = ext[p.line], eq = ext[q.line];
          const bp = p.s * STRIDE, bq = q.s * STRIDE;
          // the neighbouring photos' centre rows, interpolated to this row's along-track position
          const c0 = ep[bp + 8] + (eq[bq + 8] - ep[bp + 8]) * f;
          const c1 = ep[bp + 9] + (eq[bq + 9] - ep[bp + 9]) * f;
          return intervalOverlap(e[o + 6 + r * 2], e[o + 7 + r * 2], c0, c1);
        });
        if (v !== null && (sideOverlap === null || v < sideOverlap)) sideOverlap = v;
      }
      let forwardOverlapGuaranteed: number | null = null, sideOverlapGuaranteed: number | null = null;
      if (gext) {
        const g = gext[li], C = g.cells;
        if (s > 0 && forwardOverlap !== null) {
          // the same least-over-the-columns rule on the ground every attitude of a cell sees over the cell's
          // longest footprints, the least over every pair of cells of the two photos
          let m = Infinity;
          for (let c1 = 0; c1 < C; c1++) for (let c2 = 0; c2 < C; c2++) {
            const p = ((s - 1) * C + c1), q = (s * C + c2);
            for (let k = 0; k < 3; k++) m = Math.min(m, sharedOverlap(g.inner[p * 12 + 2 * k], g.inner[p * 12 + 2 * k + 1], g.lengths[p * 6 + k], g.inner[q * 12 + 2 * k], g.inner[q * 12 + 2 * k + 1], g.lengths[q * 6 + k]));
          }
          // the envelope holds the planned attitude, so the guaranteed figure is never above the planned one (which
          // is the least over the edges' ground lines, a finer search than the three columns used here)
          forwardOverlapGuaranteed = Number.isNaN(m) ? null : Math.min(m, forwardOverlap);
        }
        if (sideOverlap !== null) {
          for (const list of neighbours) {
            const v = sideWith(e, o, list, ext, (r, p, q, f) => {
              // every cell of this photo against every pair of cells of the two neighbours around the row
              const gp = gext[p.line], gq = gext[q.line];
              let m = Infinity;
              for (let c = 0; c < C; c++) {
                const me = (s * C + c);
                for (let cp = 0; cp < gp.cells; cp++) for (let cq = 0; cq < gq.cells; cq++) {
                  const P = p.s * gp.cells + cp, Q = q.s * gq.cells + cq;
                  const c0 = gp.inner[P * 12 + 8] + (gq.inner[Q * 12 + 8] - gp.inner[P * 12 + 8]) * f;
                  const c1 = gp.inner[P * 12 + 9] + (gq.inner[Q * 12 + 9] - gp.inner[P * 12 + 9]) * f;
                  // the strip's longest length, never below the held ground's (rounding of the interpolation)
                  const len = Math.max(gp.lengths[P * 6 + 4] + (gq.lengths[Q * 6 + 4] - gp.lengths[P * 6 + 4]) * f, c1 - c0);
                  m = Math.min(m, sharedOverlap(g.inner[me * 12 + 6 + 2 * r], g.inner[me * 12 + 7 + 2 * r], g.lengths[me * 6 + 3 + r], c0, c1, len));
                }
              }
              return m;
            });
            if (v !== null && (sideOverlapGuaranteed === null || v < sideOverlapGuaranteed)) sideOverlapGuaranteed = v;
          }
        }
      }
      if (groundM === null) flags.push({ ...GROUND_UNKNOWN });
      else if (!complete) flags.push({ code: 'footprint-off-grid', reason: 'Part of this photo\'s footprint lies off the grid or over nodata; its overlaps there are unknown.' });
      if (forwardOverlap !== null && forwardOverlap < t.forwardOverlap - 1e-9) {
        flags.push({ code: 'forward-overlap-low', reason: `Forward overlap ${f2(forwardOverlap)} is below the target ${f2(t.forwardOverlap)}: ${terrainWhy(aglM, t.plannedHeightM)}` });
      }
      if (sideOverlap !== null && sideOverlap < t.sideOverlap - 1e-9) {
        flags.push({ code: 'side-overlap-low', reason: `Side overlap ${f2(sideOverlap)} is below the target ${f2(t.sideOverlap)}: ${terrainWhy(aglM, t.plannedHeightM)}` });
      }
      // a station that meets the target as planned but not at every attitude of the envelope
      if (guaranteed && forwardOverlap !== null && forwardOverlap >= t.forwardOverlap - 1e-9 && forwardOverlapGuaranteed !== null && forwardOverlapGuaranteed < t.forwardOverlap - 1e-9) {
        flags.push({ code: 'forward-overlap-envelope', reason: `Forward overlap as guaranteed ${down2(forwardOverlapGuaranteed)} is below the target ${f2(t.forwardOverlap)} under the attitude envelope (${guaranteed.words}); as planned it is ${down2(forwardOverlap)}.` });
      }
      if (guaranteed && sideOverlap !== null && sideOverlap >= t.sideOverlap - 1e-9 && sideOverlapGuaranteed !== null && sideOverlapGuaranteed < t.sideOverlap - 1e-9) {
        flags.push({ code: 'side-overlap-envelope', reason: `Side overlap as guaranteed ${down2(sideOverlapGuaranteed)} is below the target ${f2(t.sideOverlap)} under the attitude envelope (${guaranteed.words}); as planned it is ${down2(sideOverlap)}.` });
      }
      flags.push(...heightFlags(aglM, gsdCm, t));
      out.push({ groundM, aglM, gsdCm, forwardOverlap, sideOverlap, forwardOverlapGuaranteed, sideOverlapGuaranteed, flags });
    }
    return out;
  });
}

/**
 * The figures of every station that need no footprint: ground, height above ground and GSD, with the GSD, height
 * limit and clearance flags `stationOverlaps` gives them (the same tests, so both agree); overlaps null. For
 * analyses whose overlaps nobody reads (the solver's candidate layouts: their lines, legs and stations do not
 * depend on them), where casting every footprint would be most of the work.
 */
export function stationHeights(camera: Camera, heightAt: HeightAt, lines: LinePhotos[], t: OverlapTargets): StationResult[][] {
  const pitchOverF = pixelPitchMm(camera) / camera.focalLengthMm;
  return lines.map((l) => {
    const out: StationResult[] = [];
    for (let s = 0; s < l.x.length; s++) {
      const g = heightAt(l.x[s], l.y[s]);
      const groundM = Number.isFinite(g) ? g : null;
      const aglM = groundM === null ? null : l.altitudeM[s] - groundM;
      const gsdCm = stationGsdCm(camera, heightAt, l, s, aglM, pitchOverF);
      out.push({ groundM, aglM, gsdCm, forwardOverlap: null, sideOverlap: null, forwardOverlapGuaranteed: null, sideOverlapGuaranteed: null, flags: [...(groundM === null ? [{ ...GROUND_UNKNOWN }] : []), ...heightFlags(aglM, gsdCm, t)] });
    }
    return out;
  });
}

const GROUND_UNKNOWN: StationFlag = { code: 'ground-unknown', reason: 'No elevation data under this photo (nodata or off the grid); its height above ground is unknown.' };

/** The flags of a station's height above ground and GSD against the band, the height limit and the clearance. */
function heightFlags(aglM: number | null, gsdCm: number | null, t: OverlapTargets): StationFlag[] {
  const flags: StationFlag[] = [];
  if (gsdCm !== null && gsdCm > t.gsdMaxCm + 1e-9) flags.push({ code: 'gsd-coarse', reason: `GSD ${f2(gsdCm)} cm is coarser than the allowed ${f2(t.gsdMaxCm)} cm (height above ground ${f1(aglM!)} m).` });
  if (gsdCm !== null && gsdCm < t.gsdMinCm - 1e-9) flags.push({ code: 'gsd-fine', reason: `GSD ${f2(gsdCm)} cm is finer than the band's ${f2(t.gsdMinCm)} cm (height above ground ${f1(aglM!)} m): more photos than needed, smaller footprints.` });
  if (aglM !== null && aglM > t.maxAglM + 1e-6) flags.push({ code: 'above-max-agl', reason: `Height above ground ${f1(aglM)} m exceeds the ${f1(t.maxAglM)} m limit.` });
  if (aglM !== null && aglM < t.clearanceM - 1e-6) flags.push({ code: 'below-clearance', reason: `Height above ground ${f1(aglM)} m is below the ${f1(t.clearanceM)} m clearance.` });
  return flags;
}

function terrainWhy(aglM: number | null, plannedM: number): string {
  if (aglM === null) return 'the ground under the photos is unknown.';
  const d = plannedM - aglM;
  if (d > 0.5) return `the ground here is ${f1(d)} m closer to the camera than planned (height above ground ${f1(aglM)} m, planned ${f1(plannedM)} m), so each photo covers less.`;
  return `the terrain under this photo and its neighbour differs (height above ground ${f1(aglM)} m, planned ${f1(plannedM)} m).`;
}

/**
 * Least across-track overlap of photo `o` with a neighbouring row: for each image row (front, centre, back)
 * the neighbouring strip's across-track extent at that row's along-track position, interpolated between the
 * two neighbour photos around it (so the figure does not jump as the photos of the two rows slide past each
 * other); null where the neighbouring row does not reach this far (the area's edge). `rowOverlap` gives image
 * row r's overlap with the strip between neighbour photos p and q at fraction f (as planned or as guaranteed).
 */
function sideWith(e: Float64Array, o: number, list: Array<{ line: number; s: number; a: number }>, ext: Float64Array[], rowOverlap: (r: number, p: { line: number; s: number }, q: { line: number; s: number }, f: number) => number): number | null {
  if (list.length === 0) return null;
  let m = Infinity;
  let weight = 0;
  for (let r = 0; r < 3; r++) {
    const a = e[o + 12 + r];
    if (Number.isNaN(a)) return null;
    let lo = 0, hi = list.length - 1;
    if (a <= list[0].a) hi = 0;
    else if (a >= list[hi].a) lo = hi;
    else while (hi - lo > 1) { const k = (lo + hi) >> 1; if (list[k].a <= a) lo = k; else hi = k; }
    const p = list[lo], q = list[hi];
    // beyond the end photo of the neighbouring row by more than its along-track half length: no neighbour here
    if (lo === hi) {
      const ep = ext[p.line], bp = p.s * STRIDE;
      const half = (ep[bp + 3] - ep[bp + 2]) / 2;
      if (!(Math.abs(a - p.a) <= half)) continue;
    }
    const f = hi === lo || q.a === p.a ? 0 : (a - p.a) / (q.a - p.a);
    const v = rowOverlap(r, p, q, f);
    if (Number.isNaN(v)) return null;
    // the least over the front, centre and back image rows (never optimistic)
    m = Math.min(m, v);
    weight++;
  }
  return weight > 0 ? m : null;
}

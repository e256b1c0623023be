/** Photos as flown matched to an analysed plan's stations: missed triggers, extra photos, cross-track and altitude error, camera mismatch. */
import type { PlanLine, PlanResult } from './plan-result';
import type { LocalFrame } from './local-frame';
import type { Camera } from './camera';
import { ellipsoidToEgm96 } from './heights';
import { check } from './errors';

/** What a photo's altitude is measured from (see `contracts/photo-log.ts`). */
type FlownAltitudeRef = 'ellipsoid' | 'datum' | 'takeoff';

/** One photo as flown (the photo-log record). Attitude 0/0 looks straight down; null when the photo does not say. */
export interface FlownPhoto {
  file: string;
  lon: number;
  lat: number;
  altitudeM: number;
  altitudeRef: FlownAltitudeRef;
  yawDeg: number | null;
  pitchDeg: number | null;
  rollDeg: number | null;
  time: string;
  focalLengthMm?: number;
  cameraModel?: string;
}

/**
 * A photo's altitude above the elevation grid's vertical datum: `datum` as given; `ellipsoid` less the EGM96
 * geoid undulation there (heights.ts: EGM96 is taken as the grid's datum, exact for EGM96 grids and an
 * approximation of a few decimetres for national datums); `takeoff` plus the grid's ground at the takeoff point.
 */
export function altitudeInGridDatumM(p: Pick<FlownPhoto, 'lon' | 'lat' | 'altitudeM' | 'altitudeRef'>, takeoffGroundM: number): number {
  if (p.altitudeRef === 'datum') return p.altitudeM;
  if (p.altitudeRef === 'ellipsoid') return ellipsoidToEgm96(p.lat, p.lon, p.altitudeM);
  return takeoffGroundM + p.altitudeM;
}

/** One planned station matched to a photo. */
interface MatchedPhoto {
  /** Index of the photo in the log (0-based) and its file. */
  photo: number;
  file: string;
  /** Line and station, 1-based as the leg sheet numbers them. */
  line: number;
  station: number;
  /** Along the line from the station, in the flying direction (m). */
  alongErrorM: number;
  /** Across the line, to the right of the flying direction (m). */
  crossTrackM: number;
  /** Photo altitude less the planned leg's altitude there, both above the grid's vertical datum (m). */
  altitudeErrorM: number;
}

/** A planned station no photo was taken at. */
interface MissedTrigger { line: number; station: number; lon: number; lat: number; distanceM: number }

/** A photo no station claims. */
interface ExtraPhoto {
  photo: number;
  file: string;
  reason: 'off-lines' | 'no-station-near';
  /** Nearest line (1-based) and the distance across it (m), when one is within reach along. */
  nearestLine: number | null;
  crossTrackM: number | null;
}

/** How one line was flown. */
interface LineFlown {
  line: number;
  stations: number;
  photos: number;
  missed: number;
  crossTrackMeanM: number | null;
  crossTrackMaxAbsM: number | null;
  crossTrackRmsM: number | null;
  altitudeErrorMeanM: number | null;
  altitudeErrorMaxAbsM: number | null;
  /** Some photo lies further across than the off-track limit. */
  offTrack: boolean;
  /** Matched photos whose capture time runs against the flying order (a camera clock or a log out of order). */
  outOfOrder: number;
}

/** The whole matching. */
export interface PhotoMatch {
  matched: MatchedPhoto[];
  missed: MissedTrigger[];
  extra: ExtraPhoto[];
  lines: LineFlown[];
  /** Photo index -> line index (0-based) its pose should take the heading of (matched, else nearest), or -1. */
  lineOfPhoto: Int32Array;
  /** Photo altitudes above the grid's vertical datum. */
  altitudeDatumM: Float64Array;
  /** Local-frame positions of the photos. */
  x: Float64Array;
  y: Float64Array;
  camera: {
    plannedFocalLengthMm: number;
    focalLengthsMm: number[];
    models: string[];
    /** Photos whose focal length differs from the plan's camera by more than the tolerance. */
    focalMismatch: Array<{ photo: number; file: string; focalLengthMm: number }>;
    messages: string[];
  };
  limits: { gateM: number; lineReachM: number; offTrackM: number; focalToleranceMm: number };
}

/** Line geometry in the local frame: start, unit direction, length. */
interface LineGeom { sx: number; sy: number; ux: number; uy: number; lengthM: number; line: PlanLine }

/** Planned altitude (grid datum) at distance `d` along a line: its legs, held level beyond the first and last. */
export function plannedAltitudeAtM(line: PlanLine, d: number): number {
  const legs = line.legs;
  if (legs.length === 0) return line.stations.length ? line.stations[0].altitudeM : NaN;
  if (d <= legs[0].start.distanceM) return legs[0].altitudeStartM;
  for (const g of legs) {
    if (d <= g.end.distanceM) {
      const span = g.end.distanceM - g.start.distanceM;
      const t = span > 0 ? (d - g.start.distanceM) / span : 0;
      return g.altitudeStartM + t * (g.altitudeEndM - g.altitudeStartM);
    }
  }
  return legs[legs.length - 1].altitudeEndM;
}

/**
 * Order-keeping alignment of the photos along one line with its stations (dynamic programming over both
 * sequences, as in sequence alignment): a pair costs its along-track distance and is allowed only within the
 * gate; leaving a photo or a station unpaired costs the gate. So each station takes at most one photo, the
 * order along the line is kept, and a missed trigger is a station left unpaired.
 */
function alignLine(along: number[], stations: number[], gateM: number): Array<[number, number]> {
  const n = along.length, m = stations.length;
  const W = m + 1;
  const D = new Float64Array((n + 1) * W);
  const from = new Uint8Array((n + 1) * W); // 1 skip photo, 2 skip station, 3 pair
  for (let i = 1; i <= n; i++) { D[i * W] = i * gateM; from[i * W] = 1; }
  for (let j = 1; j <= m; j++) { D[j] = j * gateM; from[j] = 2; }
  for (let i = 1; i <= n; i++) {
    for (let j = 1; j <= m; j++) {
      let best = D[(i - 1) * W + j] + gateM, how = 1;
      const s = D[i * W + j - 1] + gateM;
      if (s < best) { best = s; how = 2; }
      const d = Math.abs(along[i - 1] - stations[j - 1]);
      if (d <= gateM) { const p = D[(i - 1) * W + j - 1] + d; if (p < best) { best = p; how = 3; } }
      D[i * W + j] = best; from[i * W + j] = how;
    }
  }
  const pairs: Array<[number, number]> = [];
  let i = n, j = m;
  while (i > 0 || j > 0) {
    const how = from[i * W + j];
    if (how === 3) { pairs.push([i - 1, j - 1]); i--; j--; } else if (how === 1) i--; else j--;
  }
  return pairs.reverse();
}

const round = (v: number, d: number) => { const f = 10 ** d; return Math.round(v * f) / f; };

/**
 * Matches the photos to the plan's stations. Each photo goes to the line it lies nearest across (within half
 * the line spacing, and along it within the gate beyond its ends); on each line photos and stations are aligned
 * in order along it with a gate of half the trigger distance (`alignLine`). Missed triggers are stations left
 * without a photo; extra photos are those no station takes. A line is off track when a photo lies further
 * across it than 5 % of the footprint width (the side overlap with the neighbouring line changes by as much).
 */
export function matchPhotos(plan: PlanResult, frame: LocalFrame, photos: readonly FlownPhoto[], camera: Camera): PhotoMatch {
  check(photos.length > 0, 'the photo log has no photos.');
  const S = plan.summary.lineSpacingM, B = plan.summary.triggerDistanceM;
  const gateM = B / 2, lineReachM = S / 2, offTrackM = 0.05 * plan.summary.footprintAcrossM;
  const geoms: LineGeom[] = plan.lines.map((line) => {
    const [sx, sy] = frame.toLocal(line.start.lon, line.start.lat);
    const [ex, ey] = frame.toLocal(line.end.lon, line.end.lat);
    const len = Math.hypot(ex - sx, ey - sy) || 1;
    return { sx, sy, ux: (ex - sx) / len, uy: (ey - sy) / len, lengthM: line.lengthM, line };
  });
  const P = photos.length;
  const x = new Float64Array(P), y = new Float64Array(P), altitudeDatumM = new Float64Array(P);
  const lineOfPhoto = new Int32Array(P).fill(-1);
  const nearest: Array<{ line: number; a: number; c: number } | null> = [];
  const onLine: Array<Array<{ photo: number; a: number; c: number }>> = geoms.map(() => []);
  for (let k = 0; k < P; k++) {
    const p = photos[k];
    [x[k], y[k]] = frame.toLocal(p.lon, p.lat);
    altitudeDatumM[k] = altitudeInGridDatumM(p, plan.takeoff.groundM);
    let best: { line: number; a: number; c: number } | null = null;
    for (let li = 0; li < geoms.length; li++) {
      const g = geoms[li];
      const dx = x[k] - g.sx, dy = y[k] - g.sy;
      const a = dx * g.ux + dy * g.uy;
      const c = dx * g.uy - dy * g.ux; // to the right of the flying direction
      if (a < -gateM || a > g.lengthM + gateM) continue;
      if (!best || Math.abs(c) < Math.abs(best.c)) best = { line: li, a, c };
    }
    nearest.push(best);
    if (best) {
      lineOfPhoto[k] = best.line;
      if (Math.abs(best.c) <= lineReachM) onLine[best.line].push({ photo: k, a: best.a, c: best.c });
    }
  }
  const matched: MatchedPhoto[] = [], missed: MissedTrigger[] = [], extra: ExtraPhoto[] = [], lines: LineFlown[] = [];
  const taken = new Uint8Array(P);
  geoms.forEach((g, li) => {
    const list = onLine[li].sort((p, q) => p.a - q.a);
    const st = g.line.stations;
    const pairs = alignLine(list.map((p) => p.a), st.map((s) => s.distanceM), gateM);
    const got = new Uint8Array(st.length);
    const cs: number[] = [], alts: number[] = [];
    let outOfOrder = 0, lastT = -Infinity;
    for (const [pi, si] of pairs) {
      const p = list[pi];
      taken[p.photo] = 1; got[si] = 1;
      const altErr = altitudeDatumM[p.photo] - plannedAltitudeAtM(g.line, p.a);
      matched.push({ photo: p.photo, file: photos[p.photo].file, line: li + 1, station: si + 1, alongErrorM: round(p.a - st[si].distanceM, 3), crossTrackM: round(p.c, 3), altitudeErrorM: round(altErr, 3) });
      cs.push(p.c); alts.push(altErr);
      // pairs run in station order, i.e. in the flying direction: capture times should rise along them
      const t = Date.parse(photos[p.photo].time);
      if (t < lastT) outOfOrder++;
      if (Number.isFinite(t)) lastT = Math.max(lastT, t);
    }
    st.forEach((s, si) => { if (!got[si]) missed.push({ line: li + 1, station: si + 1, lon: s.lon, lat: s.lat, distanceM: s.distanceM }); });
    const mean = (v: number[]) => (v.length ? v.reduce((t, u) => t + u, 0) / v.length : null);
    const maxAbs = (v: number[]) => (v.length ? Math.max(...v.map(Math.abs)) : null);
    const cMax = maxAbs(cs);
    lines.push({
      line: li + 1, stations: st.length, photos: pairs.length, missed: st.length - pairs.length,
      crossTrackMeanM: cs.length ? round(mean(cs)!, 3) : null, crossTrackMaxAbsM: cMax === null ? null : round(cMax, 3),
      crossTrackRmsM: cs.length ? round(Math.sqrt(mean(cs.map((c) => c * c))!), 3) : null,
      altitudeErrorMeanM: alts.length ? round(mean(alts)!, 3) : null, altitudeErrorMaxAbsM: alts.length ? round(maxAbs(alts)!, 3) : null,
      offTrack: cMax !== null && cMax > offTrackM,
      outOfOrder,
    });
  });
  for (let k = 0; k < P; k++) {
    if (taken[k]) continue;
    const b = nearest[k];
    const onSome = b !== null && Math.abs(b.c) <= lineReachM;
    extra.push({ photo: k, file: photos[k].file, reason: onSome ? 'no-station-near' : 'off-lines', nearestLine: b ? b.line + 1 : null, crossTrackM: b ? round(b.c, 3) : null });
  }
  matched.sort((p, q) => p.photo - q.photo);
  // camera: EXIF focal lengths are rationals often rounded to 0.1 mm, hence the tolerance
  const F = camera.focalLengthMm;
  const focalToleranceMm = Math.max(0.05, 0.01 * F);
  const focals = new Set<number>(), models = new Set<string>();
  const focalMismatch: PhotoMatch['camera']['focalMismatch'] = [];
  photos.forEach((p, k) => {
    if (p.focalLengthMm !== undefined) {
      focals.add(p.focalLengthMm);
      if (Math.abs(p.focalLengthMm - F) > focalToleranceMm) focalMismatch.push({ photo: k, file: p.file, focalLengthMm: p.focalLengthMm });
    }
    if (p.cameraModel) models.add(p.cameraModel);
  });
  const messages: string[] = [];
  if (focalMismatch.length > 0) messages.push(`${focalMismatch.length} photo${focalMismatch.length > 1 ? 's were' : ' was'} taken at a focal length other than the plan's ${F} mm (${[...new Set(focalMismatch.map((f) => f.focalLengthMm))].join(', ')} mm): GSD and footprints differ from the plan; the as-flown coverage uses the plan's camera.`);
  if (models.size > 1) messages.push(`The photos come from ${models.size} camera models (${[...models].join(', ')}); one plan assumes one camera.`);
  if (focals.size === 0) messages.push('No photo states its focal length: the plan\'s camera is assumed.');
  return {
    matched, missed, extra, lines, lineOfPhoto, altitudeDatumM, x, y,
    camera: { plannedFocalLengthMm: F, focalLengthsMm: [...focals].sort((a, b) => a - b), models: [...models].sort(), focalMismatch, messages },
    limits: { gateM: round(gateM, 3), lineReachM: round(lineReachM, 3), offTrackM: round(offTrackM, 3), focalToleranceMm },
  };
}

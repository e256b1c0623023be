/**
 * A simulated flight of an analysed plan (synthetic, for the demo's photo log and the as-flown tests): wind
 * pushes every line a few metres downwind (line 3 much further), the aircraft crabs into the wind, rolls and
 * pitches a little, altitudes read high with some scatter, some triggers are skipped, and two photos are taken
 * off the lines (one on the ground at takeoff, one in a turn). Deterministic: what the flight left out is known.
 */
import type { PlanResult } from '../terrain/plan-result';
import type { LocalFrame } from '../terrain/local-frame';
import type { CoveragePhoto } from '../terrain/coverage';
import type { FlownPhoto } from '../terrain/as-flown-match';

/** Deterministic scatter in [-1, 1] (a fixed sine hash: no random source, the same flight every run). */
const jitter = (k: number, salt: number) => Math.sin(k * 12.9898 + salt * 78.233) * 0.5 + Math.sin(k * 3.17 + salt) * 0.5;

/** What a simulated flight of a plan gives: the photo log and what is known about it in advance. */
export interface FlownLog {
  /** The photo log as the camera wrote it (in flight order). */
  photos: FlownPhoto[];
  extraPhotos: number[];
  driftM: number[];
  altitudeBiasM: number;
  allPoses: CoveragePhoto[];
  skippedPose: boolean[];
}

/**
 * Flies a plan: line k is pushed `driftM[k]` to the right of its direction (3.5 m, and 12 m on line 3; lines with an
 * eastward component to their right, the others to their left: all to the same side, as a steady crosswind does), the camera crabs 4° into the wind,
 * rolls and pitches up to about 2°, altitudes read 1.2 m high with ±0.5 m scatter, photos fall up to ±1.5 m
 * along from the station; the triggers in `skip` are not taken. Before the flight a test shot is taken on the
 * ground at takeoff, and one photo in the turn after line 2, 40 m beyond its end, without attitude.
 */
export function flyPlan(plan: PlanResult, frame: LocalFrame, skip: Array<{ line: number; station: number }>): FlownLog {
  const driftM = plan.lines.map((l, k) => (k === 2 ? 12 : 3.5) * (Math.sin((l.headingDeg * Math.PI) / 180) > 0 ? 1 : -1));
  const altitudeBiasM = 1.2;
  const skipSet = new Set(skip.map((s) => `${s.line}/${s.station}`));
  const photos: FlownPhoto[] = [];
  const allPoses: CoveragePhoto[] = [];
  const skippedPose: boolean[] = [];
  const extraPhotos: number[] = [];
  const t0 = Date.UTC(2026, 4, 14, 9, 30, 0);
  let tS = 60, k = 0;
  const iso = (s: number) => new Date(t0 + Math.round(s) * 1000).toISOString().replace('.000Z', 'Z');
  extraPhotos.push(photos.length);
  photos.push({ file: 'IMG_0000.JPG', lon: plan.takeoff.lon, lat: plan.takeoff.lat, altitudeM: plan.takeoff.groundM + 1.5, altitudeRef: 'datum', yawDeg: 0, pitchDeg: 0, rollDeg: 0, time: iso(0), focalLengthMm: 8.8, cameraModel: 'Synthetic Survey Camera' });
  plan.lines.forEach((line, li) => {
    const h = (line.headingDeg * Math.PI) / 180;
    const ux = Math.sin(h), uy = Math.cos(h); // along; right of it is (uy, -ux)
    line.stations.forEach((s, si) => {
      k++;
      const [x, y] = frame.toLocal(s.lon, s.lat);
      const along = 1.5 * jitter(k, 1), across = driftM[li] + 0.4 * jitter(k, 2);
      const [lonRaw, latRaw] = frame.toLonLat(x + along * ux + across * uy, y + along * uy - across * ux);
      const lon = Math.round(lonRaw * 1e9) / 1e9, lat = Math.round(latRaw * 1e9) / 1e9;
      const altitudeM = Math.round((s.altitudeM + altitudeBiasM + 0.5 * jitter(k, 3)) * 100) / 100;
      const yawDeg = Math.round(((line.headingDeg + (driftM[li] > 0 ? -4 : 4) + 360) % 360) * 100) / 100;
      const pitchDeg = Math.round(1.5 * jitter(k, 4) * 100) / 100, rollDeg = Math.round(2 * jitter(k, 5) * 100) / 100;
      const skipped = skipSet.has(`${li + 1}/${si + 1}`);
      // the pose exactly as the log records it, so the flown raster can be rebuilt from the simulation alone
      const [px, py] = frame.toLocal(lon, lat);
      allPoses.push({ xM: px, yM: py, altitudeM, yawDeg, rollDeg, mountTiltDeg: pitchDeg });
      skippedPose.push(skipped);
      tS += plan.summary.triggerDistanceM / 8;
      if (skipped) return;
      photos.push({ file: `IMG_${String(k).padStart(4, '0')}.JPG`, lon, lat, altitudeM, altitudeRef: 'datum', yawDeg, pitchDeg, rollDeg, time: iso(tS), focalLengthMm: 8.8, cameraModel: 'Synthetic Survey Camera' });
    });
    tS += 15;
    if (li === 1) {
      const [ex, ey] = frame.toLocal(line.end.lon, line.end.lat);
      const [lon, lat] = frame.toLonLat(ex + 40 * ux, ey + 40 * uy);
      extraPhotos.push(photos.length);
      photos.push({ file: 'IMG_9001.JPG', lon: Math.round(lon * 1e9) / 1e9, lat: Math.round(lat * 1e9) / 1e9, altitudeM: line.stations[line.stations.length - 1].altitudeM, altitudeRef: 'datum', yawDeg: null, pitchDeg: null, rollDeg: null, time: iso(tS), focalLengthMm: 8.8, cameraModel: 'Synthetic Survey Camera' });
    }
  });
  return { photos, extraPhotos, driftM, altitudeBiasM, allPoses, skippedPose };
}


/** The attitude envelope a plan must hold under: wind and crab angle per line, roll/pitch limits, and the attitudes a guaranteed view is tested at. */
import type { Camera } from './camera';
import { pixelRay } from './camera';
import type { CameraPose } from './camera-pose';
import { cameraToLocal } from './camera-pose';
import { check } from './errors';

const DEG = Math.PI / 180;

/** Wind, airspeed and attitude limits; angles in degrees, wind direction the one it blows from (clockwise from north). */
export interface AttitudeEnvelope {
  rollDeg: number;
  pitchDeg: number;
  windMps: number;
  windFromDeg: number;
  airspeedMps: number;
  /** Whether the aircraft crabs into a crosswind (fixed wing) or holds its heading and leans into it (multirotor). */
  crabs: boolean;
  /** Largest step between tested attitudes along each axis (smaller: more tests, narrower safety margin). */
  stepDeg: number;
}

export type EnvelopePresetId = 'multirotor' | 'fixed-wing';

/**
 * Starting points for the two aircraft kinds, editable per mission; our figures, not any aircraft's
 * specification (common practice): a multirotor on a stabilised mount holds its heading and keeps the camera
 * within a few degrees of level in gusts; a fixed wing crabs into the wind and rolls and pitches more.
 */
export const ENVELOPE_PRESETS: Readonly<Record<EnvelopePresetId, Omit<AttitudeEnvelope, 'windMps' | 'windFromDeg' | 'airspeedMps' | 'stepDeg'>>> = Object.freeze({
  multirotor: Object.freeze({ rollDeg: 5, pitchDeg: 5, crabs: false }),
  'fixed-wing': Object.freeze({ rollDeg: 15, pitchDeg: 8, crabs: true }),
});

/**
 * Crab angle (degrees, negative = nose left of the track) that holds `trackDeg` in the wind: the nose turns into
 * the crosswind by asin(crosswind / airspeed) (the wind triangle, common practice). Throws when the crosswind
 * is at least the airspeed (the line cannot be held).
 */
export function crabAngleDeg(trackDeg: number, windMps: number, windFromDeg: number, airspeedMps: number): number {
  if (windMps === 0) return 0;
  // component of the wind (blowing towards windFrom + 180°) to the right of the track
  const cross = windMps * Math.sin((windFromDeg + 180 - trackDeg) * DEG);
  check(Math.abs(cross) < airspeedMps, `a ${windMps} m/s wind from ${windFromDeg}° blows ${Math.abs(cross).toFixed(1)} m/s across the ${trackDeg.toFixed(1)}° track, at least the ${airspeedMps} m/s airspeed: the line cannot be held; raise the airspeed or fly in less wind.`);
  return -Math.asin(cross / airspeedMps) / DEG;
}

/** The attitudes a view is tested at for one photo, and the image margin that makes the test hold between them. */
interface EnvelopeSamples {
  /** Camera-to-local rotations, 9 numbers each. */
  rotations: Float64Array;
  count: number;
  /** Lattice size along yaw, pitch and roll (rotations run roll fastest, then pitch, then yaw). */
  shape: [number, number, number];
  /** Pixels each tested attitude must keep the point inside the image edges. */
  marginPx: number;
}

function steps(lo: number, hi: number, stepDeg: number): number[] {
  if (hi - lo < 1e-12) return [lo];
  const n = Math.max(2, 1 + Math.ceil((hi - lo) / stepDeg));
  return Array.from({ length: n }, (_, i) => lo + ((hi - lo) * i) / (n - 1));
}

/**
 * The attitude box of one photo (yaw between the planned heading and the crabbed one, pitch and roll ± their
 * limits about the planned values) sampled on a lattice, with a margin that makes "inside by the margin at
 * every lattice attitude" imply "inside at every attitude of the box":
 * - the ray's camera-frame direction q(yaw, pitch, roll) is a unit vector moved by rotations, so every second
 *   derivative along one angle has length <= 1; tensor-product linear interpolation between lattice points
 *   spaced Δi is then within E = Σ Δi² / 8 of q (the linear interpolation error bound |f − If| <= Δ²/8 max|f''|,
 *   applied axis by axis; interpolation never increases the bound);
 * - the interpolant is a convex combination of lattice directions, so it lies in the (convex) image pyramid
 *   shrunk by the margin when every lattice direction does;
 * - moving a direction with z >= cos αmax (αmax the half-diagonal field angle) by E moves its normalised image
 *   coordinates by at most E (1 + rmax) / (cos αmax − 2E), rmax = tan αmax; times the focal length in pixels.
 * The pyramid is convex only without distortion; the mild distortion of survey lenses bends its faces by far
 * less than the margin.
 */
export function envelopeSamples(camera: Camera, pose: CameraPose, env: AttitudeEnvelope, crabDeg: number): EnvelopeSamples {
  const yaw0 = pose.yawDeg, pitch0 = pose.pitchDeg ?? 0, roll0 = pose.rollDeg ?? 0;
  const yaws = steps(yaw0 + Math.min(0, crabDeg), yaw0 + Math.max(0, crabDeg), env.stepDeg);
  const pitches = steps(pitch0 - env.pitchDeg, pitch0 + env.pitchDeg, env.stepDeg);
  const rolls = steps(roll0 - env.rollDeg, roll0 + env.rollDeg, env.stepDeg);
  const count = yaws.length * pitches.length * rolls.length;
  const rotations = new Float64Array(count * 9);
  let k = 0;
  for (const yawDeg of yaws) for (const pitchDeg of pitches) for (const rollDeg of rolls) {
    rotations.set(cameraToLocal(camera, { ...pose, yawDeg, pitchDeg, rollDeg }), k * 9);
    k++;
  }
  const spacing = (v: number[]) => (v.length > 1 ? (v[1] - v[0]) * DEG : 0);
  const E = (spacing(yaws) ** 2 + spacing(pitches) ** 2 + spacing(rolls) ** 2) / 8;
  let rMax = 0;
  for (const [u, v] of [[0, 0], [camera.imageWidthPx, 0], [0, camera.imageHeightPx], [camera.imageWidthPx, camera.imageHeightPx]]) {
    const [x, y] = pixelRay(camera, u, v);
    rMax = Math.max(rMax, Math.hypot(x, y));
  }
  const cosMax = 1 / Math.sqrt(1 + rMax * rMax);
  const focalPx = camera.focalLengthMm / Math.min(camera.sensorWidthMm / camera.imageWidthPx, camera.sensorHeightMm / camera.imageHeightPx);
  const marginPx = E === 0 ? 0 : ((E * (1 + rMax)) / (cosMax - 2 * E)) * focalPx;
  return { rotations, count, shape: [yaws.length, pitches.length, rolls.length], marginPx };
}

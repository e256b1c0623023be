/**
 * The camera's pose and its rotation into the local frame: a leaf of the camera geometry, so that screens which only
 * need the attitude envelope (the plan editor's spec fields) do not pull in the grid sampling and the CRS tables
 * that the footprint on the terrain needs.
 */
import type { Camera } from './camera';

/** Ground height (metres, the grid's vertical datum) at a point of a local metric frame (x east, y north); NaN where unknown. */
export type HeightAt = (xM: number, yM: number) => number;

/**
 * Camera pose in a local metric frame (x east, y north, z up, heights in the grid's vertical datum).
 * Attitude is the aircraft's, aerospace Z-Y-X order: yaw clockwise from north (the flight direction),
 * pitch nose up, roll right wing down. At zero pitch and roll the camera looks straight down.
 */
export interface CameraPose {
  xM: number;
  yM: number;
  altitudeM: number;
  yawDeg: number;
  pitchDeg?: number;
  rollDeg?: number;
  /**
   * Tilt of the camera on its mount (gimbal pitch) from straight down towards the aircraft's nose, degrees:
   * 0 looks straight down, 30 looks 30° ahead of nadir (oblique capture), negative values look back.
   */
  mountTiltDeg?: number;
}

const DEG = Math.PI / 180;

/** Rotation (row-major 3x3) from the camera frame (x right in the image, y down, z optical axis) to local east-north-up. */
export function cameraToLocal(camera: Camera, pose: CameraPose): Float64Array {
  const psi = pose.yawDeg * DEG;
  const th = (pose.pitchDeg ?? 0) * DEG;
  const ph = (pose.rollDeg ?? 0) * DEG;
  const cps = Math.cos(psi), sps = Math.sin(psi), cth = Math.cos(th), sth = Math.sin(th), cph = Math.cos(ph), sph = Math.sin(ph);
  // body (forward, right, down) -> NED: Rz(psi) Ry(theta) Rx(phi)
  const b = [
    cps * cth, cps * sth * sph - sps * cph, cps * sth * cph + sps * sph,
    sps * cth, sps * sth * sph + cps * cph, sps * sth * cph - cps * sph,
    -sth, cth * sph, cth * cph,
  ];
  // camera -> body: image width across track puts image x to the right and image y aft;
  // image width along track puts image x forward and image y to the right.
  const camToBody0 = camera.alongTrackSide === 'width' ? [1, 0, 0, 0, 1, 0, 0, 0, 1] : [0, -1, 0, 1, 0, 0, 0, 0, 1];
  // mount tilt: a rotation about the body's right axis that turns the optical axis (body down) towards the nose
  const tl = (pose.mountTiltDeg ?? 0) * DEG;
  const ct = Math.cos(tl), st = Math.sin(tl);
  const tilt = [ct, 0, st, 0, 1, 0, -st, 0, ct];
  const camToBody = new Array<number>(9);
  for (let r = 0; r < 3; r++) {
    for (let c = 0; c < 3; c++) camToBody[r * 3 + c] = tilt[r * 3] * camToBody0[c] + tilt[r * 3 + 1] * camToBody0[3 + c] + tilt[r * 3 + 2] * camToBody0[6 + c];
  }
  const m = new Float64Array(9);
  for (let r = 0; r < 3; r++) {
    for (let c = 0; c < 3; c++) {
      m[r * 3 + c] = b[r * 3] * camToBody[c] + b[r * 3 + 1] * camToBody[3 + c] + b[r * 3 + 2] * camToBody[6 + c];
    }
  }
  // NED -> ENU: E = N_y, N = N_x, U = -N_z (swap rows 0 and 1, negate row 2)
  const out = new Float64Array(9);
  for (let c = 0; c < 3; c++) {
    out[c] = m[3 + c];
    out[3 + c] = m[c];
    out[6 + c] = -m[6 + c];
  }
  return out;
}


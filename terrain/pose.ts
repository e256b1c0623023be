/** Projection of a ground point into a photo: full pose (position, yaw, pitch, roll, mount tilt), pinhole camera and Brown distortion. */
import type { Camera } from './camera';
import { pixelPitchHeightMm, pixelPitchMm } from './camera';
import type { CameraPose } from './footprint';
import { cameraToLocal } from './footprint';

/**
 * What projecting into one camera needs, worked out once: principal point and focal length in pixels, image
 * size and the Brown coefficients (zero when the camera has none).
 */
export interface ImageModel {
  widthPx: number;
  heightPx: number;
  cxPx: number;
  cyPx: number;
  /** Focal length in pixels along image x and y (f / pixel pitch). */
  fxPx: number;
  fyPx: number;
  k1: number; k2: number; k3: number; p1: number; p2: number;
  distorted: boolean;
}

/** The image model of a camera record. */
export function imageModel(camera: Camera): ImageModel {
  const d = camera.distortion;
  return {
    widthPx: camera.imageWidthPx,
    heightPx: camera.imageHeightPx,
    cxPx: camera.principalPointPx?.x ?? camera.imageWidthPx / 2,
    cyPx: camera.principalPointPx?.y ?? camera.imageHeightPx / 2,
    fxPx: camera.focalLengthMm / pixelPitchMm(camera),
    fyPx: camera.focalLengthMm / pixelPitchHeightMm(camera),
    k1: d?.k1 ?? 0, k2: d?.k2 ?? 0, k3: d?.k3 ?? 0, p1: d?.p1 ?? 0, p2: d?.p2 ?? 0,
    distorted: d !== undefined && (d.k1 !== 0 || d.k2 !== 0 || d.k3 !== 0 || d.p1 !== 0 || d.p2 !== 0),
  };
}

/**
 * Image position (pixels, corner origin, u right, v down) of the ground point (x, y, z) of the local frame seen
 * from `origin` with the camera-to-local rotation `rot` (footprint.ts `cameraToLocal`): the collinearity
 * equations of a pinhole camera (e.g. Wolf, Dewitt & Wilkinson, Elements of Photogrammetry, 4th ed., ch. 11,
 * from memory) followed by Brown's distortion as in camera.ts. Writes [u, v] into `out` and returns false when
 * the point is behind the camera (u, v are then NaN). Allocates nothing: it runs once per cell and photo.
 */
export function projectPoint(
  m: ImageModel, rot: Float64Array, ox: number, oy: number, oz: number, x: number, y: number, z: number, out: Float64Array, at = 0,
): boolean {
  const dx = x - ox, dy = y - oy, dz = z - oz;
  // camera coordinates = rotᵀ · d (rot read from index `at`, so many rotations can share one array)
  const qx = rot[at] * dx + rot[at + 3] * dy + rot[at + 6] * dz;
  const qy = rot[at + 1] * dx + rot[at + 4] * dy + rot[at + 7] * dz;
  const qz = rot[at + 2] * dx + rot[at + 5] * dy + rot[at + 8] * dz;
  if (!(qz > 0)) { out[0] = NaN; out[1] = NaN; return false; }
  let xn = qx / qz, yn = qy / qz;
  if (m.distorted) {
    const r2 = xn * xn + yn * yn;
    const radial = 1 + r2 * (m.k1 + r2 * (m.k2 + r2 * m.k3));
    const xd = xn * radial + 2 * m.p1 * xn * yn + m.p2 * (r2 + 2 * xn * xn);
    const yd = yn * radial + m.p1 * (r2 + 2 * yn * yn) + 2 * m.p2 * xn * yn;
    xn = xd; yn = yd;
  }
  out[0] = m.cxPx + xn * m.fxPx;
  out[1] = m.cyPx + yn * m.fyPx;
  return true;
}

/**
 * `projectPoint` with the camera at o[oi..oi+2] and the point at p[0..2]: the same arithmetic, for hot loops (a
 * call boxes each fraction it passes, and these pass none).
 */
export function projectFrom(m: ImageModel, rot: Float64Array, at: number, o: Float64Array, oi: number, p: Float64Array, out: Float64Array): boolean {
  const dx = p[0] - o[oi], dy = p[1] - o[oi + 1], dz = p[2] - o[oi + 2];
  const qx = rot[at] * dx + rot[at + 3] * dy + rot[at + 6] * dz;
  const qy = rot[at + 1] * dx + rot[at + 4] * dy + rot[at + 7] * dz;
  const qz = rot[at + 2] * dx + rot[at + 5] * dy + rot[at + 8] * dz;
  if (!(qz > 0)) { out[0] = NaN; out[1] = NaN; return false; }
  let xn = qx / qz, yn = qy / qz;
  if (m.distorted) {
    const r2 = xn * xn + yn * yn;
    const radial = 1 + r2 * (m.k1 + r2 * (m.k2 + r2 * m.k3));
    const xd = xn * radial + 2 * m.p1 * xn * yn + m.p2 * (r2 + 2 * xn * xn);
    const yd = yn * radial + m.p1 * (r2 + 2 * yn * yn) + 2 * m.p2 * xn * yn;
    xn = xd; yn = yd;
  }
  out[0] = m.cxPx + xn * m.fxPx;
  out[1] = m.cyPx + yn * m.fyPx;
  return true;
}

/** `insideImage` of out[0], out[1] (from `projectFrom`): the pixel position is read, not passed. */
export function insideImageAt(m: ImageModel, out: Float64Array, marginPx: number): boolean {
  const u = out[0], v = out[1];
  return u >= marginPx && v >= marginPx && u <= m.widthPx - marginPx && v <= m.heightPx - marginPx;
}

/** True when (u, v) lies in the image shrunk by `marginPx` on every side (0 <= u <= width, 0 <= v <= height). */
export function insideImage(m: ImageModel, u: number, v: number, marginPx = 0): boolean {
  return u >= marginPx && v >= marginPx && u <= m.widthPx - marginPx && v <= m.heightPx - marginPx;
}

/** Image position of a ground point for a pose, or null when it is behind the camera (convenience form of `projectPoint`). */
export function projectToImage(camera: Camera, pose: CameraPose, x: number, y: number, z: number): [number, number] | null {
  const out = new Float64Array(2);
  return projectPoint(imageModel(camera), cameraToLocal(camera, pose), pose.xM, pose.yM, pose.altitudeM, x, y, z, out) ? [out[0], out[1]] : null;
}

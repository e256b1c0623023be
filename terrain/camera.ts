/** The camera record (sensor, lens, image size, mount, Brown distortion), generic presets and pixel pitch. */
import { check } from './errors';

/** Which image side lies along the flight direction: the image height (default) or the image width. */
type AlongTrackSide = 'height' | 'width';

/**
 * Brown lens distortion in the convention of OpenCV's calibration model (undistorted normalised image
 * coordinates x = X/Z, y = Y/Z to distorted ones): radial k1, k2, k3 and tangential (decentring) p1, p2.
 * Source: D. C. Brown, "Decentering distortion of lenses", Photogrammetric Engineering 32(3), 1966.
 */
interface BrownDistortion {
  k1: number;
  k2: number;
  k3: number;
  p1: number;
  p2: number;
}

/** A frame camera: sensor size, focal length, image size; optional mount side, principal point and distortion. */
export interface Camera {
  sensorWidthMm: number;
  sensorHeightMm: number;
  focalLengthMm: number;
  imageWidthPx: number;
  imageHeightPx: number;
  /** Default 'height': the image width runs across track. */
  alongTrackSide?: AlongTrackSide;
  /** Principal point in pixels from the top-left image corner; default the image centre. */
  principalPointPx?: { x: number; y: number };
  distortion?: BrownDistortion;
}

/** A generic camera class (format, resolution, lens); no maker's model. */
interface CameraPreset {
  id: string;
  label: string;
  camera: Camera;
}

/**
 * Sensor sizes are the typical ones for each named format, as tabulated in the Wikipedia article
 * "Image sensor format" (table "Sensor format types and dimensions"): inch "types" are not standardised
 * and makers vary by a few tenths of a millimetre. Pixel counts and lenses are common practice for
 * survey cameras of each class, not any maker's specification.
 */
export const CAMERA_PRESETS: readonly CameraPreset[] = Object.freeze([
  preset('small-12mp-4.5mm', '1/2.3-inch type, 12 MP, 4.5 mm lens', 6.17, 4.55, 4.5, 4000, 3000),
  preset('one-inch-20mp-8.8mm', '1-inch type, 20 MP, 8.8 mm lens', 13.2, 8.8, 8.8, 5472, 3648),
  preset('one-inch-20mp-10.3mm', '1-inch type, 20 MP, 10.3 mm lens', 13.2, 8.8, 10.3, 5472, 3648),
  preset('four-thirds-20mp-12mm', 'Micro Four Thirds, 20 MP, 12 mm lens', 17.3, 13.0, 12, 5184, 3888),
  preset('aps-c-24mp-16mm', 'APS-C, 24 MP, 16 mm lens', 23.5, 15.6, 16, 6000, 4000),
  preset('aps-c-24mp-24mm', 'APS-C, 24 MP, 24 mm lens', 23.5, 15.6, 24, 6000, 4000),
  preset('full-frame-42mp-35mm', 'Full frame 36 x 24 mm, 42 MP, 35 mm lens', 36, 24, 35, 7952, 5304),
  preset('full-frame-61mp-35mm', 'Full frame 36 x 24 mm, 61 MP, 35 mm lens', 36, 24, 35, 9504, 6336),
]);

function preset(id: string, label: string, w: number, h: number, f: number, px: number, py: number): CameraPreset {
  return Object.freeze({
    id,
    label,
    camera: Object.freeze({ sensorWidthMm: w, sensorHeightMm: h, focalLengthMm: f, imageWidthPx: px, imageHeightPx: py }),
  });
}

/** The preset with this id, or undefined. */
export function cameraPreset(id: string): CameraPreset | undefined {
  return CAMERA_PRESETS.find((p) => p.id === id);
}

/** Throw `invalid-input` unless the camera record is physically sensible. */
export function checkCamera(c: Camera): void {
  check(c !== null && typeof c === 'object', 'camera must be an object with sensorWidthMm, sensorHeightMm, focalLengthMm, imageWidthPx, imageHeightPx.');
  const pos = (name: keyof Camera, max: number) => {
    const v = c[name] as unknown;
    check(typeof v === 'number' && Number.isFinite(v) && v > 0 && v <= max, `camera.${name} must be a number in (0, ${max}], got ${JSON.stringify(v)}.`);
  };
  pos('sensorWidthMm', 500); // up to large-format film frames (230 mm)
  pos('sensorHeightMm', 500);
  pos('focalLengthMm', 1000);
  pos('imageWidthPx', 100_000);
  pos('imageHeightPx', 100_000);
  check(Number.isInteger(c.imageWidthPx) && Number.isInteger(c.imageHeightPx), `camera image size must be whole pixels, got ${c.imageWidthPx} x ${c.imageHeightPx}.`);
  check(c.alongTrackSide === undefined || c.alongTrackSide === 'height' || c.alongTrackSide === 'width', `camera.alongTrackSide must be "height" or "width", got ${JSON.stringify(c.alongTrackSide)}.`);
  if (c.principalPointPx !== undefined) {
    const { x, y } = c.principalPointPx;
    check(Number.isFinite(x) && Number.isFinite(y) && x >= 0 && y >= 0 && x <= c.imageWidthPx && y <= c.imageHeightPx,
      `camera.principalPointPx must lie inside the ${c.imageWidthPx} x ${c.imageHeightPx} image, got (${x}, ${y}).`);
  }
  if (c.distortion !== undefined) {
    for (const k of ['k1', 'k2', 'k3', 'p1', 'p2'] as const) {
      const v = c.distortion[k];
      check(typeof v === 'number' && Number.isFinite(v) && Math.abs(v) < 10, `camera.distortion.${k} must be a finite number with |value| < 10, got ${JSON.stringify(v)}.`);
    }
  }
}

/** Pixel pitch along the image width, millimetres (sensor width / image width). */
export function pixelPitchMm(c: Camera): number {
  return c.sensorWidthMm / c.imageWidthPx;
}

/** Pixel pitch along the image height, millimetres. */
export function pixelPitchHeightMm(c: Camera): number {
  return c.sensorHeightMm / c.imageHeightPx;
}

/** Image sides in flight terms: pixels and millimetres across and along track. */
export function trackSides(c: Camera): { acrossPx: number; alongPx: number; acrossMm: number; alongMm: number } {
  return c.alongTrackSide === 'width'
    ? { acrossPx: c.imageHeightPx, alongPx: c.imageWidthPx, acrossMm: c.sensorHeightMm, alongMm: c.sensorWidthMm }
    : { acrossPx: c.imageWidthPx, alongPx: c.imageHeightPx, acrossMm: c.sensorWidthMm, alongMm: c.sensorHeightMm };
}

/** Apply Brown distortion to undistorted normalised coordinates (x, y) → distorted [xd, yd]. */
export function distortNormalised(d: BrownDistortion, x: number, y: number): [number, number] {
  const r2 = x * x + y * y;
  const radial = 1 + r2 * (d.k1 + r2 * (d.k2 + r2 * d.k3));
  return [x * radial + 2 * d.p1 * x * y + d.p2 * (r2 + 2 * x * x), y * radial + d.p1 * (r2 + 2 * y * y) + 2 * d.p2 * x * y];
}

/**
 * Remove Brown distortion: distorted normalised (xd, yd) → undistorted [x, y], by the fixed-point
 * iteration OpenCV's undistortPoints uses; converges for the mild distortion of survey lenses.
 */
export function undistortNormalised(d: BrownDistortion, xd: number, yd: number): [number, number] {
  let x = xd;
  let y = yd;
  for (let i = 0; i < 50; i++) {
    const r2 = x * x + y * y;
    const radial = 1 + r2 * (d.k1 + r2 * (d.k2 + r2 * d.k3));
    const dx = 2 * d.p1 * x * y + d.p2 * (r2 + 2 * x * x);
    const dy = d.p1 * (r2 + 2 * y * y) + 2 * d.p2 * x * y;
    const nx = (xd - dx) / radial;
    const ny = (yd - dy) / radial;
    const moved = Math.abs(nx - x) + Math.abs(ny - y);
    x = nx;
    y = ny;
    if (moved < 1e-14) break;
  }
  return [x, y];
}

/**
 * Direction of the ray through image pixel (u, v) (corner origin, u right, v down) in the camera frame
 * (x right, y down, z along the optical axis), as normalised coordinates [x, y] with z = 1.
 */
export function pixelRay(c: Camera, u: number, v: number): [number, number] {
  const cx = c.principalPointPx?.x ?? c.imageWidthPx / 2;
  const cy = c.principalPointPx?.y ?? c.imageHeightPx / 2;
  const xd = ((u - cx) * pixelPitchMm(c)) / c.focalLengthMm;
  const yd = ((v - cy) * pixelPitchHeightMm(c)) / c.focalLengthMm;
  return c.distortion ? undistortNormalised(c.distortion, xd, yd) : [xd, yd];
}

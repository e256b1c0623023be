/** Rigorous photo footprint: rays through image points cast onto the terrain (iterative ray–terrain intersection, Brown distortion). */
import type { Camera } from './camera';
import { checkCamera, pixelRay } from './camera';
import type { Grid } from './grid';
import { check } from './errors';
import { localFrameFor, localHeights } from './local-frame';

export type { CameraPose, HeightAt } from './camera-pose';
export { cameraToLocal } from './camera-pose';
import { cameraToLocal, type CameraPose, type HeightAt } from './camera-pose';

/** Options of the ray–terrain intersection. */
interface IntersectOptions {
  /** Stop when successive ground heights differ by less than this (default 1e-4 m). */
  toleranceM?: number;
  /** Fixed-point iterations before falling back to marching along the ray (default 12). */
  maxIterations?: number;
  /** Step along the ray for the marching fallback (default 1 m). */
  marchStepM?: number;
  /** First guess of the ground height; default the height under the camera. */
  startHeightM?: number;
}

/** A ground point hit by a ray: local x, y and the ground height z. */
type GroundPoint = [number, number, number];


/**
 * Where the ray from (ox, oy, oz) along (dx, dy, dz) meets the terrain, or null when it points at or above
 * the horizon, runs off the grid or into nodata. Fixed-point iteration on the ground height (the usual
 * single-ray intersection with a DEM in monoplotting and orthorectification); where it does not converge
 * (terrain steeper than the ray) or meets nodata, marching along the ray from the camera with bisection,
 * which also finds the first hit where a ridge hides the ground behind it.
 */
export function intersectRay(
  ox: number, oy: number, oz: number, dx: number, dy: number, dz: number, heightAt: HeightAt, opts: IntersectOptions = {},
): GroundPoint | null {
  if (!(dz < 0)) return null;
  const tol = opts.toleranceM ?? 1e-4;
  const maxIt = opts.maxIterations ?? 12;
  let h = opts.startHeightM ?? heightAt(ox, oy);
  if (!Number.isFinite(h)) h = heightAt(ox, oy);
  if (Number.isFinite(h) && h < oz) {
    for (let i = 0; i < maxIt; i++) {
      const t = (oz - h) / -dz;
      const x = ox + t * dx, y = oy + t * dy;
      const hn = heightAt(x, y);
      if (hn !== hn) break; // unknown ground: let the march decide whether an earlier hit exists
      if (Math.abs(hn - h) < tol) {
        const t2 = (oz - hn) / -dz;
        return [ox + t2 * dx, oy + t2 * dy, hn];
      }
      if (hn >= oz) break;
      h = hn;
    }
  }
  return marchRay(ox, oy, oz, dx, dy, dz, heightAt, opts.marchStepM ?? 1, tol);
}

/** First crossing of the terrain along the ray by fixed steps, refined by bisection; null if none is found. */
function marchRay(ox: number, oy: number, oz: number, dx: number, dy: number, dz: number, heightAt: HeightAt, stepM: number, tol: number): GroundPoint | null {
  const len = Math.hypot(dx, dy, dz);
  const dt = stepM / len;
  let t0 = 0;
  let g0 = oz - heightAt(ox, oy);
  if (!(g0 > 0)) return null; // camera at or below the ground, or over nodata
  let lowest = oz - g0;
  for (let k = 1; k < 200_000; k++) {
    const t1 = k * dt;
    const z = oz + t1 * dz;
    const h = heightAt(ox + t1 * dx, oy + t1 * dy);
    if (h !== h) return null;
    if (h < lowest) lowest = h;
    const g1 = z - h;
    if (g1 <= 0) {
      let a = t0, b = t1;
      for (let j = 0; j < 60 && (b - a) * len > tol * 1e-2; j++) {
        const m = (a + b) / 2;
        const gm = oz + m * dz - heightAt(ox + m * dx, oy + m * dy);
        if (gm !== gm) return null;
        if (gm > 0) a = m; else b = m;
      }
      const t = (a + b) / 2;
      const x = ox + t * dx, y = oy + t * dy;
      return [x, y, heightAt(x, y)];
    }
    if (z < lowest - 10_000) return null;
    t0 = t1;
    g0 = g1;
  }
  return null;
}

/** Ground point seen at image pixel (u, v) from `pose`, using a precomputed camera-to-local rotation. */
export function castPixel(camera: Camera, pose: CameraPose, rot: Float64Array, u: number, v: number, heightAt: HeightAt, opts?: IntersectOptions): GroundPoint | null {
  const [xn, yn] = pixelRay(camera, u, v);
  const dx = rot[0] * xn + rot[1] * yn + rot[2];
  const dy = rot[3] * xn + rot[4] * yn + rot[5];
  const dz = rot[6] * xn + rot[7] * yn + rot[8];
  return intersectRay(pose.xM, pose.yM, pose.altitudeM, dx, dy, dz, heightAt, opts);
}

/** The rigorous ground footprint of one photo and the GSD at its image centre. */
interface PhotoFootprint {
  /** Ground points of the image corners: top-left, top-right, bottom-right, bottom-left; null where a ray misses. */
  corners: Array<GroundPoint | null>;
  /** Ground point under the principal point. */
  centre: GroundPoint | null;
  /** Footprint area (m², horizontal projection of the corner quadrilateral); null when a corner is missing. */
  areaM2: number | null;
  /** Ground distance between neighbouring pixels at the image centre along image x and y, and the coarser of both (cm). */
  gsdXCm: number | null;
  gsdYCm: number | null;
  gsdCm: number | null;
  /** Height of the camera above the ground under the principal point (slant distance's vertical part). */
  heightAboveCentreM: number | null;
}

/** Cast the corner and centre rays of a photo onto the terrain (iterative ray–terrain intersection through Brown distortion). */
export function photoFootprint(camera: Camera, pose: CameraPose, heightAt: HeightAt, opts: IntersectOptions = {}): PhotoFootprint {
  check(Number.isFinite(pose.xM) && Number.isFinite(pose.yM) && Number.isFinite(pose.altitudeM) && Number.isFinite(pose.yawDeg),
    `pose needs finite xM, yM, altitudeM and yawDeg, got ${JSON.stringify(pose)}.`);
  const rot = cameraToLocal(camera, pose);
  const W = camera.imageWidthPx, H = camera.imageHeightPx;
  const corners = [[0, 0], [W, 0], [W, H], [0, H]].map(([u, v]) => castPixel(camera, pose, rot, u, v, heightAt, opts));
  const cx = camera.principalPointPx?.x ?? W / 2;
  const cy = camera.principalPointPx?.y ?? H / 2;
  const fine = { ...opts, toleranceM: Math.min(opts.toleranceM ?? 1e-4, 1e-7) };
  const centre = castPixel(camera, pose, rot, cx, cy, heightAt, fine);
  let areaM2: number | null = null;
  if (corners.every((c) => c !== null)) {
    let s = 0;
    for (let i = 0; i < 4; i++) {
      const a = corners[i]!, b = corners[(i + 1) % 4]!;
      s += a[0] * b[1] - b[0] * a[1];
    }
    areaM2 = Math.abs(s) / 2;
  }
  const span = (p: GroundPoint | null, q: GroundPoint | null, px: number) =>
    p && q ? (Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]) / px) * 100 : null;
  const d = 1; // one pixel either side of the centre: central difference of the ground position
  const gsdXCm = span(castPixel(camera, pose, rot, cx - d, cy, heightAt, fine), castPixel(camera, pose, rot, cx + d, cy, heightAt, fine), 2 * d);
  const gsdYCm = span(castPixel(camera, pose, rot, cx, cy - d, heightAt, fine), castPixel(camera, pose, rot, cx, cy + d, heightAt, fine), 2 * d);
  const gsdCm = gsdXCm !== null && gsdYCm !== null ? Math.max(gsdXCm, gsdYCm) : null;
  return { corners, centre, areaM2, gsdXCm, gsdYCm, gsdCm, heightAboveCentreM: centre ? pose.altitudeM - centre[2] : null };
}

/** A camera pose given in WGS 84 longitude/latitude with the altitude above the grid's vertical datum. */
interface GeoCameraPose {
  lon: number;
  lat: number;
  altitudeM: number;
  yawDeg: number;
  pitchDeg?: number;
  rollDeg?: number;
  mountTiltDeg?: number;
}

/** A footprint ground point in WGS 84 with the grid height there. */
interface GeoGroundPoint {
  lon: number;
  lat: number;
  groundM: number;
}

/** The rigorous footprint of one photo over a grid, for a pose in longitude/latitude (corners back in longitude/latitude). */
export function footprintOnGrid(
  grid: Grid, camera: Camera, pose: GeoCameraPose, opts: IntersectOptions = {},
): Omit<PhotoFootprint, 'corners' | 'centre'> & { corners: Array<GeoGroundPoint | null>; centre: GeoGroundPoint | null } {
  check(Number.isFinite(pose.lon) && Number.isFinite(pose.lat) && Math.abs(pose.lat) < 84, `pose needs a longitude and a latitude (UTM range), got (${pose.lon}, ${pose.lat}).`);
  checkCamera(camera);
  const frame = localFrameFor(pose.lon, pose.lat);
  const { heightAt } = localHeights(grid, frame);
  const [x, y] = frame.toLocal(pose.lon, pose.lat);
  const fp = photoFootprint(camera, { xM: x, yM: y, altitudeM: pose.altitudeM, yawDeg: pose.yawDeg, pitchDeg: pose.pitchDeg, rollDeg: pose.rollDeg, mountTiltDeg: pose.mountTiltDeg }, heightAt, opts);
  const geo = (p: GroundPoint | null): GeoGroundPoint | null => {
    if (!p) return null;
    const [lon, lat] = frame.toLonLat(p[0], p[1]);
    return { lon, lat, groundM: p[2] };
  };
  return { ...fp, corners: fp.corners.map(geo), centre: geo(fp.centre) };
}

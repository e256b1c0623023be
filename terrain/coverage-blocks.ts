/**
 * Deciding a whole block of cells against one photo at once: the block's ground points lie in a box of the local
 * frame (its cells' horizontal extent and the range of their heights), and "inside the image" is bounded by linear
 * inequalities in the ground point (`image-bounds.ts`), so the box's centre and half-extents tell whether every
 * point of it lands inside, every point outside, or either.
 */
import type { NormalisedRect } from './image-bounds';

/** Every point of the box lands outside the image (or behind the camera). */
export const OUT = 0;
/** Some points may land inside and some outside: test each point. */
export const MIXED = 1;
/** Every point of the box lands inside the image, in front of the camera. */
export const IN = 2;

/**
 * The box with centre (dx, dy, dz) relative to the camera and half-extents (hx, hy, hz), from `q` in that order,
 * against the camera-to-local rotation read from `at` (columns: image x, image y, optical axis; numbers come in
 * arrays: a call boxes each fraction it passes). A linear function a·d over the box ranges over
 * a·centre ± (|ax|·hx + |ay|·hy + |az|·hz); "x ≤ xb" is qx − xb·qz ≤ 0 where qz > 0 (and a point with qz ≤ 0 is
 * outside anyway), so a bound every point breaks puts the box outside and bounds every point keeps put it inside.
 */
export function classifyBox(
  rot: Float64Array, at: number, inner: NormalisedRect | null, outer: NormalisedRect | null, q: Float64Array,
): number {
  const dx = q[0], dy = q[1], dz = q[2], hx = q[3], hy = q[4], hz = q[5];
  const Xx = rot[at], Xy = rot[at + 3], Xz = rot[at + 6];
  const Yx = rot[at + 1], Yy = rot[at + 4], Yz = rot[at + 7];
  const Zx = rot[at + 2], Zy = rot[at + 5], Zz = rot[at + 8];
  const qx = Xx * dx + Xy * dy + Xz * dz, qy = Yx * dx + Yy * dy + Yz * dz, qz = Zx * dx + Zy * dy + Zz * dz;
  const sz = Math.abs(Zx) * hx + Math.abs(Zy) * hy + Math.abs(Zz) * hz;
  if (qz + sz <= 0) return OUT;
  if (outer !== null) {
    let b = outer[1];
    if (qx - b * qz - (Math.abs(Xx - b * Zx) * hx + Math.abs(Xy - b * Zy) * hy + Math.abs(Xz - b * Zz) * hz) > 0) return OUT;
    b = outer[0];
    if (b * qz - qx - (Math.abs(b * Zx - Xx) * hx + Math.abs(b * Zy - Xy) * hy + Math.abs(b * Zz - Xz) * hz) > 0) return OUT;
    b = outer[3];
    if (qy - b * qz - (Math.abs(Yx - b * Zx) * hx + Math.abs(Yy - b * Zy) * hy + Math.abs(Yz - b * Zz) * hz) > 0) return OUT;
    b = outer[2];
    if (b * qz - qy - (Math.abs(b * Zx - Yx) * hx + Math.abs(b * Zy - Yy) * hy + Math.abs(b * Zz - Yz) * hz) > 0) return OUT;
  }
  if (inner === null || !(qz - sz > 0)) return MIXED;
  let b = inner[1];
  if (!(qx - b * qz + (Math.abs(Xx - b * Zx) * hx + Math.abs(Xy - b * Zy) * hy + Math.abs(Xz - b * Zz) * hz) < 0)) return MIXED;
  b = inner[0];
  if (!(b * qz - qx + (Math.abs(b * Zx - Xx) * hx + Math.abs(b * Zy - Xy) * hy + Math.abs(b * Zz - Xz) * hz) < 0)) return MIXED;
  b = inner[3];
  if (!(qy - b * qz + (Math.abs(Yx - b * Zx) * hx + Math.abs(Yy - b * Zy) * hy + Math.abs(Yz - b * Zz) * hz) < 0)) return MIXED;
  b = inner[2];
  if (!(b * qz - qy + (Math.abs(b * Zx - Yx) * hx + Math.abs(b * Zy - Yy) * hy + Math.abs(b * Zz - Yz) * hz) < 0)) return MIXED;
  return IN;
}

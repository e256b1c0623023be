/**
 * Rectangles in undistorted normalised image coordinates (x = qx/qz, y = qy/qz in the camera frame) that bound
 * the points a camera images inside its frame: every point of `inner` lands inside the image (shrunk by a margin)
 * and every point outside `outer` lands outside it. "xa ≤ qx/qz ≤ xb" with qz > 0 is the pair of linear
 * inequalities qx − xb·qz ≤ 0 and xa·qz − qx ≤ 0 in the ground point, so a whole box of ground points can be
 * decided at once from its centre and half-extents (see `coverage-blocks.ts`).
 */
import { undistortNormalised } from './camera';
import type { ImageModel } from './pose';

/** [xa, xb, ya, yb]: xa ≤ x ≤ xb and ya ≤ y ≤ yb. */
export type NormalisedRect = readonly [number, number, number, number];

export interface NormalisedBounds {
  /** Points inside land inside the image (null: no such rectangle was proven; nothing is decided as inside). */
  inner: NormalisedRect | null;
  /** Points outside land outside the image (null: nothing is decided as outside). */
  outer: NormalisedRect | null;
}

/**
 * Slack kept on both sides of the exact rectangle of a camera without distortion: far above the rounding of the
 * per-point division (about 1e-16 relative) and far below a pixel (1e-7 is 0.0004 px at a 4000 px focal length).
 */
const EXACT_SLACK = 1e-7;
/** Slack of a distorted camera's rectangles, as a share of their size (found from samples, then checked). */
const DISTORTED_SLACK = 0.01;
/** Samples per image edge for a distorted camera's rectangles and their checks. */
const EDGE_SAMPLES = 256;

/** Where undistorted normalised (x, y) lands in the image, pixels (Brown distortion as `projectPoint`). */
function toPixel(m: ImageModel, x: number, y: number): [number, number] {
  const r2 = x * x + y * y;
  const radial = 1 + r2 * (m.k1 + r2 * (m.k2 + r2 * m.k3));
  const xd = x * radial + 2 * m.p1 * x * y + m.p2 * (r2 + 2 * x * x);
  const yd = y * radial + m.p1 * (r2 + 2 * y * y) + 2 * m.p2 * x * y;
  return [m.cxPx + xd * m.fxPx, m.cyPx + yd * m.fyPx];
}

/** The bounding rectangles of the image shrunk by `marginPx` on every side. */
export function normalisedBounds(m: ImageModel, marginPx = 0): NormalisedBounds {
  const u0 = marginPx, u1 = m.widthPx - marginPx, v0 = marginPx, v1 = m.heightPx - marginPx;
  if (!(u0 < u1 && v0 < v1)) return { inner: null, outer: [0, 0, 0, 0] };
  const xa = (u0 - m.cxPx) / m.fxPx, xb = (u1 - m.cxPx) / m.fxPx, ya = (v0 - m.cyPx) / m.fyPx, yb = (v1 - m.cyPx) / m.fyPx;
  if (!m.distorted) {
    return { inner: [xa + EXACT_SLACK, xb - EXACT_SLACK, ya + EXACT_SLACK, yb - EXACT_SLACK], outer: [xa - EXACT_SLACK, xb + EXACT_SLACK, ya - EXACT_SLACK, yb + EXACT_SLACK] };
  }
  // the frame's edges traced back through the distortion: the inner rectangle lies within every edge's innermost
  // sample, the outer one beyond every sample; both get a slack and are then checked forward, point by point
  const d = { k1: m.k1, k2: m.k2, k3: m.k3, p1: m.p1, p2: m.p2 };
  let ia = -Infinity, ib = Infinity, ic = -Infinity, id = Infinity, oa = Infinity, ob = -Infinity, oc = Infinity, od = -Infinity;
  for (let k = 0; k <= EDGE_SAMPLES; k++) {
    const s = k / EDGE_SAMPLES;
    const left = undistortNormalised(d, xa, ya + s * (yb - ya)), right = undistortNormalised(d, xb, ya + s * (yb - ya));
    const top = undistortNormalised(d, xa + s * (xb - xa), ya), bottom = undistortNormalised(d, xa + s * (xb - xa), yb);
    ia = Math.max(ia, left[0]); ib = Math.min(ib, right[0]); ic = Math.max(ic, top[1]); id = Math.min(id, bottom[1]);
    for (const [x, y] of [left, right, top, bottom]) { oa = Math.min(oa, x); ob = Math.max(ob, x); oc = Math.min(oc, y); od = Math.max(od, y); }
  }
  const sx = DISTORTED_SLACK * (ob - oa), sy = DISTORTED_SLACK * (od - oc);
  let inner: NormalisedRect | null = [ia + sx, ib - sx, ic + sy, id - sy];
  const outer: NormalisedRect | null = [oa - sx, ob + sx, oc - sy, od + sy];
  const inImage = (u: number, v: number) => u >= u0 && u <= u1 && v >= v0 && v <= v1;
  // the inner rectangle, its edges and a lattice of its inside, must land in the image
  if (!(inner[0] < inner[1] && inner[2] < inner[3])) inner = null;
  else {
    const [a, b, c, e] = inner;
    for (let k = 0; k <= EDGE_SAMPLES && inner; k++) {
      for (let l = 0; l <= EDGE_SAMPLES; l += k === 0 || k === EDGE_SAMPLES ? 1 : EDGE_SAMPLES / 8) {
        const [u, v] = toPixel(m, a + ((b - a) * k) / EDGE_SAMPLES, c + ((e - c) * l) / EDGE_SAMPLES);
        if (!inImage(u, v)) { inner = null; break; }
      }
    }
    for (let l = 0; l <= EDGE_SAMPLES && inner; l++) {
      for (const k of [0, EDGE_SAMPLES]) {
        const [u, v] = toPixel(m, a + ((b - a) * k) / EDGE_SAMPLES, c + ((e - c) * l) / EDGE_SAMPLES);
        if (!inImage(u, v)) { inner = null; break; }
      }
    }
  }
  // the outer rectangle's edge and rings out to three times its size must land outside the image (distortion that
  // folds far points back into the frame fails here, and then nothing is decided as outside); farther points are
  // never candidates: the coverage pass meets only cells in a photo's ground box, cast from the frame's edge rays
  const [a, b, c, e] = outer;
  for (const grow of [1, 1.25, 1.5, 2, 2.5, 3]) {
    const ca = (a + b) / 2, cc = (c + e) / 2, ha = ((b - a) / 2) * grow, hc = ((e - c) / 2) * grow;
    for (let k = 0; k <= EDGE_SAMPLES; k++) {
      const s = -1 + (2 * k) / EDGE_SAMPLES;
      for (const [x, y] of [[ca - ha, cc + s * hc], [ca + ha, cc + s * hc], [ca + s * ha, cc - hc], [ca + s * ha, cc + hc]]) {
        const [u, v] = toPixel(m, x, y);
        if (inImage(u, v)) return { inner, outer: null };
      }
    }
  }
  return { inner, outer };
}

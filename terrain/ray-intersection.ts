/** Advisory point precision from a least-squares intersection of viewing rays (normal equations accumulated view by view). */

/**
 * Add one view to the normal matrix `n` (6 numbers from `at`: N00 N01 N02 N11 N12 N22) of the least-squares
 * intersection of rays: the linearised collinearity equations (image x and y of the point as functions of its
 * ground coordinates, camera pose held fixed) weighted by 1 / σ² with σ the image measurement error in pixels.
 * Camera coordinates q = rotᵀ (P − O); x = fx · qx / qz, y = fy · qy / qz, so
 * ∂x/∂P = fx · (c0 − (qx/qz) c2) / qz and ∂y/∂P = fy · (c1 − (qy/qz) c2) / qz, with c0, c1, c2 the columns of rot
 * (the usual space-intersection adjustment, e.g. Kraus, Photogrammetry vol. 1, ch. 4 / Wolf, Dewitt & Wilkinson,
 * Elements of Photogrammetry, ch. 11, from memory). Distortion's share of the derivatives is left out (a few per cent).
 */
export function addView(
  n: Float64Array, at: number, rot: Float64Array, fxPx: number, fyPx: number, dx: number, dy: number, dz: number, sigmaPx: number,
): void {
  const qx = rot[0] * dx + rot[3] * dy + rot[6] * dz;
  const qy = rot[1] * dx + rot[4] * dy + rot[7] * dz;
  const qz = rot[2] * dx + rot[5] * dy + rot[8] * dz;
  const xn = qx / qz, yn = qy / qz;
  const sx = fxPx / (qz * sigmaPx), sy = fyPx / (qz * sigmaPx);
  const ax = (rot[0] - xn * rot[2]) * sx, ay = (rot[3] - xn * rot[5]) * sx, az = (rot[6] - xn * rot[8]) * sx;
  const bx = (rot[1] - yn * rot[2]) * sy, by = (rot[4] - yn * rot[5]) * sy, bz = (rot[7] - yn * rot[8]) * sy;
  n[at] += ax * ax + bx * bx;
  n[at + 1] += ax * ay + bx * by;
  n[at + 2] += ax * az + bx * bz;
  n[at + 3] += ay * ay + by * by;
  n[at + 4] += ay * az + by * bz;
  n[at + 5] += az * az + bz * bz;
}

/**
 * Standard deviations from the normal matrix (inverse = covariance): [horizontal, vertical] in metres, the
 * horizontal one the root mean square of east and north (√((σE² + σN²) / 2)); NaN when the rays do not fix the
 * point (fewer than two views, or rays all but parallel).
 */
export function sigmaFromNormal(n: Float64Array, at: number, out: Float64Array): void {
  const a = n[at], b = n[at + 1], c = n[at + 2], d = n[at + 3], e = n[at + 4], f = n[at + 5];
  // cofactors of the symmetric matrix [[a b c] [b d e] [c e f]]
  const A = d * f - e * e, B = c * e - b * f, C = b * e - c * d;
  const det = a * A + b * B + c * C;
  const scale = a + d + f;
  if (!(det > 1e-12 * scale * scale * scale)) { out[0] = NaN; out[1] = NaN; return; }
  const qE = A / det, qN = (a * f - c * c) / det, qU = (a * d - b * b) / det;
  out[0] = Math.sqrt((qE + qN) / 2);
  out[1] = Math.sqrt(qU);
}

/** GSD of one view at a ground point from the slant range, the angle off the camera axis and the incidence on the sloping ground. */

/**
 * Ground distance (cm) covered by one pixel step along the image axis `e` (unit vector, local frame) for the
 * ray from the camera to a ground point:
 *
 *   GSD_e = (R · cos α / f_px) · | e − r̂ (n·e) / (n·r̂) |
 *
 * R the slant range, r̂ the unit ray from the camera to the point, α the angle between r̂ and the optical axis,
 * f_px the focal length in pixels along e, n the unit normal of the ground there. R·cos α / f_px is the length one
 * pixel spans on the plane through the point parallel to the image plane (the point lies R·cos α in front of the
 * camera along its axis: the scale relation f / H of a vertical photo with H replaced by that depth; Wolf, Dewitt
 * & Wilkinson, Elements of Photogrammetry, 4th ed., ch. 6, from memory), and the vector factor carries that step
 * along the ray onto the tangent plane of the ground (the ground-plane mapping induced by a plane, Hartley &
 * Zisserman, Multiple View Geometry in Computer Vision, 2nd ed. 2003, §13.1, from memory). Two cases show what it
 * contains: a vertical photo over level ground gives H · p / f at every pixel (n·e = 0: a vertical photo of flat
 * ground has one scale); on the optical axis (α = 0) it gives (R · p / f) / cos β along the direction of the
 * slope, β the incidence angle between the ray and the ground normal, as the ground-plane GSD of oblique imagery
 * (GSD / sin of the elevation angle; Leachtenauer et al., "General Image-Quality Equation: GIQE", Applied Optics
 * 36(32), 1997, from memory). Lens distortion changes the local scale by a few per cent at most and is left out.
 */
function axisGsdCm(
  slantM: number, cosOffAxis: number, focalPx: number,
  ex: number, ey: number, ez: number, rx: number, ry: number, rz: number, nx: number, ny: number, nz: number,
): number {
  const ne = nx * ex + ny * ey + nz * ez;
  const nr = nx * rx + ny * ry + nz * rz;
  const k = ne / nr;
  const gx = ex - rx * k, gy = ey - ry * k, gz = ez - rz * k;
  return ((slantM * cosOffAxis) / focalPx) * Math.sqrt(gx * gx + gy * gy + gz * gz) * 100;
}

/**
 * The coarser of the two pixel sides' ground lengths (cm) for a view: camera-to-local rotation `rot` (columns:
 * image x, image y, optical axis), focal lengths in pixels, unit ray (rx, ry, rz) from the camera to the point at
 * slant range `slantM`, ground normal (nx, ny, nz). See `axisGsdCm` for the formula and its sources.
 */
export function viewGsdCm(
  rot: Float64Array, fxPx: number, fyPx: number, slantM: number, rx: number, ry: number, rz: number, nx: number, ny: number, nz: number,
): number {
  const cosOff = rx * rot[2] + ry * rot[5] + rz * rot[8];
  const gx = axisGsdCm(slantM, cosOff, fxPx, rot[0], rot[3], rot[6], rx, ry, rz, nx, ny, nz);
  const gy = axisGsdCm(slantM, cosOff, fyPx, rot[1], rot[4], rot[7], rx, ry, rz, nx, ny, nz);
  return gx > gy ? gx : gy;
}

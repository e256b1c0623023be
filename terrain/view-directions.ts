/**
 * Views from all round: the widest gap between the compass directions a ground point is seen from obliquely. A
 * facade, a stockpile flank or a kerb is only modelled in 3D when the point is seen from several sides at a slant;
 * nadir photos from one set of lines see it mostly from the two sides across the lines. The measure is the widest
 * angle, going round the compass, between consecutive directions of the views at least `obliqueDeg` from the
 * vertical: 90° when the point is seen from four sides a quarter turn apart, 180° from two opposite sides, 360° when
 * fewer than two such views exist. It does not depend on how the lines are headed.
 */

const TWO_PI = 2 * Math.PI;

/**
 * The widest gap (degrees) between the azimuths of the oblique rays among `count` unit rays (x east, y north, z up,
 * from the ground point to each camera, three numbers each). `cosOblique` is cos of the least angle from the
 * vertical that counts as oblique; `scratch` holds at least `count` numbers.
 */
export function directionGapDeg(rays: Float64Array, count: number, cosOblique: number, scratch: Float64Array): number {
  let m = 0;
  for (let v = 0; v < count; v++) {
    // the ray's z is the cosine of its angle from the vertical
    if (rays[v * 3 + 2] > cosOblique) continue;
    scratch[m++] = Math.atan2(rays[v * 3], rays[v * 3 + 1]);
  }
  if (m < 2) return 360;
  const s = scratch.subarray(0, m).sort();
  let gap = s[0] + TWO_PI - s[m - 1];
  for (let k = 1; k < m; k++) if (s[k] - s[k - 1] > gap) gap = s[k] - s[k - 1];
  return (gap * 180) / Math.PI;
}

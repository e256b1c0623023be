/** Survey outlines for tests of large areas: a wavy star of any corner count, and the same with one crossing. */

/**
 * A wavy star outline of `corners` corners around (lon, lat): non-convex (seven lobes), no crossing. Corner k sits
 * at angle 2πk/n and a radius that swings between 0.6 and 1.4 times `radiusDeg`. The default centre and radius
 * keep it on the demo grid (lon 4.4668-4.4960, lat 46.7638-46.7803).
 */
export function wavyRing(corners: number, lon = 4.481, lat = 46.772, radiusDeg = 0.005): number[][] {
  const ring: number[][] = [];
  for (let k = 0; k < corners; k++) {
    const t = (2 * Math.PI * k) / corners;
    const r = radiusDeg * (1 + 0.4 * Math.sin(7 * t));
    ring.push([lon + r * Math.cos(t), lat + r * Math.sin(t)]);
  }
  ring.push([...ring[0]]);
  return ring;
}

/** The same ring with corners i and i + 1 swapped: the edges into and out of the pair now cross. */
export function withSwappedCorners(ring: number[][], i: number): number[][] {
  const out = ring.map((p) => [...p]);
  [out[i], out[i + 1]] = [out[i + 1], out[i]];
  out[out.length - 1] = [...out[0]];
  return out;
}

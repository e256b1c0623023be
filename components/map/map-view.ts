/** Pan and zoom of a map: the shown part of the image, [x0, y0, x1, y1] in image pixels, kept inside the full view. */

export type View = readonly [number, number, number, number];

/** The closest a map zooms in: this many times the full view. */
export const MAX_ZOOM = 16;

/** Zoom factor of `v` against the full view `full` (1 = all of it). */
export function zoomOf(v: View, full: View): number {
  return (full[2] - full[0]) / (v[2] - v[0]);
}

/** `v` moved (not resized) so it lies inside `full`. */
function clampInside(v: View, full: View): View {
  const w = v[2] - v[0];
  const h = v[3] - v[1];
  const x0 = Math.min(Math.max(v[0], full[0]), full[2] - w);
  const y0 = Math.min(Math.max(v[1], full[1]), full[3] - h);
  return [x0, y0, x0 + w, y0 + h];
}

/**
 * The view zoomed by `factor` (> 1 in, < 1 out) about `anchor` (image pixels; it stays at the same place on
 * screen), between the full view and MAX_ZOOM times it. Throws on a factor that is not a positive number.
 */
export function zoomView(v: View, full: View, factor: number, anchor?: readonly [number, number]): View {
  if (!(Number.isFinite(factor) && factor > 0)) throw new RangeError(`zoom factor must be a positive number, got ${factor}.`);
  const z = Math.min(MAX_ZOOM, Math.max(1, zoomOf(v, full) * factor));
  const w = (full[2] - full[0]) / z;
  const h = (full[3] - full[1]) / z;
  const [ax, ay] = anchor ?? [(v[0] + v[2]) / 2, (v[1] + v[3]) / 2];
  // the anchor keeps its share of the way across the view
  const fx = (ax - v[0]) / (v[2] - v[0]);
  const fy = (ay - v[1]) / (v[3] - v[1]);
  return clampInside([ax - fx * w, ay - fy * h, ax - fx * w + w, ay - fy * h + h], full);
}

/** The view moved by (dx, dy) image pixels, kept inside the full view. */
export function panView(v: View, full: View, dxPx: number, dyPx: number): View {
  return clampInside([v[0] + dxPx, v[1] + dyPx, v[2] + dxPx, v[3] + dyPx], full);
}

/**
 * Moving the area's corners without a pointer: choose a corner with "previous" and "next", then move it one step
 * at a time. A step is one pixel of the hillshade (about one grid cell), in the image's own directions — up is
 * the top of the map (grid north; the map's north arrow shows true north) — so a keyboard user reaches every
 * place a finger could.
 */
import type { ImageGeoref } from './image-georef';

type LonLat = readonly [number, number];
export type NudgeDirection = 'up' | 'down' | 'left' | 'right';

/** Image pixels per step in each direction (x right, y down, as the image's pixels run). */
const steps: Record<NudgeDirection, readonly [number, number]> = { up: [0, -1], down: [0, 1], left: [-1, 0], right: [1, 0] };

/** The corner chosen after a "next" (+1) or "previous" (-1) press: round the ring; from none, the first or the last. */
export function nextCorner(current: number | null, count: number, delta: 1 | -1): number | null {
  if (!(count > 0)) return null;
  if (current === null || current < 0 || current >= count) return delta > 0 ? 0 : count - 1;
  return (current + delta + count) % count;
}

/** `corner` moved `pixels` image pixels (default one) in `direction`, as longitude and latitude. */
export function nudgedCorner(georef: ImageGeoref, corner: LonLat, direction: NudgeDirection, pixels = 1): [number, number] {
  if (!(Number.isFinite(pixels) && pixels > 0)) throw new RangeError(`a step must be a positive number of pixels, got ${pixels}.`);
  const [x, y] = georef.toPixel(corner[0], corner[1]);
  const [dx, dy] = steps[direction];
  return georef.toLonLat(x + dx * pixels, y + dy * pixels);
}

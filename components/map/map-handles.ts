/**
 * What a press on the area editor's map grabs: a corner of the area or the takeoff point, by screen distance;
 * and where a marker's label goes so it hides no other marker.
 */

type ScreenPoint = readonly [number, number];

type Handle = { kind: 'corner'; index: number } | { kind: 'takeoff' };

/**
 * The handle under a press at `at`: the nearest corner within `reachPx` (screen pixels) wins over the takeoff
 * point, so a corner under or beside the takeoff marker can always be moved (the takeoff point also moves by a
 * tap with the takeoff tool); else the takeoff point within reach; else null.
 */
export function pickHandle(at: ScreenPoint, corners: readonly ScreenPoint[], takeoff: ScreenPoint | null, reachPx: number): Handle | null {
  if (!(reachPx > 0)) throw new RangeError(`reach must be a positive number of pixels, got ${reachPx}.`);
  let best = -1;
  let bestD = Infinity;
  corners.forEach((c, i) => {
    const d = Math.hypot(c[0] - at[0], c[1] - at[1]);
    if (d <= reachPx && d < bestD) {
      best = i;
      bestD = d;
    }
  });
  if (best >= 0) return { kind: 'corner', index: best };
  if (takeoff && Math.hypot(takeoff[0] - at[0], takeoff[1] - at[1]) <= reachPx) return { kind: 'takeoff' };
  return null;
}

/** Where a label sits against its marker: its text anchor and the offset of its baseline start, in marker radii. */
interface LabelPlace {
  anchor: 'start' | 'end';
  dx: number;
  dy: number;
}

const places: LabelPlace[] = [
  { anchor: 'start', dx: 1.3, dy: -1.3 }, // upper right (the usual place)
  { anchor: 'end', dx: -1.3, dy: -1.3 }, // upper left
  { anchor: 'start', dx: 1.3, dy: 2.4 }, // lower right
  { anchor: 'end', dx: -1.3, dy: 2.4 }, // lower left
];

/**
 * The first of upper right, upper left, lower right, lower left whose label box (`widthPx` x `heightPx`, screen
 * pixels) keeps clear of every other marker by `clearPx` and, given `bounds` (the map's width and height on
 * screen, the marker in the same coordinates), stays on the map; when none does, the one farthest from the
 * nearest marker among those on the map (else among all).
 */
export function placeLabel(at: ScreenPoint, radiusPx: number, widthPx: number, heightPx: number, others: readonly ScreenPoint[], clearPx: number, bounds?: readonly [number, number]): LabelPlace {
  let best = places[0];
  let bestGap = -Infinity;
  for (const p of places) {
    const x0 = p.anchor === 'start' ? at[0] + p.dx * radiusPx : at[0] + p.dx * radiusPx - widthPx;
    const yBase = at[1] + p.dy * radiusPx;
    const box = [x0, yBase - heightPx, x0 + widthPx, yBase] as const;
    // distance from each other marker to the box (0 inside it)
    let gap = Infinity;
    for (const o of others) {
      const dx = Math.max(box[0] - o[0], 0, o[0] - box[2]);
      const dy = Math.max(box[1] - o[1], 0, o[1] - box[3]);
      gap = Math.min(gap, Math.hypot(dx, dy));
    }
    const onMap = !bounds || (box[0] >= 0 && box[1] >= 0 && box[2] <= bounds[0] && box[3] <= bounds[1]);
    if (gap >= clearPx && onMap) return p;
    if (!onMap) gap -= 1e9; // off the map is worse than close to a marker
    if (gap > bestGap) {
      best = p;
      bestGap = gap;
    }
  }
  return best;
}

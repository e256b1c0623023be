/**
 * Client-side checks of a survey area before it is sent, over the hillshade the planner draws on. The rules and
 * their wording are terrain/survey-area.ts (the same the server applies); this file gives them the hillshade's
 * outline on the ground, and checks the takeoff point.
 */
import type { Polygon } from 'geojson';
import { drawnAreaProblem, openRing, type AreaProblem, type LonLat } from '../../terrain/survey-area';
import { onImage, type ImageGeoref } from './image-georef';

export { openRing, type AreaProblem, type LonLat };

/** Points per side of the hillshade's outline: a projected grid's rectangle is curved in lon/lat. */
const OUTLINE_STEPS = 32;

function fmt([lon, lat]: readonly [number, number]): string {
  return `${Math.abs(lat).toFixed(5)}° ${lat >= 0 ? 'N' : 'S'}, ${Math.abs(lon).toFixed(5)}° ${lon >= 0 ? 'E' : 'W'}`;
}

/** The GeoJSON polygon of an open ring of corners (closed by repeating the first corner). */
export function ringToPolygon(ring: readonly LonLat[]): Polygon {
  const open = openRing(ring);
  return { type: 'Polygon', coordinates: [[...open.map((p) => [p[0], p[1]]), [open[0][0], open[0][1]]]] };
}

/** The image's edge on the ground: a closed lon/lat ring, each side followed point by point. */
function imageOutline(g: ImageGeoref): LonLat[] {
  const w = g.widthPx, h = g.heightPx;
  const corners: Array<[number, number]> = [[0, 0], [w, 0], [w, h], [0, h], [0, 0]];
  const ring: LonLat[] = [];
  for (let c = 0; c < 4; c++) {
    const [ax, ay] = corners[c], [bx, by] = corners[c + 1];
    for (let k = 0; k < OUTLINE_STEPS; k++) {
      const f = k / OUTLINE_STEPS;
      ring.push(g.toLonLat(ax + f * (bx - ax), ay + f * (by - ay)));
    }
  }
  ring.push(ring[0]);
  return ring;
}

/**
 * The first problem of a survey area drawn or imported over a grid, or null when it may be sent. The server
 * checks again with the grid itself (nodata holes, the exact outline); this catches the common mistakes at once.
 */
export function checkArea(ring: readonly LonLat[], georef: ImageGeoref): AreaProblem | null {
  return drawnAreaProblem(ring, imageOutline(georef));
}

/** Whether the takeoff point lies on the grid, with a message when it does not. */
export function checkTakeoff(p: LonLat | null, georef: ImageGeoref): string | null {
  if (!p) return 'Tap the hillshade to set the takeoff point.';
  if (!onImage(georef, georef.toPixel(p[0], p[1]))) return `The takeoff point (${fmt(p)}) is off the elevation grid. Set it on the hillshade.`;
  return null;
}

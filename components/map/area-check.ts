/** Client-side checks of a survey area before it is sent: enough corners, inside the grid, not crossing itself. */
import type { Polygon } from 'geojson';
import { findRingCrossing } from '../../terrain/ring-crossings';
import { onImage, type ImageGeoref } from './image-georef';

/** A longitude/latitude pair in degrees (WGS 84). */
export type LonLat = [number, number];

export type AreaProblemCode = 'too-few-corners' | 'outside-grid' | 'crosses-itself' | 'no-area';

/** Why an area is refused, in words the planner can act on. */
export interface AreaProblem {
  code: AreaProblemCode;
  message: string;
}

/** Points checked along each edge between corners: a projected grid's rectangle is slightly curved in lon/lat. */
const edgeProbes = 8;

function fmt([lon, lat]: readonly [number, number]): string {
  return `${Math.abs(lat).toFixed(5)}° ${lat >= 0 ? 'N' : 'S'}, ${Math.abs(lon).toFixed(5)}° ${lon >= 0 ? 'E' : 'W'}`;
}

/** Drops a closing corner that repeats the first one, and corners that repeat the one before them. */
export function openRing(ring: readonly LonLat[]): LonLat[] {
  const out: LonLat[] = [];
  for (const p of ring) {
    const last = out[out.length - 1];
    if (!last || last[0] !== p[0] || last[1] !== p[1]) out.push([p[0], p[1]]);
  }
  if (out.length > 1 && out[0][0] === out[out.length - 1][0] && out[0][1] === out[out.length - 1][1]) out.pop();
  return out;
}

/** The GeoJSON polygon of an open ring of corners (closed by repeating the first corner). */
export function ringToPolygon(ring: readonly LonLat[]): Polygon {
  const open = openRing(ring);
  return { type: 'Polygon', coordinates: [[...open.map((p) => [p[0], p[1]]), [open[0][0], open[0][1]]]] };
}

/**
 * The first problem of a survey area drawn or imported over a grid, or null when it may be sent. The server
 * checks again with the grid itself (nodata holes, the exact outline); this catches the common mistakes at once.
 */
export function checkArea(ring: readonly LonLat[], georef: ImageGeoref): AreaProblem | null {
  const corners = openRing(ring);
  if (corners.length < 3) {
    return { code: 'too-few-corners', message: `An area needs at least 3 corners; it has ${corners.length}. Tap more points on the hillshade.` };
  }
  // Corners first (the clearest message), then points along each edge.
  for (let i = 0; i < corners.length; i++) {
    if (!onImage(georef, georef.toPixel(corners[i][0], corners[i][1]))) {
      return { code: 'outside-grid', message: `Corner ${i + 1} (${fmt(corners[i])}) is off the elevation grid. Keep the whole area on the hillshade.` };
    }
  }
  for (let i = 0; i < corners.length; i++) {
    const a = corners[i];
    const b = corners[(i + 1) % corners.length];
    for (let k = 1; k < edgeProbes; k++) {
      const f = k / edgeProbes;
      if (!onImage(georef, georef.toPixel(a[0] + (b[0] - a[0]) * f, a[1] + (b[1] - a[1]) * f))) {
        const next = ((i + 1) % corners.length) + 1;
        return { code: 'outside-grid', message: `The edge from corner ${i + 1} to corner ${next} leaves the elevation grid. Keep the whole area on the hillshade.` };
      }
    }
  }
  const crossing = findRingCrossing(ringToPolygon(corners).coordinates);
  if (crossing) {
    const at = crossing.at;
    return { code: 'crosses-itself', message: `The area's outline crosses itself near ${fmt(at)}. Move or remove corners so that no two edges cross.` };
  }
  // Shoelace area in image pixels: a zero area means every corner lies on one line.
  let twiceArea = 0;
  const px = corners.map((p) => georef.toPixel(p[0], p[1]));
  for (let i = 0; i < px.length; i++) {
    const [x0, y0] = px[i];
    const [x1, y1] = px[(i + 1) % px.length];
    twiceArea += x0 * y1 - x1 * y0;
  }
  if (Math.abs(twiceArea) < 1) {
    return { code: 'no-area', message: 'The corners lie on one line, so the area covers no ground. Spread the corners out.' };
  }
  return null;
}

/** Whether the takeoff point lies on the grid, with a message when it does not. */
export function checkTakeoff(p: LonLat | null, georef: ImageGeoref): string | null {
  if (!p) return 'Tap the hillshade to set the takeoff point.';
  if (!onImage(georef, georef.toPixel(p[0], p[1]))) return `The takeoff point (${fmt(p)}) is off the elevation grid. Set it on the hillshade.`;
  return null;
}

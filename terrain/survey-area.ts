/**
 * The survey area's rules and their wording, in one place. Three callers check an area, each with the input it has:
 * - the plan form while drawing or importing (an open list of corners, and the hillshade's outline on the ground),
 * - the mission contract, the server and the command line (a GeoJSON Polygon in WGS 84 longitude/latitude),
 * - the server against the site's grid (the grid's outline in longitude/latitude).
 * The rules are the same for all: at least 3 corners, at most MAX_AREA_CORNERS, closed rings of valid positions,
 * no two edges crossing, some ground enclosed and at most MAX_AREA_KM2 of it, and (where the grid is known) every
 * corner on the grid with no edge leaving it. Only the wording follows the input: a drawing names corners from 1
 * and says what to do on the hillshade; a GeoJSON polygon names rings and positions as they are written.
 */
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { findRingCrossing } from './ring-crossings';

/** A GeoJSON Polygon in WGS 84 longitude/latitude (outer ring first, then holes; rings closed). */
export interface AreaPolygon {
  type: 'Polygon';
  coordinates: number[][][];
}

/** A longitude/latitude pair in degrees (WGS 84). */
export type LonLat = [number, number];

/**
 * Most corners a survey area may have, over all its rings (closing positions not counted). Drawn and imported
 * survey outlines have tens to hundreds of corners; 2,000 leaves room for a traced boundary while keeping every
 * geometry check of a plan within milliseconds.
 */
export const MAX_AREA_CORNERS = 2000;
/** Largest survey area accepted, km² (bigger areas should be split into several plans). */
const MAX_AREA_KM2 = 100;
/** Smallest ground an area must enclose, m²: below it the corners lie on one line. */
const MIN_AREA_M2 = 1;
/** Latitudes a plan may reach (the UTM zones' range, in which the lines are laid out). */
const LAT_MIN = -80;
const LAT_MAX = 84;

type AreaProblemCode = 'not-polygon' | 'too-few-corners' | 'bad-position' | 'not-closed' | 'too-many-corners' | 'crosses-itself' | 'no-area' | 'too-large' | 'outside-grid';

/** Why an area is refused, in words the planner can act on. */
export interface AreaProblem {
  code: AreaProblemCode;
  message: string;
}

/** How the area was given, which decides how a problem names its place. */
type Form = 'drawn' | 'geojson';

/** 12345 -> "12,345" (toLocaleString loads ICU data on first use: a tenth of a second on a busy server). */
function thousands(n: number): string {
  return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

/** "45.00500° N, 10.00500° E": a place as a person reads it. */
function degrees([lon, lat]: readonly number[]): string {
  return `${Math.abs(lat).toFixed(5)}° ${lat >= 0 ? 'N' : 'S'}, ${Math.abs(lon).toFixed(5)}° ${lon >= 0 ? 'E' : 'W'}`;
}

/** The message for an area with more than MAX_AREA_CORNERS corners (drawn or written alike). */
function tooManyCornersMessage(corners: number): string {
  return `The survey area has ${thousands(corners)} corners; the limit is ${thousands(MAX_AREA_CORNERS)}. Simplify the outline (for example with a tolerance of a metre) or split it into several plans.`;
}

const problem = (code: AreaProblemCode, message: string): AreaProblem => ({ code, message });

/**
 * What is wrong with the rings of a Polygon (rings of at least 4 [lon, lat] positions; with `ranges`, longitudes
 * in -180..180 and latitudes in the UTM range), or null. One plain loop: zod's nested arrays cost about 35 µs per
 * position, which made a 10,000-corner outline hold the server for a quarter of a second before any limit applied.
 */
export function areaRingsProblem(v: unknown, ranges = true): AreaProblem | null {
  if (!Array.isArray(v) || v.length === 0) return problem('not-polygon', 'area.coordinates must be a list of rings, the outer ring first.');
  for (let r = 0; r < v.length; r++) {
    const ring: unknown = v[r];
    if (!Array.isArray(ring) || ring.length < 4) {
      return problem('too-few-corners', `area ring ${r} needs at least 4 positions (3 corners and the closing one), got ${Array.isArray(ring) ? ring.length : typeof ring}.`);
    }
    for (let i = 0; i < ring.length; i++) {
      const p: unknown = ring[i];
      // the message is built only on failure: building it per position cost more than the whole crossing check
      const ok = Array.isArray(p) && p.length >= 2 && typeof p[0] === 'number' && typeof p[1] === 'number' && Number.isFinite(p[0]) && Number.isFinite(p[1]) &&
        (!ranges || (Math.abs(p[0]) <= 180 && p[1] > LAT_MIN && p[1] < LAT_MAX));
      if (!ok) return problem('bad-position', `area ring ${r} position ${i} must be [lon, lat] with lon in -180..180 and lat in ${LAT_MIN}..${LAT_MAX} (UTM range), got ${JSON.stringify(p)}.`);
    }
  }
  return null;
}

/** Spherical polygon ring area in m² (Chamberlain & Duquette, "Some algorithms for polygons on a sphere", JPL 2007). */
export function ringAreaM2(ring: readonly (readonly number[])[]): number {
  const R = 6371008.8;
  let s = 0;
  for (let i = 0; i + 1 < ring.length; i++) {
    const [l1, p1] = ring[i], [l2, p2] = ring[i + 1];
    s += ((l2 - l1) * Math.PI / 180) * (2 + Math.sin((p1 * Math.PI) / 180) + Math.sin((p2 * Math.PI) / 180));
  }
  return Math.abs((s * R * R) / 2);
}

/**
 * Area of a closed ring in m² on a local plane (longitude scaled by the cosine of the mean latitude). Used for the
 * "encloses no ground" rule: corners on one straight line give zero here, where the spherical formula above leaves
 * a spurious area that grows with the cube of the line's length (about 75 m² for a 1 km line at 45°).
 */
function planarRingAreaM2(ring: readonly (readonly number[])[]): number {
  const R = 6371008.8;
  const k = Math.PI / 180;
  let lat0 = 0;
  for (const p of ring) lat0 += p[1];
  lat0 /= ring.length;
  const sx = R * k * Math.cos(lat0 * k), sy = R * k;
  const [ox, oy] = ring[0];
  let twice = 0;
  for (let i = 0; i + 1 < ring.length; i++) {
    const x0 = (ring[i][0] - ox) * sx, y0 = (ring[i][1] - oy) * sy;
    const x1 = (ring[i + 1][0] - ox) * sx, y1 = (ring[i + 1][1] - oy) * sy;
    twice += x0 * y1 - x1 * y0;
  }
  return Math.abs(twice) / 2;
}

/** The rules every area meets, whatever its form, on closed rings already known to hold valid positions. */
function geometryProblem(rings: readonly (readonly number[])[][], form: Form): AreaProblem | null {
  const corners = rings.reduce((n, ring) => n + Math.max(0, ring.length - 1), 0);
  // count the corners before the geometry checks: an oversized outline is refused at the cost of one loop
  if (corners > MAX_AREA_CORNERS) return problem('too-many-corners', tooManyCornersMessage(corners));
  const x = findRingCrossing(rings);
  if (x) {
    if (form === 'drawn') return problem('crosses-itself', `The area's outline crosses itself near ${degrees(x.at)}. Move or remove corners so that no two edges cross.`);
    const near = `near lon ${x.at[0].toFixed(5)}, lat ${x.at[1].toFixed(5)}`;
    return problem('crosses-itself', x.ringA === x.ringB
      ? `area ring ${x.ringA} crosses itself (edges ${x.edgeA} and ${x.edgeB}, ${near}); draw the polygon without crossings.`
      : `area ring ${x.ringA} crosses ring ${x.ringB} (edge ${x.edgeA} and edge ${x.edgeB}, ${near}); draw the rings without crossings.`);
  }
  if (planarRingAreaM2(rings[0]) < MIN_AREA_M2) {
    return problem('no-area', form === 'drawn' ? 'The corners lie on one line, so the area covers no ground. Spread the corners out.' : 'area encloses no ground (all corners on one line).');
  }
  const km2 = ringAreaM2(rings[0]) / 1e6;
  if (km2 > MAX_AREA_KM2) {
    return problem('too-large', `${form === 'drawn' ? 'The area' : 'area'} is ${km2.toFixed(1)} km², more than the ${MAX_AREA_KM2} km² one plan takes; split it into several plans.`);
  }
  return null;
}

/** The first problem of a survey area given as a GeoJSON Polygon in WGS 84, or null when it may be planned. */
export function surveyAreaProblem(area: unknown): AreaProblem | null {
  const a = area as AreaPolygon;
  if (!(a !== null && typeof a === 'object' && a.type === 'Polygon' && Array.isArray(a.coordinates) && a.coordinates.length > 0)) {
    return problem('not-polygon', `area must be a GeoJSON Polygon ({ "type": "Polygon", "coordinates": [[[lon, lat], …]] }), got ${JSON.stringify(area)?.slice(0, 80)}.`);
  }
  const shape = areaRingsProblem(a.coordinates);
  if (shape) return shape;
  for (let r = 0; r < a.coordinates.length; r++) {
    const ring = a.coordinates[r];
    const f = ring[0], l = ring[ring.length - 1];
    if (f[0] !== l[0] || f[1] !== l[1]) return problem('not-closed', `area ring ${r} must be closed: its last position must repeat the first ${JSON.stringify(f)}, got ${JSON.stringify(l)}.`);
  }
  return geometryProblem(a.coordinates, 'geojson');
}

/** Drops a closing corner that repeats the first one, and corners that repeat the one before them. */
export function openRing(ring: readonly (readonly number[])[]): LonLat[] {
  const out: LonLat[] = [];
  for (const p of ring) {
    const last = out[out.length - 1];
    if (!last || last[0] !== p[0] || last[1] !== p[1]) out.push([p[0], p[1]]);
  }
  if (out.length > 1 && out[0][0] === out[out.length - 1][0] && out[0][1] === out[out.length - 1][1]) out.pop();
  return out;
}

/** Indexes of the outer ring's corners outside a closed grid outline (a corner on the outline counts as inside). */
function cornersOffGrid(ring: readonly (readonly number[])[], outline: readonly (readonly number[])[]): number[] {
  const poly = { type: 'Polygon' as const, coordinates: [outline.map((p) => [p[0], p[1]])] };
  const out: number[] = [];
  for (let i = 0; i + 1 < ring.length; i++) if (!booleanPointInPolygon([ring[i][0], ring[i][1]], poly)) out.push(i);
  return out;
}

/**
 * Index of an area edge (edge k runs from corner k to k + 1 of its ring) that crosses the grid outline, or null.
 * The area must not cross itself (checked before), so any crossing found involves the outline. With every corner
 * inside, this is what "inside" still needs; Turf's booleanWithin took 0.7 s for a 2,000-corner area, this takes
 * milliseconds.
 */
function edgeLeavingGrid(rings: readonly (readonly number[])[][], outline: readonly (readonly number[])[]): number | null {
  const x = findRingCrossing([outline, ...rings]);
  return x ? (x.ringA === 0 ? x.edgeB : x.edgeA) : null;
}

/**
 * The first problem of an area being drawn or imported over a grid: `corners` is the open ring as tapped (or read
 * from a file), `gridOutline` the closed outline of the grid's hillshade in longitude/latitude. Null when it may
 * be sent; the server checks again with the grid itself.
 */
export function drawnAreaProblem(corners: readonly LonLat[], gridOutline: readonly LonLat[]): AreaProblem | null {
  const open = openRing(corners);
  if (open.length < 3) return problem('too-few-corners', `An area needs at least 3 corners; it has ${open.length}. Tap more points on the hillshade.`);
  const ring = [...open, open[0]];
  for (let i = 0; i < open.length; i++) {
    const [lon, lat] = open[i];
    if (!(Math.abs(lon) <= 180 && lat > LAT_MIN && lat < LAT_MAX)) {
      return problem('bad-position', `Corner ${i + 1} (${degrees(open[i])}) lies beyond ${LAT_MAX}° N or ${-LAT_MIN}° S, where plans are not laid out. Keep the area between those latitudes.`);
    }
  }
  // the corners first (the clearest message), then the shape, then edges that leave the grid between two corners
  if (open.length > MAX_AREA_CORNERS) return problem('too-many-corners', tooManyCornersMessage(open.length));
  const off = cornersOffGrid(ring, gridOutline);
  if (off.length > 0) return problem('outside-grid', `Corner ${off[0] + 1} (${degrees(open[off[0]])}) is off the elevation grid. Keep the whole area on the hillshade.`);
  const geometry = geometryProblem([ring], 'drawn');
  if (geometry) return geometry;
  const edge = edgeLeavingGrid([ring], gridOutline);
  if (edge !== null) {
    return problem('outside-grid', `The edge from corner ${edge + 1} to corner ${((edge + 1) % open.length) + 1} leaves the elevation grid. Keep the whole area on the hillshade.`);
  }
  return null;
}

/**
 * The problem of a checked GeoJSON area over a site's grid (`gridOutline` closed, in longitude/latitude), or null
 * when the whole area lies on it. `siteName` and `extent` say which grid and where it lies.
 */
export function areaOffGridProblem(area: AreaPolygon, gridOutline: readonly (readonly number[])[], siteName: string, extent: string): AreaProblem | null {
  const o = cornersOffGrid(area.coordinates[0], gridOutline);
  if (o.length === 0 && edgeLeavingGrid(area.coordinates, gridOutline) === null) return null;
  const which = o.length ? ` (corner${o.length > 1 ? 's' : ''} ${o.slice(0, 5).map((i) => i + 1).join(', ')}${o.length > 5 ? ', …' : ''})` : '';
  return problem('outside-grid', `The survey area leaves the elevation grid "${siteName}"${which}; keep it inside the grid (${extent}).`);
}

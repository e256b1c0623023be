/**
 * Checks of a plan against its site that the mission schema cannot make alone: the survey area must lie on the
 * elevation grid and the takeoff point must be on the grid. Geometry tests by Turf. (Whether the area crosses
 * itself is the mission schema's check, terrain/ring-crossings.ts, already made when this runs.)
 */
import { booleanPointInPolygon, point, polygon } from '@turf/turf';
import type { Feature, Polygon } from 'geojson';
import type { MissionValues } from '../../contracts/mission';
import { createTransform, crsFromProj4, findRingCrossing, WGS84, type GridMetadata } from '../../terrain/index';

/** One field problem, as the 422 body lists them. */
export interface FieldProblem {
  path: string;
  message: string;
}

/** Points per outline edge: a projected grid's straight edges are curves in longitude/latitude. */
const EDGE_STEPS = 32;

/** The outline of the grid (its CRS bounds) as a WGS 84 polygon, edges followed point by point. */
export function gridOutlineWgs84(meta: Pick<GridMetadata, 'bounds' | 'crs'>): Feature<Polygon> {
  const tr = createTransform(crsFromProj4(meta.crs.proj4, meta.crs.name, meta.crs.epsg), WGS84);
  const [x0, y0, x1, y1] = meta.bounds;
  const corners: Array<[number, number]> = [[x0, y0], [x1, y0], [x1, y1], [x0, y1], [x0, y0]];
  const ring: Array<[number, number]> = [];
  for (let c = 0; c < 4; c++) {
    const [ax, ay] = corners[c];
    const [bx, by] = corners[c + 1];
    for (let k = 0; k < EDGE_STEPS; k++) {
      const f = k / EDGE_STEPS;
      ring.push(tr.forward(ax + f * (bx - ax), ay + f * (by - ay)));
    }
  }
  ring.push(ring[0]);
  return polygon([ring]);
}

const fmt = (v: number) => v.toFixed(5);

/** Problems of `mission` over the grid described by `meta`; empty when the plan fits the site. */
export function checkPlanOverSite(mission: Pick<MissionValues, 'area' | 'takeoff'>, meta: Pick<GridMetadata, 'bounds' | 'crs' | 'boundsWgs84'>, siteName: string): FieldProblem[] {
  const problems: FieldProblem[] = [];
  const outline = gridOutlineWgs84(meta);
  const [w, s, e, n] = meta.boundsWgs84;
  const extent = `lon ${fmt(w)} to ${fmt(e)}, lat ${fmt(s)} to ${fmt(n)}`;
  // Inside = every corner inside the outline and no edge crossing it. The rings do not cross themselves (the
  // mission schema checked that), so any crossing found involves the outline. Turf's booleanWithin took 0.7 s
  // for a 2,000-corner area; this takes milliseconds.
  const outside = mission.area.coordinates[0].slice(0, -1).map((p, i) => ({ p, i })).filter(({ p }) => !booleanPointInPolygon(point(p), outline));
  if (outside.length > 0 || findRingCrossing([outline.geometry.coordinates[0], ...mission.area.coordinates]) !== null) {
    const which = outside.length ? ` (corner${outside.length > 1 ? 's' : ''} ${outside.slice(0, 5).map((o) => o.i + 1).join(', ')}${outside.length > 5 ? ', …' : ''})` : '';
    problems.push({ path: 'input.area', message: `The survey area leaves the elevation grid "${siteName}"${which}; keep it inside the grid (${extent}).` });
  }
  if (!booleanPointInPolygon(point([mission.takeoff.lon, mission.takeoff.lat]), outline)) {
    problems.push({ path: 'input.takeoff', message: `The takeoff point is off the elevation grid "${siteName}"; place it on the grid (${extent}) so altitudes above takeoff can be given.` });
  }
  return problems;
}

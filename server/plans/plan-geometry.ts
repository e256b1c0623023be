/**
 * Checks of a plan against its site that the mission schema cannot make alone: the survey area must lie on the
 * elevation grid (the rule and its wording: terrain/survey-area.ts) and the takeoff point must be on the grid.
 * (Whether the area crosses itself is the mission schema's check, already made when this runs.)
 */
import { booleanPointInPolygon, point, polygon } from '@turf/turf';
import type { Feature, Polygon } from 'geojson';
import type { MissionValues } from '../../contracts/mission';
import { createTransform, crsFromProj4, WGS84, type GridMetadata } from '../../terrain/index';
import { areaOffGridProblem } from '../../terrain/survey-area';

/** One field problem, as the 422 body lists them. */
interface FieldProblem {
  path: string;
  message: string;
}

/** Points per outline edge: a projected grid's straight edges are curves in longitude/latitude. */
const EDGE_STEPS = 32;

/** The outline of the grid (its CRS bounds) as a WGS 84 polygon, edges followed point by point. */
function gridOutlineWgs84(meta: Pick<GridMetadata, 'bounds' | 'crs'>): Feature<Polygon> {
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
  const offGrid = areaOffGridProblem(mission.area, outline.geometry.coordinates[0], siteName, extent);
  if (offGrid) problems.push({ path: 'input.area', message: offGrid.message });
  if (!booleanPointInPolygon(point([mission.takeoff.lon, mission.takeoff.lat]), outline)) {
    problems.push({ path: 'input.takeoff', message: `The takeoff point is off the elevation grid "${siteName}"; place it on the grid (${extent}) so altitudes above takeoff can be given.` });
  }
  return problems;
}

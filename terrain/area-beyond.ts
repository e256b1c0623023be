/**
 * The area grown outward by a distance: where the solver may lay lines when the mission lets it fly beyond the
 * boundary (`solve.beyondEdgeM`), so that ground at the edge is seen from outside as well as from inside.
 */
import { buffer } from '@turf/turf';
import type { AreaPolygon } from './mission';
import { check } from './errors';

export function areaBeyond(area: AreaPolygon, beyondM: number): AreaPolygon {
  if (!(beyondM > 0)) return area;
  // turf buffers on the sphere in the polygon's own longitude/latitude: metres here are ground metres
  const grown = buffer({ type: 'Feature', properties: {}, geometry: area }, beyondM, { units: 'meters', steps: 8 });
  const g = grown?.geometry;
  check(g !== undefined && g.type === 'Polygon', `the area grown by ${beyondM} m is not one polygon: lower solve.beyondEdgeM.`);
  return { type: 'Polygon', coordinates: (g as AreaPolygon).coordinates };
}

/** GeoJSON export (RFC 7946): lines, legs and waypoints; coordinates carry WGS 84 ellipsoidal heights, properties every datum. */
import type { Feature, FeatureCollection, LineString, Point } from 'geojson';
import type { ExportContext } from './export-context';
import { heightsOf } from './datum';
import { heightsNote } from './export-context';

export function toGeoJson(ctx: ExportContext): FeatureCollection & Record<string, unknown> {
  const { datum, waypoints, sheet } = ctx;
  const features: Feature<LineString | Point>[] = [];
  const ellipsoid = (lon: number, lat: number, aboveDatum: number) => heightsOf(datum.kind, lat, lon, aboveDatum).altitudeEllipsoidM;

  for (const line of sheet.lines) {
    const pts = waypoints.filter((w) => w.line === line.number);
    features.push({
      type: 'Feature',
      geometry: { type: 'LineString', coordinates: pts.map((w) => [w.lon, w.lat, w.altitudeEllipsoidM]) },
      properties: { kind: 'line', line: line.number, headingDeg: line.headingDeg, lengthM: line.lengthM, timeS: line.timeS, legCount: line.legs.length, spotPhoto: line.kind === 'spot', cameraTiltDeg: line.cameraTiltDeg ?? 0, verticalDatum: datum.name, cautions: ctx.cautions },
    });
    for (const leg of line.legs) {
      features.push({
        type: 'Feature',
        geometry: {
          type: 'LineString',
          coordinates: [
            [leg.start.lon, leg.start.lat, ellipsoid(leg.start.lon, leg.start.lat, leg.altitudeAboveDatumM.start)],
            [leg.end.lon, leg.end.lat, ellipsoid(leg.end.lon, leg.end.lat, leg.altitudeAboveDatumM.end)],
          ],
        },
        properties: {
          kind: 'leg',
          line: line.number,
          leg: leg.number,
          altitudeAboveTakeoffStartM: leg.altitudeAboveTakeoffM.start,
          altitudeAboveTakeoffEndM: leg.altitudeAboveTakeoffM.end,
          altitudeAboveDatumStartM: leg.altitudeAboveDatumM.start,
          altitudeAboveDatumEndM: leg.altitudeAboveDatumM.end,
          verticalDatum: datum.name,
          aglMinM: leg.aglM.min,
          aglMaxM: leg.aglM.max,
          gsdMinCm: leg.gsdCm.min,
          gsdMaxCm: leg.gsdCm.max,
          headingDeg: leg.headingDeg,
          lengthM: leg.lengthM,
          gradientPct: leg.gradientPct,
        },
      });
    }
  }
  for (const w of waypoints) {
    features.push({ type: 'Feature', geometry: { type: 'Point', coordinates: [w.lon, w.lat, w.altitudeEllipsoidM] }, properties: { kind: 'waypoint', ...w } });
  }
  return {
    type: 'FeatureCollection',
    // Foreign members (RFC 7946 section 6.1): what the file is and how to read its heights.
    name: ctx.title,
    signedOff: ctx.signedOff,
    verticalDatum: datum.name,
    heights: heightsNote(ctx, 'Coordinates carry heights above the WGS 84 ellipsoid (RFC 7946), converted with the EGM96 geoid.'),
    cautions: ctx.cautions,
    generatedAt: ctx.generatedAt,
    features,
  };
}

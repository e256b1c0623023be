/**
 * KML export through tokml: lines and waypoints with absolute altitudes (altitudeMode absolute: metres above mean sea
 * level, which KML 2.2 takes as the EGM96 geoid), the datum and the cautions in the document description.
 */
import type { Feature, FeatureCollection } from 'geojson';
import tokml from 'tokml';
import { fmt } from '../reports/format';
import type { ExportContext } from './export-context';
import { heightsNote } from './export-context';

/** tokml writes no altitudeMode (so viewers would clamp to the ground): add `absolute` to every Point and LineString. */
export function withAbsoluteAltitudes(kml: string): string {
  return kml.replace(/<(Point|LineString)>/g, '<$1><altitudeMode>absolute</altitudeMode>');
}

export function toKml(ctx: ExportContext): string {
  const { waypoints, sheet } = ctx;
  const features: Feature[] = [];
  for (const line of sheet.lines) {
    const pts = waypoints.filter((w) => w.line === line.number);
    features.push({
      type: 'Feature',
      geometry: { type: 'LineString', coordinates: pts.map((w) => [w.lon, w.lat, w.altitudeSeaLevelM]) },
      properties: {
        name: `Line ${line.number}`,
        description: `Line ${line.number}: heading ${fmt.degrees(line.headingDeg)}, ${fmt.metres(line.lengthM)}, ${line.legs.length} leg(s). Altitudes absolute, metres above mean sea level (EGM96).`,
        line: line.number,
      },
    });
  }
  for (const w of waypoints) {
    features.push({
      type: 'Feature',
      geometry: { type: 'Point', coordinates: [w.lon, w.lat, w.altitudeSeaLevelM] },
      properties: {
        name: `L${w.line} W${w.seq}`,
        description: `${fmt.metres(w.altitudeAboveTakeoffM)} above takeoff; ${fmt.metres(w.altitudeAboveDatumM)} above ${w.verticalDatum}; ${fmt.metres(w.altitudeSeaLevelM)} above mean sea level (EGM96).`,
        line: w.line,
        leg: w.leg,
        altitudeAboveTakeoffM: w.altitudeAboveTakeoffM,
        altitudeAboveDatumM: w.altitudeAboveDatumM,
        verticalDatum: w.verticalDatum,
      },
    });
  }
  const fc: FeatureCollection = { type: 'FeatureCollection', features };
  const description = [
    heightsNote(ctx, 'Altitudes are absolute (altitudeMode absolute): metres above mean sea level, the EGM96 geoid.'),
    'Cautions:',
    ...ctx.cautions.map((c) => `- ${c}`),
  ].join('\n');
  return withAbsoluteAltitudes(tokml(fc, { documentName: ctx.title, documentDescription: description, name: 'name', description: 'description' }));
}

/**
 * KML 2.2 export: lines and waypoints with absolute altitudes (altitudeMode absolute: metres above mean sea level,
 * which KML 2.2 takes as the EGM96 geoid), the datum and the cautions in the document description. Written through
 * the XML DOM (./xml), so every name and description is escaped text.
 */
import type { Element } from '@xmldom/xmldom';
import { fmt } from '../../contracts/format/figures';
import type { ExportContext } from './export-context';
import { heightsNote } from './export-context';
import { child, serialize, xmlDocument } from './xml';

const kmlNs = 'http://www.opengis.net/kml/2.2';

const coord = (lon: number, lat: number, alt: number) => `${lon},${lat},${alt}`;

/** A placemark with a name, a description, ExtendedData and one geometry at absolute altitudes. */
function placemark(parent: Element, p: { name: string; description: string; data: Record<string, string | number>; geometry: 'Point' | 'LineString'; coordinates: string }) {
  const pm = child(parent, 'Placemark');
  child(pm, 'name', p.name);
  child(pm, 'description', p.description);
  const ext = child(pm, 'ExtendedData');
  for (const [key, value] of Object.entries(p.data)) {
    const d = child(ext, 'Data');
    d.setAttribute('name', key);
    child(d, 'value', value);
  }
  const g = child(pm, p.geometry);
  child(g, 'altitudeMode', 'absolute');
  child(g, 'coordinates', p.coordinates);
}

export function toKml(ctx: ExportContext): string {
  const { waypoints, sheet } = ctx;
  const doc = xmlDocument(kmlNs, 'kml');
  const folder = child(doc.documentElement!, 'Document');
  child(folder, 'name', ctx.title);
  child(
    folder,
    'description',
    [heightsNote(ctx, 'Altitudes are absolute (altitudeMode absolute): metres above mean sea level, the EGM96 geoid.'), 'Cautions:', ...ctx.cautions.map((c) => `- ${c}`)].join('\n'),
  );
  for (const line of sheet.lines) {
    const pts = waypoints.filter((w) => w.line === line.number);
    placemark(folder, {
      name: `Line ${line.number}`,
      description: `Line ${line.number}: heading ${fmt.degrees(line.headingDeg)}, ${fmt.metres(line.lengthM)}, ${line.legs.length} leg(s). Altitudes absolute, metres above mean sea level (EGM96).`,
      data: { line: line.number },
      geometry: 'LineString',
      coordinates: pts.map((w) => coord(w.lon, w.lat, w.altitudeSeaLevelM)).join(' '),
    });
  }
  for (const w of waypoints) {
    placemark(folder, {
      name: `L${w.line} W${w.seq}`,
      description: `${fmt.metres(w.altitudeAboveTakeoffM)} above takeoff; ${fmt.metres(w.altitudeAboveDatumM)} above ${w.verticalDatum}; ${fmt.metres(w.altitudeSeaLevelM)} above mean sea level (EGM96).`,
      data: { line: w.line, leg: w.leg, altitudeAboveTakeoffM: w.altitudeAboveTakeoffM, altitudeAboveDatumM: w.altitudeAboveDatumM, verticalDatum: w.verticalDatum },
      geometry: 'Point',
      coordinates: coord(w.lon, w.lat, w.altitudeSeaLevelM),
    });
  }
  return serialize(doc);
}

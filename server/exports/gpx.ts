/**
 * GPX 1.1 export (topografix.com/GPX/1/1): one route per line, a route point per waypoint. `ele` is metres above mean
 * sea level (EGM96) and `geoidheight` the EGM96 geoid height, as the GPX schema defines them. Written through the XML
 * DOM (./xml), so every text is escaped.
 */
import { fmt } from '../../contracts/format/figures';
import type { ExportContext } from './export-context';
import { heightsNote } from './export-context';
import { child, commentBeforeRoot, serialize, xmlDocument } from './xml';

const num = (v: number, digits: number) => v.toFixed(digits);

export function toGpx(ctx: ExportContext): string {
  const doc = xmlDocument('http://www.topografix.com/GPX/1/1', 'gpx');
  for (const c of ctx.cautions) commentBeforeRoot(doc, `CAUTION: ${c}`);
  const root = doc.documentElement!;
  root.setAttribute('version', '1.1');
  root.setAttribute('creator', 'Loftline');
  const meta = child(root, 'metadata');
  child(meta, 'name', ctx.title);
  child(meta, 'desc', [heightsNote(ctx, 'ele is metres above mean sea level (EGM96); geoidheight is the EGM96 geoid height.'), 'Cautions:', ...ctx.cautions].join(' '));
  child(meta, 'time', ctx.generatedAt);
  for (const line of ctx.sheet.lines) {
    const rte = child(root, 'rte');
    child(rte, 'name', `Line ${line.number}`);
    child(rte, 'desc', `Heading ${fmt.degrees(line.headingDeg)}, ${fmt.metres(line.lengthM)}, ${line.legs.length} leg(s)`);
    child(rte, 'number', line.number);
    for (const w of ctx.waypoints.filter((p) => p.line === line.number)) {
      const pt = child(rte, 'rtept');
      pt.setAttribute('lat', num(w.lat, 8));
      pt.setAttribute('lon', num(w.lon, 8));
      child(pt, 'ele', num(w.altitudeSeaLevelM, 3));
      child(pt, 'geoidheight', num(w.geoidHeightM, 3));
      child(pt, 'name', `L${w.line} W${w.seq}`);
      child(pt, 'desc', `${fmt.metres(w.altitudeAboveTakeoffM)} above takeoff; ${fmt.metres(w.altitudeAboveDatumM)} above ${w.verticalDatum}`);
    }
  }
  return serialize(doc);
}

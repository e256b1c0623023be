/** Survey areas from files: a GeoJSON polygon, or a KML polygon converted with @tmcw/togeojson. */
import { kml } from '@tmcw/togeojson';
import type { Geometry, GeoJsonObject, Polygon, Position } from 'geojson';
import { openRing, type LonLat } from './area-check';

/** An imported outer ring (open: the first corner is not repeated), with a note when something was left out. */
interface ImportedArea {
  ring: LonLat[];
  note: string | null;
}

/** A file that holds no usable area; the message says what was found instead. */
export class AreaImportError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'AreaImportError';
  }
}

/** Parses XML text into a DOM document (the browser's DOMParser by default; tests pass @xmldom/xmldom's). */
type XmlParser = (text: string) => Document;

const browserXml: XmlParser = (text) => {
  if (typeof DOMParser === 'undefined') throw new AreaImportError('This browser cannot read KML files (no DOMParser).');
  return new DOMParser().parseFromString(text, 'application/xml');
};

function polygonsOf(g: Geometry | null | undefined, out: Polygon[]): void {
  if (!g) return;
  if (g.type === 'Polygon') out.push(g);
  else if (g.type === 'MultiPolygon') for (const c of g.coordinates) out.push({ type: 'Polygon', coordinates: c });
  else if (g.type === 'GeometryCollection') for (const m of g.geometries) polygonsOf(m, out);
}

function collect(obj: GeoJsonObject): Polygon[] {
  const out: Polygon[] = [];
  const any = obj as { type: string; features?: Array<{ geometry: Geometry | null }>; geometry?: Geometry | null };
  if (any.type === 'FeatureCollection') for (const f of any.features ?? []) polygonsOf(f.geometry, out);
  else if (any.type === 'Feature') polygonsOf(any.geometry, out);
  else polygonsOf(obj as Geometry, out);
  return out;
}

function validPosition(p: Position): p is [number, number] {
  return Array.isArray(p) && typeof p[0] === 'number' && typeof p[1] === 'number' && Math.abs(p[0]) <= 180 && Math.abs(p[1]) <= 90;
}

function fromPolygons(polys: Polygon[], what: string): ImportedArea {
  if (polys.length === 0) throw new AreaImportError(`The ${what} holds no polygon. Export the survey area as a polygon (not a line or points).`);
  if (polys.length > 1) throw new AreaImportError(`The ${what} holds ${polys.length} polygons; a plan covers one area. Keep one polygon in the file, or make one plan per area.`);
  const [outer, ...holes] = polys[0].coordinates;
  if (!outer || !outer.every(validPosition)) {
    throw new AreaImportError(`The ${what}'s polygon has coordinates that are not longitude/latitude in degrees (WGS 84). Reproject it to EPSG:4326 first.`);
  }
  const ring = openRing(outer.map((p) => [p[0], p[1]] as LonLat));
  const note = holes.length > 0 ? `The polygon's ${holes.length} hole${holes.length > 1 ? 's were' : ' was'} left out: only the outer edge is used.` : null;
  return { ring, note };
}

/** The area in a GeoJSON text: a Polygon, a Feature or a FeatureCollection with exactly one polygon. */
export function parseGeoJsonArea(text: string): ImportedArea {
  let obj: unknown;
  try {
    obj = JSON.parse(text);
  } catch {
    throw new AreaImportError('The file is not valid JSON, so it cannot be GeoJSON.');
  }
  if (!obj || typeof obj !== 'object' || typeof (obj as { type?: unknown }).type !== 'string') {
    throw new AreaImportError('The JSON has no GeoJSON "type", so it is not GeoJSON.');
  }
  return fromPolygons(collect(obj as GeoJsonObject), 'GeoJSON file');
}

/** The area in a KML text (one Polygon placemark). */
export function parseKmlArea(text: string, parseXml: XmlParser = browserXml): ImportedArea {
  const doc = parseXml(text);
  if (!doc || !doc.documentElement || doc.getElementsByTagName('parsererror').length > 0 || doc.documentElement.nodeName.toLowerCase() !== 'kml') {
    throw new AreaImportError('The file is not readable KML (its root element must be <kml>).');
  }
  return fromPolygons(collect(kml(doc)), 'KML file');
}

/** Chooses the reader by file name (.kml, or .geojson / .json), falling back to the content's first character. */
export function parseAreaFile(fileName: string, text: string, parseXml?: XmlParser): ImportedArea {
  const lower = fileName.toLowerCase();
  if (lower.endsWith('.kml')) return parseKmlArea(text, parseXml);
  if (lower.endsWith('.geojson') || lower.endsWith('.json')) return parseGeoJsonArea(text);
  const first = text.trimStart()[0];
  if (first === '<') return parseKmlArea(text, parseXml);
  if (first === '{') return parseGeoJsonArea(text);
  throw new AreaImportError(`"${fileName}" is neither GeoJSON nor KML. Choose a .geojson, .json or .kml file.`);
}

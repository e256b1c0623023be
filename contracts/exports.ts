/** Open export formats of a plan version, and the waypoint fields they share (heights in metres, datums named). */
import { z } from 'zod';

export const exportFormats = ['geojson', 'kml', 'gpx', 'csv'] as const;
const exportFormatSchema = z.enum(exportFormats);
export type ExportFormat = z.infer<typeof exportFormatSchema>;

/** Media types (IANA registrations) and file extensions of the formats. */
export const exportMedia: Record<ExportFormat, { mime: string; ext: string; label: string }> = {
  geojson: { mime: 'application/geo+json', ext: 'geojson', label: 'GeoJSON (lines, legs, waypoints)' },
  kml: { mime: 'application/vnd.google-earth.kml+xml', ext: 'kml', label: 'KML, absolute altitudes for 3D viewers' },
  gpx: { mime: 'application/gpx+xml', ext: 'gpx', label: 'GPX routes, one per line' },
  csv: { mime: 'text/csv; charset=utf-8', ext: 'csv', label: 'CSV of waypoints' },
};

/** How the grid's vertical datum was read: EGM96 orthometric, WGS 84 ellipsoidal, or another (national) height system. */
const datumKindSchema = z.enum(['egm96', 'ellipsoid', 'other']);
export type DatumKind = z.infer<typeof datumKindSchema>;

/** One waypoint: a line's start, a change of leg, or a line's end, in flying order. */
const waypointSchema = z.object({
  /** 1-based across the whole plan, in flying order. */
  seq: z.number().int(),
  line: z.number().int(),
  /** The leg this waypoint starts (or, at a line's end, the leg it ends). */
  leg: z.number().int(),
  role: z.enum(['line-start', 'leg-change', 'line-end']),
  lon: z.number(),
  lat: z.number(),
  distanceM: z.number(),
  altitudeAboveTakeoffM: z.number(),
  /** Above the elevation grid's vertical datum (`verticalDatum`). */
  altitudeAboveDatumM: z.number(),
  verticalDatum: z.string(),
  /** Above mean sea level as KML and GPX read it (EGM96); equals the datum altitude unless the grid is ellipsoidal. */
  altitudeSeaLevelM: z.number(),
  /** Above the WGS 84 ellipsoid, as GeoJSON coordinates carry it (RFC 7946). */
  altitudeEllipsoidM: z.number(),
  /** EGM96 geoid height N at the point: ellipsoidal = sea level + N. */
  geoidHeightM: z.number(),
  /** True when the grid's datum is neither EGM96 nor the ellipsoid and EGM96 stood in for it (error up to a metre or two). */
  heightsApproximate: z.boolean(),
});
export type Waypoint = z.infer<typeof waypointSchema>;

/** CSV columns, in order (also the GeoJSON waypoint properties). */
export const waypointColumns = [
  'seq',
  'line',
  'leg',
  'role',
  'lon',
  'lat',
  'distanceM',
  'altitudeAboveTakeoffM',
  'altitudeAboveDatumM',
  'verticalDatum',
  'altitudeSeaLevelM',
  'altitudeEllipsoidM',
  'geoidHeightM',
  'heightsApproximate',
] as const satisfies ReadonlyArray<keyof Waypoint>;

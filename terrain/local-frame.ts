/** The local metric frame of a survey: UTM of the area, origin at its centre, scaled to true ground distance; grid heights in it. */
import type { Grid, GridCrs } from './grid';
import { sampleBilinear } from './grid';
import { WGS84, createTransform, utmCrsFor } from './crs';
import { sampleGridCoords } from './sample';
import type { HeightAt } from './footprint';

/**
 * Local frame: x east, y north in metres of ground distance (UTM divided by its point scale factor at the
 * origin, so trigger distances and spacings are true ground lengths; within a few km the scale factor
 * changes by less than 2e-5).
 */
export interface LocalFrame {
  crs: GridCrs;
  originE: number;
  originN: number;
  /** UTM point scale factor at the origin. */
  scale: number;
  toLocal(lon: number, lat: number): [number, number];
  toLonLat(x: number, y: number): [number, number];
}

const A = 6378137;
const F = 1 / 298.257223563;
const E2 = F * (2 - F);

/** The frame of the UTM zone containing (lon, lat), centred there. */
export function localFrameFor(lon: number, lat: number): LocalFrame {
  const crs = utmCrsFor(lon, lat);
  const t = createTransform(WGS84, crs);
  const [e0, n0] = t.forward(lon, lat);
  // Point scale factor: projected length / ellipsoidal length over 0.001 degree north and east
  // (meridian radius M and prime-vertical radius N of the WGS 84 ellipsoid; conformal, so one factor).
  const d = 0.001;
  const phi = (lat * Math.PI) / 180;
  const w = 1 - E2 * Math.sin(phi) ** 2;
  const M = (A * (1 - E2)) / w ** 1.5;
  const N = A / Math.sqrt(w);
  const [en, nn] = t.forward(lon, lat + d);
  const [ee, ne] = t.forward(lon + d, lat);
  const rad = (d * Math.PI) / 180;
  const kN = Math.hypot(en - e0, nn - n0) / (M * rad);
  const kE = Math.hypot(ee - e0, ne - n0) / (N * Math.cos(phi) * rad);
  const scale = (kN + kE) / 2;
  return {
    crs,
    originE: e0,
    originN: n0,
    scale,
    toLocal(lo, la) {
      const [e, n] = t.forward(lo, la);
      return [(e - e0) / scale, (n - n0) / scale];
    },
    toLonLat(x, y) {
      return t.inverse(e0 + x * scale, n0 + y * scale);
    },
  };
}

/** Heights of `grid` in a local frame: one point at a time (`heightAt`) and many at once (`sampleMany`). */
export interface LocalHeights {
  heightAt: HeightAt;
  /** Heights at local coordinates into `out` (NaN unknown); returns the unknown count. */
  sampleMany(xs: Float64Array, ys: Float64Array, out: Float64Array): number;
}

/** Grid heights in the local frame; the transform to the grid's CRS is built once (none when the grid is in the frame's UTM zone). */
export function localHeights(grid: Grid, frame: LocalFrame): LocalHeights {
  const t = createTransform(frame.crs, grid.crs);
  const { originE: e0, originN: n0, scale: k } = frame;
  const heightAt: HeightAt = t.identity
    ? (x, y) => sampleBilinear(grid, e0 + x * k, n0 + y * k)
    : (x, y) => {
        const [gx, gy] = t.forward(e0 + x * k, n0 + y * k);
        return sampleBilinear(grid, gx, gy);
      };
  return {
    heightAt,
    sampleMany(xs, ys, out) {
      const n = xs.length;
      const gx = new Float64Array(n);
      const gy = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        gx[i] = e0 + xs[i] * k;
        gy[i] = n0 + ys[i] * k;
      }
      t.forwardArrays(gx, gy);
      return sampleGridCoords(grid, gx, gy, out);
    },
  };
}

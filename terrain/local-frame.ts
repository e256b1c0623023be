/** The local metric frame of a survey: UTM of the area, origin at its centre, scaled to true ground distance; grid heights in it. */
import type { Grid, GridCrs } from './grid';
import { WGS84, createTransform, utmCrsFor } from './crs';
import { sampleGridCoords } from './sample';
import type { HeightAt } from './camera-pose';

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
  const bilinear = bilinearSampler(grid);
  const heightAt: HeightAt = t.identity
    ? (x, y) => bilinear(e0 + x * k, n0 + y * k)
    : (x, y) => {
        const [gx, gy] = t.forward(e0 + x * k, n0 + y * k);
        return bilinear(gx, gy);
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

/**
 * `sampleBilinear` of grid.ts as a closure with the inverse geotransform worked out once: the ray casting
 * samples the grid a few hundred thousand times a plan, one point at a time. Same clamping and nodata rules.
 */
export function bilinearSampler(grid: Grid): (x: number, y: number) => number {
  const { width, height, data } = grid;
  const t = grid.transform;
  const det = t[1] * t[5] - t[2] * t[4];
  if (det === 0) throw new Error('Grid transform is singular (pixel size 0): the georeference is broken.');
  const a1 = t[5] / det, a2 = -t[2] / det, b1 = -t[4] / det, b2 = t[1] / det;
  const a0 = -(a1 * t[0] + a2 * t[3]), b0 = -(b1 * t[0] + b2 * t[3]);
  const wMax = width - 1, hMax = height - 1;
  return (x, y) => {
    const pc = a0 + a1 * x + a2 * y;
    const pr = b0 + b1 * x + b2 * y;
    if (!(pc >= 0 && pr >= 0 && pc < width && pr < height)) return NaN; // far edges off the grid, as in GDAL
    let fx = pc - 0.5, fy = pr - 0.5;
    if (fx < 0) fx = 0; else if (fx > wMax) fx = wMax;
    if (fy < 0) fy = 0; else if (fy > hMax) fy = hMax;
    const c0 = Math.floor(fx), r0 = Math.floor(fy);
    const c1 = c0 + 1 < width ? c0 + 1 : c0;
    const o0 = r0 * width, o1 = r0 + 1 < height ? o0 + width : o0;
    const tx = fx - c0, ty = fy - r0;
    const v00 = data[o0 + c0], v10 = data[o0 + c1], v01 = data[o1 + c0], v11 = data[o1 + c1];
    const top = v00 + (v10 - v00) * tx;
    return top + (v01 + (v11 - v01) * tx - top) * ty;
  };
}

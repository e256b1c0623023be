/** A hillshade preview of a grid as PNG bytes (grey + alpha), downsampled for the browser. */
import type { GeoTransform, Grid } from './grid';
import { pixelToMap } from './grid';
import { check } from './errors';
import { WGS84, createTransform } from './crs';
import { pixelBoundsWgs84 } from './metadata';
import { metresPerUnit } from './dem-header';
import { encodePng } from './png-encode';


/** Options: the longest image side (default 1024 px), sun azimuth from north clockwise (315) and altitude (45 degrees). */
export interface HillshadeOptions {
  maxSizePx?: number;
  azimuthDeg?: number;
  altitudeDeg?: number;
}

/** The PNG and where it lies: image size, WGS 84 bounds, and the grid-CRS transform of the image pixels. */
export interface Hillshade {
  png: Uint8Array;
  width: number;
  height: number;
  boundsWgs84: [number, number, number, number];
  transform: GeoTransform;
}

/**
 * Box-average of a grid by an integer factor k, fed row band by row band (row-major, so the sums are those of one
 * pass), ignoring unknown pixels (NaN only where a whole box is unknown). It holds only the small image's sums.
 */
export class Overview {
  readonly w: number;
  readonly h: number;
  private readonly sum: Float64Array | null;
  private readonly n: Uint32Array | null;
  private readonly direct: Float32Array | null;
  constructor(readonly width: number, readonly height: number, readonly k: number) {
    this.w = Math.ceil(width / k);
    this.h = Math.ceil(height / k);
    // k = 1: the image is the grid itself (the heights as they are)
    this.direct = k === 1 ? new Float32Array(this.w * this.h) : null;
    this.sum = k === 1 ? null : new Float64Array(this.w * this.h);
    this.n = k === 1 ? null : new Uint32Array(this.w * this.h);
  }
  /** Rows [row0, row0 + data.length / width) of the grid. */
  addRows(data: Float32Array, row0: number): void {
    const { width, k, w } = this;
    if (this.direct) { this.direct.set(data, row0 * width); return; }
    const sum = this.sum!, n = this.n!;
    const rows = data.length / width;
    for (let rr = 0; rr < rows; rr++) {
      const r = row0 + rr;
      const o = ((r / k) | 0) * w;
      for (let c = 0; c < width; c++) {
        const v = data[rr * width + c];
        if (v === v) { sum[o + ((c / k) | 0)] += v; n[o + ((c / k) | 0)]++; }
      }
    }
  }
  heights(): Float32Array {
    if (this.direct) return this.direct;
    const z = new Float32Array(this.w * this.h);
    for (let i = 0; i < z.length; i++) z[i] = this.n![i] ? this.sum![i] / this.n![i] : NaN;
    return z;
  }
}

/** Box-average the grid by an integer factor k, ignoring unknown pixels (NaN only where a whole box is unknown). */
function downsample(grid: Grid, k: number): { w: number; h: number; z: Float32Array } {
  const w = Math.ceil(grid.width / k), h = Math.ceil(grid.height / k);
  if (k === 1) return { w, h, z: grid.data };
  const ov = new Overview(grid.width, grid.height, k);
  ov.addRows(grid.data, 0);
  return { w, h, z: ov.heights() };
}

/** Ground size of the image pixels in metres (geographic grids: WGS 84 radii of curvature at the grid centre). */
function pixelSizeM(grid: Pick<Grid, 'crs'>, t: GeoTransform, w: number, h: number): [number, number] {
  const dx = Math.hypot(t[1], t[4]), dy = Math.hypot(t[2], t[5]);
  if (!grid.crs.geographic) {
    const m = metresPerUnit(grid.crs.horizontalUnit);
    return [dx * m, dy * m];
  }
  const [, lat] = createTransform(grid.crs, WGS84).forward(...pixelToMap(t, w / 2, h / 2));
  const a = 6378137, e2 = 0.00669437999014; // WGS 84 (NIMA TR8350.2)
  const s = Math.sin((lat * Math.PI) / 180);
  const nRadius = a / Math.sqrt(1 - e2 * s * s);
  const mRadius = (a * (1 - e2)) / Math.pow(1 - e2 * s * s, 1.5);
  return [(dx * Math.PI * nRadius * Math.cos((lat * Math.PI) / 180)) / 180, (dy * Math.PI * mRadius) / 180];
}

/**
 * Hillshade PNG of a grid. Slopes by Horn's 3 x 3 weighted differences (B. K. P. Horn, "Hill shading and the
 * reflectance map", Proc. IEEE 69(1), 1981), Lambertian shade = surface normal . sun vector; nodata transparent.
 */
export function hillshadePng(grid: Grid, opts: HillshadeOptions = {}): Hillshade {
  const k = overviewFactor(grid.width, grid.height, opts);
  const { w, h, z } = downsample(grid, k);
  return hillshadeOfOverview(grid, k, w, h, z, opts);
}

/** The factor by which a grid of width x height is box-averaged for an image of at most `maxSizePx` a side. */
export function overviewFactor(width: number, height: number, opts: HillshadeOptions = {}): number {
  const maxSizePx = opts.maxSizePx ?? 1024;
  check(Number.isInteger(maxSizePx) && maxSizePx >= 1, `maxSizePx must be a whole number >= 1, got ${maxSizePx}.`);
  return Math.max(1, Math.ceil(Math.max(width, height) / maxSizePx));
}

/** Hillshade PNG of a grid's overview `z` (w x h, the grid box-averaged by k). */
export function hillshadeOfOverview(grid: Pick<Grid, 'transform' | 'crs'>, k: number, w: number, h: number, z: Float32Array, opts: HillshadeOptions = {}): Hillshade {
  const azimuthDeg = opts.azimuthDeg ?? 315;
  const altitudeDeg = opts.altitudeDeg ?? 45;
  check(Number.isFinite(azimuthDeg), `azimuthDeg must be a number, got ${azimuthDeg}.`);
  check(Number.isFinite(altitudeDeg) && altitudeDeg > 0 && altitudeDeg <= 90, `altitudeDeg must be in (0, 90], got ${altitudeDeg}.`);
  const gt = grid.transform;
  const t: GeoTransform = [gt[0], gt[1] * k, gt[2] * k, gt[3], gt[4] * k, gt[5] * k];
  const [sxM, syM] = pixelSizeM(grid, t, w, h);
  const az = (azimuthDeg * Math.PI) / 180, alt = (altitudeDeg * Math.PI) / 180;
  // sun vector in (east, north, up); image rows run south when t[5] < 0
  const sunE = Math.sin(az) * Math.cos(alt), sunN = Math.cos(az) * Math.cos(alt), sunU = Math.sin(alt);
  const rowSign = t[5] < 0 ? 1 : -1, colSign = t[1] > 0 ? 1 : -1;
  const rgba = new Uint8Array(w * h * 4);
  const at = (c: number, r: number, fallback: number) => {
    const cc = c < 0 ? 0 : c >= w ? w - 1 : c, rr = r < 0 ? 0 : r >= h ? h - 1 : r;
    const v = z[rr * w + cc];
    return v === v ? v : fallback; // edges and holes: reuse the centre height (flat there)
  };
  for (let r = 0; r < h; r++) {
    for (let c = 0; c < w; c++) {
      const e = z[r * w + c];
      const o = (r * w + c) * 4;
      if (e !== e) continue; // transparent
      const a = at(c - 1, r - 1, e), b = at(c, r - 1, e), cc = at(c + 1, r - 1, e);
      const d = at(c - 1, r, e), f = at(c + 1, r, e);
      const g = at(c - 1, r + 1, e), hh = at(c, r + 1, e), i = at(c + 1, r + 1, e);
      const dzE = (colSign * ((cc + 2 * f + i) - (a + 2 * d + g))) / (8 * sxM);
      const dzN = (rowSign * ((a + 2 * b + cc) - (g + 2 * hh + i))) / (8 * syM);
      const shade = (-dzE * sunE - dzN * sunN + sunU) / Math.sqrt(1 + dzE * dzE + dzN * dzN);
      const v = Math.round(255 * (shade > 0 ? shade : 0));
      rgba[o] = rgba[o + 1] = rgba[o + 2] = v;
      rgba[o + 3] = 255;
    }
  }
  return {
    png: encodePng(w, h, rgba, 4),
    width: w,
    height: h,
    boundsWgs84: pixelBoundsWgs84({ transform: t, crs: grid.crs }, 0, 0, w, h),
    transform: t,
  };
}

/**
 * Writes datasets/harrow-fell-dem.tif: a synthetic 2 m elevation grid of the fictional "Harrow Fell quarry" site
 * (ridges, a meandering valley, a quarry pit with a steep face, a spoil heap, a small strip without data).
 * Run: npx tsx datasets/make-demo-dem.ts [out.tif]. Deterministic: the same bytes on every run.
 * The GeoTIFF is tiled (256 px), DEFLATE with the floating-point predictor (Adobe TIFF Technical Note 3),
 * EPSG:32631 (WGS 84 / UTM zone 31N) with EGM96 heights in metres (EPSG:5773).
 */
import { writeFileSync } from 'node:fs';
import { deflateSync } from 'node:zlib';
import { fileURLToPath } from 'node:url';

export const DEMO_DEM = {
  siteName: 'Harrow Fell quarry',
  epsg: 32631,
  verticalEpsg: 5773,
  originE: 612000, // west edge, metres
  originN: 5181800, // north edge, metres
  pixelM: 2,
  width: 1100,
  height: 900,
  nodata: -9999,
} as const;

/** Seeded 32-bit generator (mulberry32), so the terrain is the same on every run. */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Smooth value noise on a lattice of `cellM` metres (smoothstep-blended lattice values). */
function valueNoise(seed: number, cellM: number): (x: number, y: number) => number {
  const rnd = mulberry32(seed);
  const n = 64;
  const lattice = new Float64Array(n * n).map(() => rnd() * 2 - 1);
  const at = (i: number, j: number) => lattice[(((j % n) + n) % n) * n + (((i % n) + n) % n)];
  return (x, y) => {
    const fx = x / cellM, fy = y / cellM;
    const i = Math.floor(fx), j = Math.floor(fy);
    const tx = fx - i, ty = fy - j;
    const sx = tx * tx * (3 - 2 * tx), sy = ty * ty * (3 - 2 * ty);
    const top = at(i, j) + (at(i + 1, j) - at(i, j)) * sx;
    const bottom = at(i, j + 1) + (at(i + 1, j + 1) - at(i, j + 1)) * sx;
    return top + (bottom - top) * sy;
  };
}

/** Height in metres (EGM96) at site coordinates (x east, y north, metres from the south-west corner), or NaN. */
export function demoHeight(x: number, y: number): number {
  const octaves = demoHeight.octaves;
  let h = 255 + 0.018 * x + 0.01 * y; // regional rise to the north-east
  // two ridges running SW-NE
  const d1 = x * 0.6 - y * 0.8 + 300;
  const d2 = x * 0.6 - y * 0.8 - 650;
  h += 85 * Math.exp(-((d1 / 190) ** 2)) + 60 * Math.exp(-((d2 / 150) ** 2));
  // a meandering valley with a stream, crossing west to east
  const yValley = 820 + 110 * Math.sin(x / 380) + 40 * Math.sin(x / 130 + 1);
  h -= 48 * Math.exp(-(((y - yValley) / 130) ** 2)) + 3 * Math.exp(-(((y - yValley) / 8) ** 2));
  for (const [amp, f] of octaves) h += amp * f(x, y);
  // quarry: a rotated rectangular pit with a flat floor at 236 m and a 12 m wide face up to the natural ground
  const cx = 1480, cy = 430, ang = (20 * Math.PI) / 180;
  const u = (x - cx) * Math.cos(ang) + (y - cy) * Math.sin(ang);
  const v = -(x - cx) * Math.sin(ang) + (y - cy) * Math.cos(ang);
  const s = Math.max(Math.abs(u) - 210, Math.abs(v) - 130); // < 0 inside the pit
  const floorM = 236;
  if (s < 0 && h > floorM) {
    const t = Math.min(1, Math.max(0, (s + 12) / 12));
    const bench = s < -40 && s > -60 && v > 0 ? 6 : 0; // a working bench on the north side
    h = Math.min(h, floorM + bench + (h - floorM) * t);
  }
  // spoil heap west of the pit
  h += 16 * Math.exp(-(((x - 1130) / 70) ** 2 + ((y - 300) / 55) ** 2));
  // a strip in the south-east corner that the source survey did not cover
  if (x + (1800 - y) * 0.15 > 2150 && y < 260) return NaN;
  return Math.round(h * 100) / 100; // centimetres, as survey grids usually are
}
demoHeight.octaves = [
  [7, valueNoise(11, 320)],
  [3.5, valueNoise(12, 130)],
  [1.4, valueNoise(13, 45)],
  [0.4, valueNoise(14, 14)],
] as Array<[number, (x: number, y: number) => number]>;

/** Floating-point predictor (TIFF TN3): bytes of each row into planes, most significant first, then byte differences. */
function floatPredict(tile: Float32Array, tileW: number, tileH: number): Uint8Array {
  const src = new Uint8Array(tile.buffer, tile.byteOffset, tile.byteLength);
  const out = new Uint8Array(src.length);
  const rowBytes = tileW * 4;
  for (let r = 0; r < tileH; r++) {
    const o = r * rowBytes;
    for (let i = 0; i < tileW; i++) for (let k = 0; k < 4; k++) out[o + k * tileW + i] = src[o + i * 4 + (3 - k)]; // little-endian host
    for (let i = rowBytes - 1; i > 0; i--) out[o + i] = (out[o + i] - out[o + i - 1]) & 255;
  }
  return out;
}

interface Tag { code: number; type: 2 | 3 | 4 | 12; values: number[] | string }

/** A little-endian tiled float32 GeoTIFF (TIFF 6.0 + OGC GeoTIFF 1.1 keys), DEFLATE + predictor 3. */
export function writeGeoTiff(data: Float32Array, width: number, height: number, opts: { originE: number; originN: number; pixelM: number; epsg: number; verticalEpsg?: number; nodata?: number; tile?: number }): Uint8Array {
  const T = opts.tile ?? 256;
  const across = Math.ceil(width / T), down = Math.ceil(height / T);
  const blobs: Uint8Array[] = [];
  for (let ty = 0; ty < down; ty++) for (let tx = 0; tx < across; tx++) {
    const tile = new Float32Array(T * T).fill(opts.nodata ?? 0);
    for (let r = 0; r < T && ty * T + r < height; r++) {
      const row = ty * T + r;
      const c0 = tx * T, n = Math.min(T, width - c0);
      tile.set(data.subarray(row * width + c0, row * width + c0 + n), r * T);
    }
    blobs.push(deflateSync(floatPredict(tile, T, T), { level: 9 }));
  }
  const geoKeys = [1, 1, 0, 0, 1024, 0, 1, 1, 1025, 0, 1, 1, 3072, 0, 1, opts.epsg, 3076, 0, 1, 9001];
  if (opts.verticalEpsg) geoKeys.push(4096, 0, 1, opts.verticalEpsg, 4099, 0, 1, 9001);
  geoKeys[3] = (geoKeys.length - 4) / 4;
  const tags: Tag[] = [
    { code: 256, type: 4, values: [width] }, { code: 257, type: 4, values: [height] },
    { code: 258, type: 3, values: [32] }, { code: 259, type: 3, values: [8] }, { code: 262, type: 3, values: [1] },
    { code: 277, type: 3, values: [1] }, { code: 284, type: 3, values: [1] }, { code: 317, type: 3, values: [3] },
    { code: 322, type: 3, values: [T] }, { code: 323, type: 3, values: [T] },
    { code: 324, type: 4, values: blobs.map(() => 0) }, { code: 325, type: 4, values: blobs.map((b) => b.length) },
    { code: 339, type: 3, values: [3] },
    { code: 33550, type: 12, values: [opts.pixelM, opts.pixelM, 0] },
    { code: 33922, type: 12, values: [0, 0, 0, opts.originE, opts.originN, 0] },
    { code: 34735, type: 3, values: geoKeys },
  ];
  if (opts.nodata !== undefined) tags.push({ code: 42113, type: 2, values: `${opts.nodata}\0` });
  const size = (t: Tag) => (typeof t.values === 'string' ? t.values.length : t.values.length * (t.type === 3 ? 2 : t.type === 4 ? 4 : 8));
  const ifdSize = 2 + tags.length * 12 + 4;
  let extra = 8 + ifdSize;
  const extraOffsets = tags.map((t) => { if (size(t) <= 4) return 0; const o = extra; extra += size(t) + (size(t) % 2); return o; });
  let dataOffset = extra;
  (tags[10].values as number[]).forEach((_, i, arr) => { arr[i] = dataOffset; dataOffset += blobs[i].length; });
  const out = new Uint8Array(dataOffset);
  const dv = new DataView(out.buffer);
  out.set([0x49, 0x49, 42, 0]);
  dv.setUint32(4, 8, true);
  dv.setUint16(8, tags.length, true);
  const put = (t: Tag, at: number) => {
    if (typeof t.values === 'string') { for (let i = 0; i < t.values.length; i++) out[at + i] = t.values.charCodeAt(i); return; }
    t.values.forEach((v, i) => { if (t.type === 3) dv.setUint16(at + 2 * i, v, true); else if (t.type === 4) dv.setUint32(at + 4 * i, v, true); else dv.setFloat64(at + 8 * i, v, true); });
  };
  tags.forEach((t, i) => {
    const e = 10 + i * 12;
    dv.setUint16(e, t.code, true);
    dv.setUint16(e + 2, t.type, true);
    dv.setUint32(e + 4, t.values.length, true);
    put(t, size(t) <= 4 ? e + 8 : (dv.setUint32(e + 8, extraOffsets[i], true), extraOffsets[i]));
  });
  dv.setUint32(10 + tags.length * 12, 0, true); // no further IFD
  let o = extra;
  for (const b of blobs) { out.set(b, o); o += b.length; }
  return out;
}

/** The demo grid as a row-major Float32Array (north row first), nodata = DEMO_DEM.nodata. */
export function demoGrid(): Float32Array {
  const { width, height, pixelM, nodata } = DEMO_DEM;
  const data = new Float32Array(width * height);
  for (let r = 0; r < height; r++) {
    const y = (height - r - 0.5) * pixelM;
    for (let c = 0; c < width; c++) {
      const h = demoHeight((c + 0.5) * pixelM, y);
      data[r * width + c] = Number.isNaN(h) ? nodata : h;
    }
  }
  return data;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const out = process.argv[2] ?? fileURLToPath(new URL('./harrow-fell-dem.tif', import.meta.url));
  const bytes = writeGeoTiff(demoGrid(), DEMO_DEM.width, DEMO_DEM.height, { ...DEMO_DEM, tile: 256 });
  writeFileSync(out, bytes);
  process.stdout.write(`wrote ${out} (${(bytes.length / 1e6).toFixed(2)} MB)\n`);
}

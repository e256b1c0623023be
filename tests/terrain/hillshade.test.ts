import { describe, expect, it } from 'vitest';
import { PNG } from 'pngjs';
import { createGrid } from '../../terrain/grid';
import { crsFromEpsg, WGS84 } from '../../terrain/crs';
import { hillshadePng } from '../../terrain/hillshade';
import { describeGrid } from '../../terrain/metadata';

/** A plane z = gx * east + gy * north (metres), 1 m pixels, north up. */
function plane(w: number, h: number, gx: number, gy: number) {
  const data = new Float32Array(w * h);
  for (let r = 0; r < h; r++) for (let c = 0; c < w; c++) data[r * w + c] = 200 + gx * c - gy * r;
  return createGrid({ width: w, height: h, data, transform: [500000, 1, 0, 5550000, 0, -1], crs: crsFromEpsg(32633) });
}
const decode = (png: Uint8Array) => PNG.sync.read(Buffer.from(png));

describe('hillshadePng', () => {
  it('shades a plane by Lambert\'s law: normal . sun vector (Horn, Proc. IEEE 69(1), 1981)', () => {
    // plane rising 0.5 m/m to the east, sun from the north-west at 45 degrees:
    // n = (-0.5, 0, 1)/sqrt(1.25), s = (-sin45 cos45, cos45 cos45, sin45) -> n.s = (0.25 + 0.7071) / 1.1180 = 0.8561
    const img = decode(hillshadePng(plane(20, 20, 0.5, 0)).png);
    const mid = (10 * 20 + 10) * 4;
    expect(img.data[mid]).toBe(Math.round(255 * ((0.25 + Math.SQRT1_2) / Math.sqrt(1.25))));
    expect(img.data[mid + 3]).toBe(255);
    // flat ground: sin(altitude)
    const flat = decode(hillshadePng(plane(5, 5, 0, 0), { altitudeDeg: 30 }).png);
    expect(Math.abs(flat.data[(2 * 5 + 2) * 4] - 255 * 0.5)).toBeLessThanOrEqual(0.5);
  });

  it('turns a slope facing the sun brighter than one facing away', () => {
    const towards = decode(hillshadePng(plane(9, 9, 0.4, -0.4)).png); // falls towards the north-west sun
    const away = decode(hillshadePng(plane(9, 9, -0.4, 0.4)).png);
    const i = (4 * 9 + 4) * 4;
    expect(towards.data[i]).toBeGreaterThan(away.data[i] + 100);
  });

  it('downsamples to maxSizePx and reports the image transform and WGS 84 bounds', () => {
    const g = plane(300, 120, 0.1, 0.2);
    const h = hillshadePng(g, { maxSizePx: 100 });
    expect([h.width, h.height]).toEqual([100, 40]);
    expect(h.transform).toEqual([500000, 3, 0, 5550000, 0, -3]);
    expect(h.boundsWgs84).toEqual(describeGrid(g).boundsWgs84);
    const img = decode(h.png);
    expect([img.width, img.height]).toEqual([100, 40]);
  });

  it('leaves nodata transparent', () => {
    const g = plane(10, 10, 0.1, 0);
    g.data[55] = NaN;
    const img = decode(hillshadePng(g).png);
    expect(img.data[55 * 4 + 3]).toBe(0);
    expect(img.data[54 * 4 + 3]).toBe(255);
  });

  it('works for geographic grids (pixel size from the WGS 84 radii)', () => {
    // 0.00001 deg of latitude at 45 N is 1.1132 m; a rise of 1.1132 m per row north is a 45-degree slope to the north
    const w = 7, data = new Float32Array(w * w);
    for (let r = 0; r < w; r++) for (let c = 0; c < w; c++) data[r * w + c] = 100 + 1.11319 * (w - r);
    const g = createGrid({ width: w, height: w, data, transform: [10, 0.00001, 0, 45.00004, 0, -0.00001], crs: WGS84 });
    const img = decode(hillshadePng(g, { azimuthDeg: 0, altitudeDeg: 45 }).png);
    // slope rising towards the north faces south, away from a sun in the north at 45 degrees: grazing light, n.s ~ 0
    expect(img.data[(3 * w + 3) * 4]).toBeLessThan(4);
  });

  it('throws on bad options', () => {
    expect(() => hillshadePng(plane(3, 3, 0, 0), { maxSizePx: 0 })).toThrow(/maxSizePx/);
    expect(() => hillshadePng(plane(3, 3, 0, 0), { altitudeDeg: 0 })).toThrow(/altitudeDeg/);
  });
});

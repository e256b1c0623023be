import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { boundsGeoref, hillshadeGeoref, onImage, projectedGeoref } from '../../components/map/image-georef';

// Reference coordinates made with PROJ cs2cs 9.1.1 (Debian proj-bin) by tests/fixtures/crs/make-references.sh.
const cs2cs = JSON.parse(fs.readFileSync('tests/fixtures/crs/cs2cs.json', 'utf8')) as {
  points: Array<{ epsg: number; lon: number; lat: number; x: number; y: number }>;
};
const utm33n = '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs';

describe('projectedGeoref', () => {
  // A 10 m image whose top-left corner is 5 km west and north of the reference point.
  const ref = cs2cs.points.find((p) => p.epsg === 32633 && p.lat === 50.1)!;
  const transform = [ref.x - 5000, 10, 0, ref.y + 5000, 0, -10] as const;
  const g = projectedGeoref(1000, 1000, transform, utm33n);

  it('puts the PROJ cs2cs 9.1.1 point for 15.2 E 50.1 N (UTM 33N) at pixel (500, 500) to within a millimetre', () => {
    const [x, y] = g.toPixel(ref.lon, ref.lat);
    expect(x).toBeCloseTo(500, 4); // 1e-4 px = 1 mm at 10 m pixels
    expect(y).toBeCloseTo(500, 4);
  });

  it('returns to the same longitude/latitude after pixel -> lon/lat -> pixel', () => {
    for (const [px, py] of [[0, 0], [1000, 1000], [123.4, 876.5]] as const) {
      const [lon, lat] = g.toLonLat(px, py);
      const [bx, by] = g.toPixel(lon, lat);
      expect(bx).toBeCloseTo(px, 6);
      expect(by).toBeCloseTo(py, 6);
    }
  });

  it('throws on an image size that is not whole positive pixels, naming it', () => {
    expect(() => projectedGeoref(0, 10, transform, utm33n)).toThrow(/got 0 x 10/);
    expect(() => projectedGeoref(10.5, 10, transform, utm33n)).toThrow(/10.5 x 10/);
  });
});

describe('boundsGeoref', () => {
  const g = boundsGeoref(200, 100, [10, 40, 12, 41]);

  it('maps the image corners to the bounds, north at the top', () => {
    expect(g.toLonLat(0, 0)).toEqual([10, 41]);
    expect(g.toLonLat(200, 100)).toEqual([12, 40]);
    expect(g.toPixel(11, 40.5)).toEqual([100, 50]);
  });

  it('throws on bounds whose maximum is not above the minimum', () => {
    expect(() => boundsGeoref(10, 10, [12, 40, 10, 41])).toThrow(/max > min/);
  });
});

describe('hillshadeGeoref', () => {
  it('uses the grid-CRS transform when the record has one, and the WGS 84 bounds otherwise', () => {
    const ref = cs2cs.points.find((p) => p.epsg === 32633 && p.lat === 50.1)!;
    const exact = hillshadeGeoref({ width: 10, height: 10, boundsWgs84: [0, 0, 1, 1], transform: [ref.x, 1, 0, ref.y, 0, -1] }, utm33n);
    const [x, y] = exact.toPixel(ref.lon, ref.lat);
    expect(x).toBeCloseTo(0, 3);
    expect(y).toBeCloseTo(0, 3);
    const linear = hillshadeGeoref({ width: 10, height: 10, boundsWgs84: [0, 0, 1, 1] }, utm33n);
    expect(linear.toPixel(0.5, 0.5)).toEqual([5, 5]);
    // a datum shift by grid file (which the browser does not have): the bounds the server placed with the grid
    const gk3 = '+proj=tmerc +lat_0=0 +lon_0=9 +k=1 +x_0=3500000 +y_0=0 +units=m +a=6377397.155 +rf=299.1528128 +no_defs +nadgrids=BETA2007.gsb';
    const byBounds = hillshadeGeoref({ width: 10, height: 10, boundsWgs84: [8, 50, 9, 51], transform: [3477000, 1, 0, 5553000, 0, -1] }, gk3);
    expect(byBounds.toPixel(8.5, 50.5)).toEqual([5, 5]);
  });
});

describe('onImage', () => {
  it('counts the edges as on the image and anything past them as off', () => {
    const g = { widthPx: 10, heightPx: 5 };
    expect(onImage(g, [0, 0])).toBe(true);
    expect(onImage(g, [10, 5])).toBe(true);
    expect(onImage(g, [10.01, 2])).toBe(false);
    expect(onImage(g, [3, -0.01])).toBe(false);
  });
});

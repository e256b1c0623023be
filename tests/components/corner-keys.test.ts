/**
 * Moving an area corner from the keyboard: choosing corners round the ring, and one step = one hillshade pixel,
 * measured on the ground with GeographicLib's inverse geodesic (the `geographiclib-geodesic` npm package, C. F. F.
 * Karney's algorithms, "Algorithms for geodesics", J. Geodesy 87, 2013) and, for a projected grid, in the grid's
 * own coordinates through proj4js (the npm port of PROJ's transverse Mercator) and on the ellipsoid by GeographicLib.
 */
import { Geodesic } from 'geographiclib-geodesic';
import proj4 from 'proj4';
import { describe, expect, it } from 'vitest';
import { nextCorner, nudgedCorner } from '../../components/map/corner-keys';
import { groundScale } from '../../components/map/ground-aspect';
import { boundsGeoref, projectedGeoref } from '../../components/map/image-georef';

const geod = Geodesic.WGS84;
const inverse = (a: readonly number[], b: readonly number[]) => geod.Inverse(a[1]!, a[0]!, b[1]!, b[0]!);

describe('choosing a corner without a pointer', () => {
  it('goes round the ring both ways, starting from the first or the last, and has nothing to choose with no corners', () => {
    expect(nextCorner(null, 4, 1)).toBe(0);
    expect(nextCorner(null, 4, -1)).toBe(3);
    expect(nextCorner(0, 4, 1)).toBe(1);
    expect(nextCorner(3, 4, 1)).toBe(0);
    expect(nextCorner(0, 4, -1)).toBe(3);
    expect(nextCorner(7, 4, 1)).toBe(0); // a corner that was removed meanwhile
    expect(nextCorner(null, 0, 1)).toBeNull();
  });
});

describe('one keyboard step', () => {
  it('on a longitude/latitude grid moves the corner one pixel north or east: the ground length the map shows for a step', () => {
    // 0.0001° pixels over a patch at 54.6° N (about 11 m north–south, 6.4 m east–west)
    const g = boundsGeoref(400, 300, [-2.04, 54.6, -2.0, 54.63]);
    const scale = groundScale(g);
    const c: [number, number] = [-2.02, 54.615];
    const up = inverse(c, nudgedCorner(g, c, 'up'));
    expect(up.s12! / scale.metresPerPxY).toBeCloseTo(1, 3);
    expect(Math.abs(up.azi1!)).toBeLessThan(1e-6); // due north
    const right = inverse(c, nudgedCorner(g, c, 'right'));
    expect(right.s12! / scale.metresPerPxX).toBeCloseTo(1, 3);
    expect(right.azi1!).toBeCloseTo(90, 2); // east (a parallel starts due east)
    const down = inverse(c, nudgedCorner(g, c, 'down', 3));
    expect(down.s12! / (3 * scale.metresPerPxY)).toBeCloseTo(1, 3);
    expect(Math.abs(Math.abs(down.azi1!) - 180)).toBeLessThan(1e-6);
  });

  it('on a projected grid moves the corner exactly one cell along the grid axes (UTM zone 30N, 2 m cells)', () => {
    const utm = '+proj=utm +zone=30 +datum=WGS84 +units=m +no_defs';
    const transform = [500000, 2, 0, 6050000, 0, -2] as const; // x0, dx, rotation, y0, rotation, dy
    const g = projectedGeoref(500, 400, transform, utm);
    const start = proj4(utm, 'WGS84', [500300, 6049500]) as [number, number];
    const [x0, y0] = proj4('WGS84', utm, start) as [number, number];
    const [x1, y1] = proj4('WGS84', utm, nudgedCorner(g, start, 'up')) as [number, number];
    expect(x1 - x0).toBeCloseTo(0, 4);
    expect(y1 - y0).toBeCloseTo(2, 4); // one cell toward the top of the map: grid north
    const [x2, y2] = proj4('WGS84', utm, nudgedCorner(g, start, 'left')) as [number, number];
    expect(x2 - x0).toBeCloseTo(-2, 4);
    expect(y2 - y0).toBeCloseTo(0, 4);
    // and on the ellipsoid that is 2 m times UTM's scale factor (0.9996 on the central meridian; GeographicLib)
    expect(inverse(start, nudgedCorner(g, start, 'up')).s12! / 2).toBeCloseTo(1 / 0.9996, 4);
  });

  it('refuses a step that is not a positive number of pixels', () => {
    const g = boundsGeoref(10, 10, [0, 0, 1, 1]);
    expect(() => nudgedCorner(g, [0.5, 0.5], 'up', 0)).toThrow(/positive number of pixels/);
  });
});

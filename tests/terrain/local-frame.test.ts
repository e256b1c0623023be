import { describe, expect, it } from 'vitest';
import geodesic from 'geographiclib-geodesic';
import { bilinearSampler, localFrameFor, localHeights } from '../../terrain/local-frame';
import { createGrid, sampleBilinear } from '../../terrain/grid';
import { WGS84, createTransform } from '../../terrain/crs';
import { utmGrid } from './plan-fixtures';

const { Geodesic } = geodesic as unknown as typeof import('geographiclib-geodesic');

describe('local frame', () => {
  // Reference: geodesic distances from GeographicLib (geographiclib-geodesic 2.x, Karney 2013) on WGS 84.
  it('measures true ground distance within 2e-5 over a few kilometres, near and far from the central meridian', () => {
    for (const [lon, lat] of [[15.0, 45.0], [17.6, 45.0], [-70.3, -33.4], [144.9, -37.8], [10.2, 61.5]]) {
      const f = localFrameFor(lon, lat);
      for (const [dlon, dlat] of [[0.02, 0], [0, 0.02], [-0.015, 0.01]]) {
        const [x1, y1] = f.toLocal(lon, lat);
        const [x2, y2] = f.toLocal(lon + dlon, lat + dlat);
        const ref = Geodesic.WGS84.Inverse(lat, lon, lat + dlat, lon + dlon).s12 as number;
        expect(Math.abs(Math.hypot(x2 - x1, y2 - y1) - ref) / ref, `${lon},${lat}`).toBeLessThan(2e-5);
      }
      const [bl, bb] = f.toLonLat(...f.toLocal(lon + 0.01, lat - 0.01));
      expect(bl).toBeCloseTo(lon + 0.01, 9);
      expect(bb).toBeCloseTo(lat - 0.01, 9);
      expect(f.toLocal(lon, lat)[0]).toBeCloseTo(0, 6);
    }
  });

  it('samples exactly as sampleBilinear does, edges, nodata and outside included', () => {
    const grid = utmGrid({ width: 50, height: 40, f: (x, y) => Math.sin(x / 7) * 30 + y });
    grid.data[10 * 50 + 20] = NaN;
    const f = bilinearSampler(grid);
    for (let i = 0; i < 5000; i++) {
      const e = 500_000 - 2 + ((i * 7919) % 5400) / 100, n = 5_000_000 - 2 + ((i * 104729) % 4400) / 100;
      const a = f(e, n), b = sampleBilinear(grid, e, n);
      if (Number.isNaN(b)) expect(a).toBeNaN();
      else expect(a).toBeCloseTo(b, 9);
    }
  });

  it('reads grid heights in its own UTM zone and through a transform for other CRSs', () => {
    const grid = utmGrid({ width: 200, height: 200, f: (x, y) => 100 + x * 0.5 + y * 0.25 });
    const t = createTransform(grid.crs, WGS84);
    const [lon, lat] = t.forward(500_100, 5_000_100);
    const frame = localFrameFor(lon, lat);
    const hs = localHeights(grid, frame);
    const e = frame.originE + 10 * frame.scale, n = frame.originN - 20 * frame.scale;
    expect(hs.heightAt(10, -20)).toBeCloseTo(sampleBilinear(grid, e, n), 9);
    const xs = Float64Array.from([10, 1e6]), ys = Float64Array.from([-20, 0]), out = new Float64Array(2);
    expect(hs.sampleMany(xs, ys, out)).toBe(1); // the far point is off the grid
    expect(out[0]).toBeCloseTo(hs.heightAt(10, -20), 9);
    expect(out[1]).toBeNaN();
    // the same terrain as a geographic grid: heights agree where the planes agree
    const geo = createGrid({ width: 3, height: 3, data: new Float32Array(9).fill(42), transform: [lon - 0.01, 0.01, 0, lat + 0.01, 0, -0.01], crs: WGS84 });
    expect(localHeights(geo, frame).heightAt(5, 5)).toBe(42);
  });
});

import { describe, expect, it } from 'vitest';
import { castPixel, cameraToLocal, footprintOnGrid, intersectRay, photoFootprint, type HeightAt } from '../../terrain/footprint';
import { localFrameFor, localHeights } from '../../terrain/local-frame';
import type { Camera } from '../../terrain/camera';
import { undistortNormalised } from '../../terrain/camera';
import { ONE_INCH, lonLatOf, utmGrid } from './plan-fixtures';
import { TerrainError } from '../../terrain/errors';

const flat = (h: number): HeightAt => () => h;
const film: Camera = { sensorWidthMm: 230, sensorHeightMm: 230, focalLengthMm: 152.4, imageWidthPx: 23000, imageHeightPx: 23000 };

describe('photo footprint over flat ground', () => {
  it('equals the vertical-photo formulas: corners at ±(sensor/2)(H - h)/f, area, GSD at the centre', () => {
    const fp = photoFootprint(ONE_INCH, { xM: 0, yM: 0, altitudeM: 400, yawDeg: 0 }, flat(300));
    const half = { x: (13.2 / 2) * 100 / 8.8, y: (8.8 / 2) * 100 / 8.8 }; // 75 m and 50 m at 100 m above ground
    const [tl, tr, br, bl] = fp.corners;
    expect(tl![0]).toBeCloseTo(-half.x, 9); // image left is west when flying north
    expect(tl![1]).toBeCloseTo(half.y, 9); // image top is forward (north)
    expect(tr![0]).toBeCloseTo(half.x, 9);
    expect(br![1]).toBeCloseTo(-half.y, 9);
    expect(bl![2]).toBe(300);
    expect(fp.areaM2).toBeCloseTo(150 * 100, 6);
    const gsd = (100 * (13.2 / 5472) * 100) / 8.8;
    expect(fp.gsdCm).toBeCloseTo(gsd, 6);
    expect(fp.gsdXCm).toBeCloseTo(gsd, 6);
    expect(fp.gsdYCm).toBeCloseTo(gsd, 6);
    expect(fp.heightAboveCentreM).toBe(100);
  });

  it('turns with the yaw and puts the image width along track when the camera says so', () => {
    const east = photoFootprint(ONE_INCH, { xM: 0, yM: 0, altitudeM: 100, yawDeg: 90 }, flat(0));
    expect(east.corners[0]![0]).toBeCloseTo(50, 9); // top-left: forward (east) 50 m, left (north) 75 m
    expect(east.corners[0]![1]).toBeCloseTo(75, 9);
    const along = photoFootprint({ ...ONE_INCH, alongTrackSide: 'width' }, { xM: 0, yM: 0, altitudeM: 100, yawDeg: 0 }, flat(0));
    const ys = along.corners.map((c) => c![1]);
    const xs = along.corners.map((c) => c![0]);
    expect(Math.max(...ys) - Math.min(...ys)).toBeCloseTo(150, 9); // 13.2 mm side along the track
    expect(Math.max(...xs) - Math.min(...xs)).toBeCloseTo(100, 9);
  });

  // A tilted ray of off-nadir angle θ reaches the ground at range H / cos θ; across the tilt one pixel covers
  // (H / cos θ) p / f, along the tilt (H / cos² θ) p / f (oblique-photo geometry, from memory; derived by hand).
  it('moves and stretches with pitch and roll (nose up looks forward, right wing down looks left)', () => {
    const th = 20;
    const c = Math.cos((th * Math.PI) / 180);
    const fp = photoFootprint(ONE_INCH, { xM: 0, yM: 0, altitudeM: 100, yawDeg: 0, pitchDeg: th }, flat(0));
    expect(fp.centre![1]).toBeCloseTo(100 * Math.tan((th * Math.PI) / 180), 6);
    expect(fp.centre![0]).toBeCloseTo(0, 9);
    const p = 13.2 / 5472;
    expect(fp.gsdXCm).toBeCloseTo(((100 / c) * p * 100) / 8.8, 4);
    expect(fp.gsdYCm).toBeCloseTo(((100 / (c * c)) * p * 100) / 8.8, 4);
    const rolled = photoFootprint(ONE_INCH, { xM: 0, yM: 0, altitudeM: 100, yawDeg: 0, rollDeg: 10 }, flat(0));
    expect(rolled.centre![0]).toBeCloseTo(-100 * Math.tan((10 * Math.PI) / 180), 6);
  });

  it('bends the corner rays by the lens distortion', () => {
    const d = { k1: -0.08, k2: 0.01, k3: 0, p1: 0.0005, p2: -0.0003 };
    const fp = photoFootprint({ ...ONE_INCH, distortion: d }, { xM: 0, yM: 0, altitudeM: 100, yawDeg: 0 }, flat(0));
    const [ux, uy] = undistortNormalised(d, -0.75, -0.5); // top-left corner in normalised image coordinates
    expect(fp.corners[0]![0]).toBeCloseTo(100 * ux, 6); // image x -> east
    expect(fp.corners[0]![1]).toBeCloseTo(-100 * uy, 6); // image y (down) -> south
  });
});

describe('ray–terrain intersection', () => {
  // Ground-length example of Wolf, Dewitt & Wilkinson, "Elements of Photogrammetry", ch. 6 (from memory: a
  // vertical photo, f = 152.4 mm, H = 1385 m above datum, photo coordinates a = (-52.35, -48.27) mm at
  // 204 m and b = (40.64, 43.88) mm at 148 m). X = x (H - h) / f computed by hand gives AB = 1036.5 m.
  it('finds the ground coordinates of two image points over ground at two elevations', () => {
    // ground at 204 m west of x = -100 m, 148 m east of x = +100 m, a ramp between (the nadir is on the ramp)
    const h: HeightAt = (x) => (x <= -100 ? 204 : x >= 100 ? 148 : 176 - 0.28 * x);
    const pose = { xM: 0, yM: 0, altitudeM: 1385, yawDeg: 0 };
    const rot = cameraToLocal(film, pose);
    const pixel = (xmm: number, ymm: number): [number, number] => [11500 + xmm / 0.01, 11500 - ymm / 0.01];
    const A = castPixel(film, pose, rot, ...pixel(-52.35, -48.27), h, { toleranceM: 1e-9 })!;
    const B = castPixel(film, pose, rot, ...pixel(40.64, 43.88), h, { toleranceM: 1e-9 })!;
    expect(A[0]).toBeCloseTo((-52.35 * 1181) / 152.4, 6);
    expect(A[1]).toBeCloseTo((-48.27 * 1181) / 152.4, 6);
    expect(B[0]).toBeCloseTo((40.64 * 1237) / 152.4, 6);
    expect(B[2]).toBe(148);
    expect(Math.hypot(A[0] - B[0], A[1] - B[1])).toBeCloseTo(1036.46, 1);
  });

  it('lands on the terrain and on the ray over a real grid (UTM, bilinear)', () => {
    const grid = utmGrid({ width: 600, height: 600, f: (x, y) => 200 + 40 * Math.sin(x / 60) * Math.cos(y / 80) });
    const [lon, lat] = lonLatOf(grid, 300, 300);
    const frame = localFrameFor(lon, lat);
    const { heightAt } = localHeights(grid, frame);
    const o = [10, -20, 330];
    const d = [0.35, 0.2, -1];
    const g = intersectRay(o[0], o[1], o[2], d[0], d[1], d[2], heightAt, { toleranceM: 1e-7 })!;
    expect(g).not.toBeNull();
    expect(Math.abs(g[2] - heightAt(g[0], g[1]))).toBeLessThan(1e-6);
    const t = (o[2] - g[2]) / -d[2];
    expect(g[0]).toBeCloseTo(o[0] + t * d[0], 4);
    expect(g[1]).toBeCloseTo(o[1] + t * d[1], 4);
  });

  it('finds the first hit where the fixed-point iteration fails: a steep wall in front of the camera', () => {
    // ground 0 m up to x = 50, a wall rising 10 m per metre to 300 m; ray looking 45° forward and down from 100 m
    const h: HeightAt = (x) => Math.min(300, Math.max(0, (x - 50) * 10));
    const g = intersectRay(0, 0, 100, 1, 0, -1, h, { marchStepM: 0.5 })!;
    // the ray z = 100 - x meets the wall z = 10 (x - 50) at x = 600 / 11
    expect(g[0]).toBeCloseTo(600 / 11, 3);
    expect(g[2]).toBeCloseTo(100 - 600 / 11, 2);
  });

  it('returns null for rays at or above the horizon, off the grid or into nodata', () => {
    expect(intersectRay(0, 0, 100, 1, 0, 0, flat(0))).toBeNull();
    expect(intersectRay(0, 0, 100, 0, 0, 1, flat(0))).toBeNull();
    const holey: HeightAt = (x) => (x > 20 ? NaN : 0);
    expect(intersectRay(0, 0, 100, 1, 0, -1, holey)).toBeNull();
    const fp = photoFootprint(ONE_INCH, { xM: 0, yM: 0, altitudeM: 100, yawDeg: 0 }, holey);
    expect(fp.corners[1]).toBeNull(); // top-right corner lies at x = +75 m
    expect(fp.corners[0]).not.toBeNull();
    expect(fp.areaM2).toBeNull();
  });

  it('works on a grid for a pose in longitude/latitude, handing corners back in longitude/latitude', () => {
    const grid = utmGrid({ width: 600, height: 600, f: () => 250 });
    const [lon, lat] = lonLatOf(grid, 300, 300);
    const fp = footprintOnGrid(grid, ONE_INCH, { lon, lat, altitudeM: 350, yawDeg: 0 });
    const frame = localFrameFor(lon, lat);
    const [x0, y0] = frame.toLocal(fp.corners[0]!.lon, fp.corners[0]!.lat);
    expect(x0).toBeCloseTo(-75, 6); // 100 m above the ground: 150 m x 100 m, top-left to the north-west
    expect(y0).toBeCloseTo(50, 6);
    expect(fp.corners[2]!.groundM).toBe(250);
    expect(fp.areaM2).toBeCloseTo(15000, 3);
    expect(fp.centre!.lon).toBeCloseTo(lon, 9);
    expect(() => footprintOnGrid(grid, ONE_INCH, { lon, lat: 89, altitudeM: 350, yawDeg: 0 })).toThrow(TerrainError);
  });

  it('throws invalid-input on a pose without a position', () => {
    expect(() => photoFootprint(ONE_INCH, { xM: NaN, yM: 0, altitudeM: 100, yawDeg: 0 }, flat(0))).toThrow(TerrainError);
  });
});

import { describe, expect, it } from 'vitest';
import {
  CAMERA_PRESETS, cameraPreset, checkCamera, distortNormalised, pixelPitchMm, pixelPitchHeightMm, pixelRay, trackSides, undistortNormalised,
  type Camera,
} from '../../terrain/camera';
import { TerrainError } from '../../terrain/errors';

const oneInch: Camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };

// Typical sensor sizes per format, from the table "Sensor format types and dimensions" of the Wikipedia
// article "Image sensor format" (inch types are not standardised; these are the values listed there).
// APS-C varies by maker (about 22.2-23.7 x 14.8-15.7 mm, from memory); 23.5 x 15.6 is the common one.
const FORMAT_SIZES: Array<[RegExp, number, number]> = [
  [/^1\/2\.3-inch type/, 6.17, 4.55],
  [/^1-inch type/, 13.2, 8.8],
  [/^Micro Four Thirds/, 17.3, 13.0],
  [/^APS-C/, 23.5, 15.6],
  [/^Full frame 36 x 24 mm/, 36, 24],
];

describe('camera presets', () => {
  it('name a generic class (format, megapixels, lens) and carry the sensor size true to that format', () => {
    expect(CAMERA_PRESETS.length).toBeGreaterThanOrEqual(5);
    for (const p of CAMERA_PRESETS) {
      expect(p.label).toMatch(/^[A-Za-z0-9/.\- ]+, \d+ MP, [\d.]+ mm lens$/);
      const fmt = FORMAT_SIZES.find(([re]) => re.test(p.label));
      expect(fmt, p.label).toBeDefined();
      expect(p.camera.sensorWidthMm).toBe(fmt![1]);
      expect(p.camera.sensorHeightMm).toBe(fmt![2]);
      const mp = Number(/, (\d+) MP/.exec(p.label)![1]);
      expect(Math.abs((p.camera.imageWidthPx * p.camera.imageHeightPx) / 1e6 - mp)).toBeLessThan(1.5);
      expect(p.label).toContain(`${p.camera.focalLengthMm} mm lens`);
      expect(() => checkCamera(p.camera)).not.toThrow();
    }
  });

  it('are found by id and are frozen', () => {
    const p = cameraPreset('one-inch-20mp-8.8mm');
    expect(p?.camera).toEqual(oneInch);
    expect(cameraPreset('nope')).toBeUndefined();
    expect(Object.isFrozen(p!.camera)).toBe(true);
  });
});

describe('pixel pitch and track sides', () => {
  it('is sensor size over pixels: 13.2 mm / 5472 px = 2.4123 µm (computed by hand)', () => {
    expect(pixelPitchMm(oneInch)).toBeCloseTo(0.0024122807, 10);
    expect(pixelPitchHeightMm(oneInch)).toBeCloseTo(8.8 / 3648, 12);
  });

  it('puts the image width across track unless the camera says the width runs along track', () => {
    expect(trackSides(oneInch)).toEqual({ acrossPx: 5472, alongPx: 3648, acrossMm: 13.2, alongMm: 8.8 });
    expect(trackSides({ ...oneInch, alongTrackSide: 'width' })).toEqual({ acrossPx: 3648, alongPx: 5472, acrossMm: 8.8, alongMm: 13.2 });
  });
});

describe('Brown distortion', () => {
  // Formula as documented for OpenCV's camera model (calib3d "Camera Calibration and 3D Reconstruction"):
  // x'' = x (1 + k1 r² + k2 r⁴ + k3 r⁶) + 2 p1 x y + p2 (r² + 2x²); values below computed by hand.
  it('moves a point by the radial and tangential terms', () => {
    const [xd, yd] = distortNormalised({ k1: 0.1, k2: 0, k3: 0, p1: 0, p2: 0 }, 0.5, 0);
    expect(xd).toBeCloseTo(0.5 * (1 + 0.1 * 0.25), 15); // 0.5125
    expect(yd).toBe(0);
    const [tx, ty] = distortNormalised({ k1: 0, k2: 0, k3: 0, p1: 0.01, p2: 0.02 }, 0.3, 0.4);
    // r² = 0.25: x += 2*0.01*0.12 + 0.02*(0.25 + 0.18) = 0.0024 + 0.0086; y += 0.01*(0.25 + 0.32) + 2*0.02*0.12 = 0.0057 + 0.0048
    expect(tx).toBeCloseTo(0.311, 12);
    expect(ty).toBeCloseTo(0.4105, 12);
  });

  it('is undone by the iterative inverse', () => {
    const d = { k1: -0.12, k2: 0.05, k3: -0.01, p1: 0.001, p2: -0.0008 };
    for (const [x, y] of [[0.3, -0.2], [0.7, 0.5], [-0.6, 0.1], [0, 0]]) {
      const [xd, yd] = distortNormalised(d, x, y);
      const [ux, uy] = undistortNormalised(d, xd, yd);
      expect(ux).toBeCloseTo(x, 10);
      expect(uy).toBeCloseTo(y, 10);
    }
  });

  it('bends the corner ray and not the principal ray', () => {
    const plain = pixelRay(oneInch, 0, 0);
    const bent = pixelRay({ ...oneInch, distortion: { k1: -0.1, k2: 0, k3: 0, p1: 0, p2: 0 } }, 0, 0);
    expect(plain[0]).toBeCloseTo(-0.75, 12); // half width 6.6 mm over 8.8 mm
    expect(plain[1]).toBeCloseTo(-0.5, 12);
    // barrel distortion (k1 < 0) pulls image points in, so the true ray of a corner pixel is wider
    expect(Math.abs(bent[0])).toBeGreaterThan(0.75);
    expect(pixelRay({ ...oneInch, distortion: { k1: -0.1, k2: 0, k3: 0, p1: 0, p2: 0 } }, 2736, 1824)).toEqual([0, 0]);
  });

  it('honours an off-centre principal point', () => {
    const cam = { ...oneInch, principalPointPx: { x: 2700, y: 1800 } };
    expect(pixelRay(cam, 2700, 1800)).toEqual([0, 0]);
  });
});

describe('checkCamera', () => {
  it('throws invalid-input on bad records, saying which field', () => {
    const bad: Array<[Partial<Camera>, RegExp]> = [
      [{ sensorWidthMm: 0 }, /sensorWidthMm/],
      [{ focalLengthMm: -1 }, /focalLengthMm/],
      [{ imageWidthPx: 100.5 }, /whole pixels/],
      [{ alongTrackSide: 'up' as never }, /alongTrackSide/],
      [{ principalPointPx: { x: -1, y: 0 } }, /principalPointPx/],
      [{ distortion: { k1: NaN, k2: 0, k3: 0, p1: 0, p2: 0 } }, /distortion\.k1/],
    ];
    for (const [patch, re] of bad) {
      const run = () => checkCamera({ ...oneInch, ...patch });
      expect(run).toThrow(TerrainError);
      expect(run).toThrow(re);
    }
    expect(() => checkCamera(null as never)).toThrow(TerrainError);
  });

  it('does not mutate its input', () => {
    const cam = { ...oneInch, distortion: { k1: 0.01, k2: 0, k3: 0, p1: 0, p2: 0 } };
    const copy = JSON.parse(JSON.stringify(cam));
    checkCamera(cam);
    pixelRay(cam, 10, 10);
    expect(cam).toEqual(copy);
  });
});

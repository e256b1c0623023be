import { describe, expect, it } from 'vitest';
import { cameraToLocal, castPixel, type CameraPose } from '../../terrain/footprint';
import { projectToImage } from '../../terrain/pose';
import type { Camera } from '../../terrain/camera';

const camera: Camera = {
  sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648,
  distortion: { k1: -0.02, k2: 0.01, k3: 0, p1: 0.0005, p2: -0.0003 },
};
const hill = (x: number, y: number) => 20 * Math.sin(x / 60) + 10 * Math.cos(y / 45);

describe('projection of a ground point into a photo', () => {
  it('returns the pixel whose ray was cast onto the ground (round trip through pose, mount tilt and distortion)', () => {
    const pose: CameraPose = { xM: 10, yM: -5, altitudeM: 120, yawDeg: 37, pitchDeg: 3, rollDeg: -4, mountTiltDeg: 20 };
    const rot = cameraToLocal(camera, pose);
    for (const [u, v] of [[0, 0], [5472, 0], [2736, 1824], [1000, 3000], [5000, 200]]) {
      const g = castPixel(camera, pose, rot, u, v, hill, { toleranceM: 1e-9 });
      expect(g).not.toBeNull();
      const back = projectToImage(camera, pose, g![0], g![1], g![2]);
      expect(back![0]).toBeCloseTo(u, 4);
      expect(back![1]).toBeCloseTo(v, 4);
    }
  });

  it('puts the image centre H·tan(tilt) ahead of the aircraft for a camera tilted forward on its mount (right-triangle trigonometry)', () => {
    const flat = () => 0;
    const H = 100;
    for (const [yaw, tilt] of [[0, 30], [90, 45], [210, -20]]) {
      const pose: CameraPose = { xM: 0, yM: 0, altitudeM: H, yawDeg: yaw, mountTiltDeg: tilt };
      const c = castPixel(camera, pose, cameraToLocal(camera, pose), 2736, 1824, flat, { toleranceM: 1e-9 })!;
      const ahead = H * Math.tan((tilt * Math.PI) / 180);
      expect(c[0]).toBeCloseTo(ahead * Math.sin((yaw * Math.PI) / 180), 6);
      expect(c[1]).toBeCloseTo(ahead * Math.cos((yaw * Math.PI) / 180), 6);
    }
  });

  it('says a point behind the camera is not in the photo', () => {
    const pose: CameraPose = { xM: 0, yM: 0, altitudeM: 100, yawDeg: 0 };
    expect(projectToImage(camera, pose, 0, 0, 150)).toBeNull();
  });
});

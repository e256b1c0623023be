import { describe, expect, it } from 'vitest';
import { viewGsdCm } from '../../terrain/view-gsd';
import { cameraToLocal, castPixel, type CameraPose } from '../../terrain/footprint';
import type { Camera } from '../../terrain/camera';

const camera: Camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };
const p = 13.2 / 5472; // pixel pitch, mm (square pixels)
const fPx = 8.8 / p;
const DEG = Math.PI / 180;

/** GSD of the view of ground point g from the pose, on a plane with unit normal n. */
function gsdAt(pose: CameraPose, g: [number, number, number], n: [number, number, number]): number {
  const rot = cameraToLocal(camera, pose);
  const dx = g[0] - pose.xM, dy = g[1] - pose.yM, dz = g[2] - pose.altitudeM;
  const R = Math.hypot(dx, dy, dz);
  return viewGsdCm(rot, fPx, fPx, R, dx / R, dy / R, dz / R, n[0], n[1], n[2]);
}

describe('GSD of a view from slant range, off-axis angle and incidence', () => {
  it('is H·p/f at every pixel of a vertical photo over level ground (Wolf, Dewitt & Wilkinson, Elements of Photogrammetry, ch. 6: a vertical photo of flat ground has the one scale f/H)', () => {
    const pose: CameraPose = { xM: 0, yM: 0, altitudeM: 90, yawDeg: 33 };
    const rot = cameraToLocal(camera, pose);
    for (const [u, v] of [[0, 0], [5472, 3648], [2736, 1824], [4000, 100]]) {
      const g = castPixel(camera, pose, rot, u, v, () => 0)!;
      expect(gsdAt(pose, g, [0, 0, 1])).toBeCloseTo(((90 * p) / 8.8) * 100, 9);
    }
  });

  it('is (R·p/f) / cos β on the optical axis of a tilted camera over sloping ground (hand computation)', () => {
    // Hand computation. Camera 100 m above the datum at the origin, flying east (yaw 90°), tilted 20° forward on its
    // mount and pitched 5° nose down (which turns a downward axis 5° back), so its axis points 15° from nadir towards
    // the east. Ground: a plane rising to
    // the east at 25°, z = x·tan 25°, normal n = (−sin 25°, 0, cos 25°).
    // Axis a = (sin 15°, 0, −cos 15°); ray x = R sin 15°, z = 100 − R cos 15° meets the plane where
    //   100 − R cos 15° = R sin 15° tan 25°  =>  R = 100 / (cos 15° + sin 15° tan 25°).
    // Incidence: cos β = −n·a = sin 25° sin 15° + cos 25° cos 15° = cos(25° − 15°) = cos 10°.
    // Along the image axis in the slope's plane the pixel's ray-normal width R·p/f stretches by 1/cos β
    // (GSD / sin(elevation angle), as the ground-plane GSD of oblique imagery: Leachtenauer et al., GIQE, Applied
    // Optics 36(32), 1997, from memory); across it the plane is level, so the coarser side is (R·p/f)/cos β.
    const R = 100 / (Math.cos(15 * DEG) + Math.sin(15 * DEG) * Math.tan(25 * DEG));
    const expected = ((R * p) / 8.8 / Math.cos(10 * DEG)) * 100;
    const pose: CameraPose = { xM: 0, yM: 0, altitudeM: 100, yawDeg: 90, pitchDeg: -5, mountTiltDeg: 20 };
    const g: [number, number, number] = [R * Math.sin(15 * DEG), 0, 100 - R * Math.cos(15 * DEG)];
    expect(g[2]).toBeCloseTo(g[0] * Math.tan(25 * DEG), 9);
    expect(gsdAt(pose, g, [-Math.sin(25 * DEG), 0, Math.cos(25 * DEG)])).toBeCloseTo(expected, 9);
  });

  it('agrees off the axis with the ground distance between neighbouring pixels cast onto the sloping plane (numerical difference)', () => {
    const slope = 0.4;
    const ground = (x: number, y: number) => 0.3 * x + slope * y;
    const nl = Math.hypot(0.3, slope, 1);
    const n: [number, number, number] = [-0.3 / nl, -slope / nl, 1 / nl];
    const pose: CameraPose = { xM: 5, yM: -10, altitudeM: 120, yawDeg: 20, pitchDeg: -3, rollDeg: 4, mountTiltDeg: 15 };
    const rot = cameraToLocal(camera, pose);
    for (const [u, v] of [[500, 400], [5000, 3300], [2736, 300]]) {
      const c = (du: number, dv: number) => castPixel(camera, pose, rot, u + du, v + dv, ground, { toleranceM: 1e-10 })!;
      const side = (a: number[], b: number[]) => (Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]) / 2) * 100;
      const numerical = Math.max(side(c(-1, 0), c(1, 0)), side(c(0, -1), c(0, 1)));
      const g = c(0, 0);
      expect(Math.abs(gsdAt(pose, [g[0], g[1], g[2]], n) / numerical - 1)).toBeLessThan(1e-4);
    }
  });
});

import { describe, expect, it } from 'vitest';
import { gsdStretch } from '../../terrain/solve-line';
import { viewGsdCm } from '../../terrain/view-gsd';
import { cameraToLocal, type CameraPose } from '../../terrain/footprint';
import type { Camera } from '../../terrain/camera';

// A 1-inch-type survey camera (13.2 x 8.8 mm, 8.8 mm lens, 5472 x 3648 px), as in the demo mission.
const camera: Camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };
const p = 13.2 / 5472;
const fPx = 8.8 / p;
const DEG = Math.PI / 180;

describe('how much coarser than h·p/f a vertical photo sees ground off to the side of its line', () => {
  it('is cos φ / cos(φ + β) across a plane falling away from the line at β, seen φ off the vertical (hand computation)', () => {
    // Hand computation. Camera h above the point's height, flying north; the point x = h·tan φ east of the camera on
    // a plane z = −x·tan β (falling away from the line for β > 0), normal n = (sin β, 0, cos β), ray r = (sin φ, 0,
    // −cos φ). Along the east image axis e: n·e = sin β, n·r = sin β sin φ − cos β cos φ = −cos(φ + β), so
    // e − r (n·e)/(n·r) = (cos φ cos β, 0, −cos φ sin β) / cos(φ + β), of length cos φ / cos(φ + β); along the north axis n·e = 0 and the length is 1. GSD_e = h·p/f times that (the raster's
    // formula, view-gsd.ts: Wolf, Dewitt & Wilkinson ch. 6 and Hartley & Zisserman §13.1, from memory).
    const h = 90;
    for (const phiDeg of [0, 15, 30]) for (const betaDeg of [-20, -5, 0, 10, 25]) {
      const phi = phiDeg * DEG, beta = betaDeg * DEG;
      const x = h * Math.tan(phi);
      // ground gradient of z = −x·tan β: (−tan β, 0)
      const got = gsdStretch(0, 1, x, 0, h, -Math.tan(beta), 0);
      expect(got).toBeCloseTo(Math.max(1, Math.cos(phi) / Math.cos(phi + beta)), 9);
    }
  });

  it('agrees with the coverage raster\'s GSD of the same view (a vertical camera, any heading, any slope)', () => {
    let seed = 7;
    const rnd = () => { seed = (seed * 1103515245 + 12345) % 2 ** 31; return seed / 2 ** 31; };
    for (let k = 0; k < 200; k++) {
      const yawDeg = 360 * rnd(), h = 40 + 80 * rnd();
      const across = (rnd() - 0.5) * 1.2 * h, gx = (rnd() - 0.5) * 1.2, gy = (rnd() - 0.5) * 1.2;
      const ux = Math.sin(yawDeg * DEG), uy = Math.cos(yawDeg * DEG);
      // the point `across` to the right of the flying direction, h below the camera at the origin
      const hx = uy * across, hy = -ux * across;
      const stretch = gsdStretch(ux, uy, hx, hy, h, gx, gy);
      const pose: CameraPose = { xM: 0, yM: 0, altitudeM: h, yawDeg };
      const rot = cameraToLocal(camera, pose);
      const R = Math.hypot(hx, hy, h);
      const nl = Math.hypot(gx, gy, 1);
      const n = [-gx / nl, -gy / nl, 1 / nl];
      if (!Number.isFinite(stretch)) {
        // the ray meets the back of the ground: the raster counts no view there
        expect(n[0] * hx + n[1] * hy - n[2] * h).toBeGreaterThanOrEqual(0);
        continue;
      }
      const gsd = viewGsdCm(rot, fPx, fPx, R, hx / R, hy / R, -h / R, n[0], n[1], n[2]);
      expect(stretch * ((h * p) / 8.8) * 100).toBeCloseTo(gsd, 6);
    }
  });
});

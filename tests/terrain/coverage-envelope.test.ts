import { describe, expect, it } from 'vitest';
import { computeCoverage, type CoveragePhoto } from '../../terrain/coverage';
import { crabAngleDeg, type AttitudeEnvelope } from '../../terrain/attitude-envelope';
import { cameraToLocal } from '../../terrain/footprint';
import { imageModel, insideImage, projectPoint } from '../../terrain/pose';
import type { Camera } from '../../terrain/camera';
import { syntheticSite } from './coverage-site';
import { cellX, cellY } from '../../terrain/coverage-grid';

const camera: Camera = {
  sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648,
  distortion: { k1: -0.02, k2: 0.005, k3: 0, p1: 0, p2: 0 },
};
const hills = (x: number, y: number) => 15 * Math.sin(x / 60) + 10 * Math.cos(y / 45);

/**
 * Independent brute force: per cell, the photos that keep the point inside the image at each of many attitudes
 * drawn from the envelope box (its 8 corners, a 5 x 5 x 5 lattice and 300 uniform random draws, fixed seed).
 * A sample can miss the worst attitude, so this count is an upper bound of the true guaranteed count.
 */
function bruteForce(photos: CoveragePhoto[], env: AttitudeEnvelope, xs: ArrayLike<number>, ys: ArrayLike<number>, zs: ArrayLike<number>, inside: Uint8Array): Int32Array {
  const m = imageModel(camera);
  let s = 7;
  const rnd = () => { s = (s * 16807) % 2147483647; return s / 2147483647; };
  const rotsPerPhoto = photos.map((p) => {
    const crab = p.crabDeg ?? 0;
    const yaw = (f: number) => p.yawDeg + Math.min(0, crab) + f * Math.abs(crab);
    const att: Array<[number, number, number]> = [];
    for (const a of [0, 1]) for (const b of [0, 1]) for (const c of [0, 1]) att.push([yaw(a), -env.pitchDeg + 2 * env.pitchDeg * b, -env.rollDeg + 2 * env.rollDeg * c]);
    for (let a = 0; a < 5; a++) for (let b = 0; b < 5; b++) for (let c = 0; c < 5; c++) att.push([yaw(a / 4), -env.pitchDeg + (env.pitchDeg * b) / 2, -env.rollDeg + (env.rollDeg * c) / 2]);
    for (let k = 0; k < 300; k++) att.push([yaw(rnd()), env.pitchDeg * (2 * rnd() - 1), env.rollDeg * (2 * rnd() - 1)]);
    return att.map(([yawDeg, pitchDeg, rollDeg]) => cameraToLocal(camera, { ...p, yawDeg, pitchDeg, rollDeg }));
  });
  const out = new Int32Array(xs.length);
  const uv = new Float64Array(2);
  for (let i = 0; i < xs.length; i++) {
    if (!inside[i]) continue;
    photos.forEach((p, j) => {
      for (const rot of rotsPerPhoto[j]) {
        if (!projectPoint(m, rot, p.xM, p.yM, p.altitudeM, xs[i], ys[i], zs[i], uv) || !insideImage(m, uv[0], uv[1])) return;
      }
      out[i]++;
    });
  }
  return out;
}

function layout(crabDeg: number): CoveragePhoto[] {
  const photos: CoveragePhoto[] = [];
  for (let line = 0; line < 3; line++) for (let k = 0; k < 5; k++) photos.push({ xM: -60 + line * 60, yM: -80 + k * 40, altitudeM: 130, yawDeg: line % 2 ? 180 : 0, crabDeg });
  return photos;
}

describe('guaranteed views under the attitude envelope', () => {
  for (const [name, env, crab] of [
    ['±5° roll and pitch, no crab (multirotor)', { rollDeg: 5, pitchDeg: 5, windMps: 0, windFromDeg: 0, airspeedMps: 10, crabs: false, stepDeg: 5 }, 0],
    ['±12° roll, ±4° pitch and the crab of a 6 m/s crosswind at 16 m/s (fixed wing)', { rollDeg: 12, pitchDeg: 4, windMps: 6, windFromDeg: 270, airspeedMps: 16, crabs: true, stepDeg: 5 }, crabAngleDeg(0, 6, 270, 16)],
  ] as Array<[string, AttitudeEnvelope, number]>) {
    it(`never count a view that a brute-force perturbation loses, and lose few it keeps: ${name}`, () => {
      const site = syntheticSite(300, 2, hills);
      const photos = layout(crab);
      const opts = { cellM: 4, specGsdCm: 10, occlusion: false };
      const guaranteed = computeCoverage(site.grid, site.frame, site.area(-150, -150, 150, 150), camera, photos, { ...opts, envelope: env });
      const { cells } = guaranteed;
      const xs = Float64Array.from(cells.z, (_, i) => cellX(cells, i)), ys = Float64Array.from(cells.z, (_, i) => cellY(cells, i));
      const brute = bruteForce(photos, env, xs, ys, cells.z, cells.inside);
      let ours = 0, theirs = 0, planned = 0;
      for (let i = 0; i < cells.z.length; i++) {
        if (!cells.inside[i]) continue;
        expect(guaranteed.views[i], `cell ${i}`).toBeLessThanOrEqual(brute[i]);
        ours += guaranteed.views[i]; theirs += brute[i]; planned += guaranteed.viewsPlanned[i];
      }
      // the envelope costs views (the test is not vacuous) and the safety margin costs few more than it must
      expect(theirs).toBeLessThan(0.9 * planned);
      expect(ours).toBeGreaterThan(0.97 * theirs);
    }, 60_000);
  }

  it('crabs into the crosswind: asin(crosswind / airspeed), nose towards the wind', () => {
    // wind from the west (270°) across a northbound track pushes east: the nose turns west (negative)
    expect(crabAngleDeg(0, 6, 270, 16)).toBeCloseTo((-Math.asin(6 / 16) * 180) / Math.PI, 9);
    expect(crabAngleDeg(180, 6, 270, 16)).toBeCloseTo((Math.asin(6 / 16) * 180) / Math.PI, 9);
    expect(crabAngleDeg(90, 6, 270, 16)).toBeCloseTo(0, 9); // headwind
    expect(() => crabAngleDeg(0, 20, 90, 16)).toThrow(/cannot be held/);
  });
});

import { describe, expect, it } from 'vitest';
import { addView, sigmaFromNormal } from '../../terrain/ray-intersection';
import { cameraToLocal } from '../../terrain/footprint';
import { computeCoverage } from '../../terrain/coverage';
import type { Camera } from '../../terrain/camera';
import { syntheticSite } from './coverage-site';
import { cellX, cellY } from '../../terrain/coverage-grid';

const camera: Camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };
const pitchMm = 13.2 / 5472;

/**
 * Normal case of stereophotogrammetry (two vertical photos, base B, flying height H above flat ground, principal
 * distance c): σZ = (H/B)·(H/c)·σpx with σpx the x-parallax error (Kraus, Photogrammetry, vol. 1, the normal case's
 * accuracy; from memory, page not verified). With independent image errors σx in
 * each photo σpx = √2·σx; the formula holds for a point midway between the two photos (it is where x-parallax
 * alone fixes the height and the y coordinates add nothing to Z).
 */
function normalCaseSigmaZ(H: number, B: number, cMm: number, sigmaXmm: number): number {
  return (H / B) * ((H * 1000) / cMm) * Math.SQRT2 * sigmaXmm / 1000;
}

describe('advisory point precision from the least-squares intersection of rays', () => {
  it('matches the normal-case stereo formula for two vertical photos over flat ground', () => {
    for (const [H, B] of [[100, 30], [80, 20], [150, 60]]) {
      const N = new Float64Array(6);
      for (const x of [-B / 2, B / 2]) {
        const rot = cameraToLocal(camera, { xM: x, yM: 0, altitudeM: H, yawDeg: 90 }); // base along the image height
        addView(N, 0, rot, 8.8 / pitchMm, 8.8 / pitchMm, 0 - x, 0, -H, 0.5);
      }
      const out = new Float64Array(2);
      sigmaFromNormal(N, 0, out);
      expect(out[1]).toBeCloseTo(normalCaseSigmaZ(H, B, 8.8, 0.5 * pitchMm), 9);
      // planimetry of the same intersection: each photo fixes X and Y to (H/c)·σx (the scale relation); two
      // independent photos average to (H/c)·σx/√2 in each (derived here, no textbook figure)
      expect(out[0]).toBeCloseTo(((H / 8.8) * 0.5 * pitchMm) / Math.SQRT2, 9);
    }
  });

  it('gives the same figure through the coverage raster for the cell midway between two photos', () => {
    const site = syntheticSite(120, 1, () => 200);
    const H = 100, B = 30;
    const raster = computeCoverage(site.grid, site.frame, site.area(-20, -20, 20, 20), camera,
      [{ xM: -B / 2, yM: 0, altitudeM: 200 + H, yawDeg: 90 }, { xM: B / 2, yM: 0, altitudeM: 200 + H, yawDeg: 90 }],
      { cellM: 1, specGsdCm: 3, imageErrorPx: 0.5 });
    const { cells } = raster;
    let best = -1, dist = Infinity;
    for (let i = 0; i < cells.z.length; i++) {
      if (!cells.inside[i]) continue;
      const d = Math.hypot(cellX(cells, i), cellY(cells, i));
      if (d < dist) { dist = d; best = i; }
    }
    expect(dist).toBeLessThan(0.8);
    expect(raster.views[best]).toBe(2);
    // within 1 %: the cell centre lies up to a cell's half-diagonal off the midpoint
    expect(raster.sigmaVerticalM[best]).toBeCloseTo(normalCaseSigmaZ(H, B, 8.8, 0.5 * pitchMm), 3);
    expect(Math.abs(raster.sigmaVerticalM[best] / normalCaseSigmaZ(H, B, 8.8, 0.5 * pitchMm) - 1)).toBeLessThan(0.01);
    // angle between the two rays: 2·atan(B/2 / H) (plane trigonometry)
    expect(raster.maxRayAngleDeg[best]).toBeCloseTo((2 * Math.atan(B / 2 / H) * 180) / Math.PI, 0);
  });

  it('gives no σ where a single ray cannot fix the point', () => {
    const N = new Float64Array(6);
    addView(N, 0, cameraToLocal(camera, { xM: 0, yM: 0, altitudeM: 100, yawDeg: 0 }), 3648, 3648, 3, 4, -100, 0.5);
    const out = new Float64Array(2);
    sigmaFromNormal(N, 0, out);
    expect(out[0]).toBeNaN();
    expect(out[1]).toBeNaN();
  });
});

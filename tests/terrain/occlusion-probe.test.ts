// The occlusion march's probe: a sample named in the ray's eleventh number is read first (where a neighbouring
// ray to the same camera was hidden). It is a shortcut only: whatever sample it names, the answer must be the
// march's own, which is what the coverage raster's exact pass (`exactPass`) is held to cell for cell elsewhere.
import { describe, expect, it } from 'vitest';
import { heightLattice, occludedRay } from '../../terrain/occlusion';

/** Rough ground with ridges on a 2 m lattice of 120 x 120 nodes; a fixed-seed generator (no two runs differ). */
function roughLattice() {
  const nx = 120, ny = 120, step = 2;
  let seed = 12345;
  const rand = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
  const h = new Float32Array(nx * ny);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const x = i * step, y = j * step;
      h[j * nx + i] = 30 * Math.sin(x / 23) * Math.cos(y / 31) + (Math.abs(x - 120) < 6 ? 25 : 0) + 2 * rand();
    }
  }
  return heightLattice(0, 0, step, nx, ny, h);
}

describe('the occlusion march with a probe sample', () => {
  const L = roughLattice();

  it('answers as the march alone for any probe, and names the sample that hid a hidden ray', () => {
    let seed = 99;
    const rand = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    let hidden = 0, clear = 0, probesTrue = 0, endsBefore = 0;
    for (let k = 0; k < 400; k++) {
      const px = 20 + rand() * 200, py = 20 + rand() * 200;
      const fi = Math.floor(px / 2), fj = Math.floor(py / 2);
      const pz = L.heights[fj * 120 + fi];
      const ox = 20 + rand() * 200, oy = 20 + rand() * 200, oz = 80 + rand() * 60;
      const ray = (probe?: number, from = 0, end = Infinity) => Float64Array.of(px, py, pz, ox, oy, oz, 0.2, L.maxM, end, from, ...(probe === undefined ? [] : [probe]));
      const alone = occludedRay(L, ray());
      if (alone) hidden++; else clear++;
      // the sample that hid it, written back into a probe slot given as 0
      const named = ray(0);
      expect(occludedRay(L, named)).toBe(alone);
      if (alone) {
        expect(named[10]).toBeGreaterThan(0);
        // that sample read first says hidden at once
        expect(occludedRay(L, ray(named[10]))).toBe(true);
        probesTrue++;
        // a march that ends before that sample (a proof covers the rest) does not read it
        const end = (named[10] - 0.5) * L.stepM;
        expect(occludedRay(L, ray(named[10], 0, end))).toBe(occludedRay(L, ray(undefined, 0, end)));
        if (!occludedRay(L, ray(undefined, 0, end))) endsBefore++;
      }
      // any other sample named, before the start, past the ray's end, or beyond the lattice: the march's answer
      for (const probe of [1, 2, 5, 17, 60, 400, 1e6]) expect(occludedRay(L, ray(probe))).toBe(alone);
      // a march that starts later reads its samples from there on: a probe before that start is not read
      expect(occludedRay(L, ray(1, 6))).toBe(occludedRay(L, ray(undefined, 6)));
    }
    // the draws cover both answers
    expect(hidden).toBeGreaterThan(40);
    expect(clear).toBeGreaterThan(40);
    expect(probesTrue).toBe(hidden);
    // and some of those shortened marches find nothing before their end
    expect(endsBefore).toBeGreaterThan(10);
  });
});

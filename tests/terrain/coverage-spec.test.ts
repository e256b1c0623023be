import { describe, expect, it } from 'vitest';
import { coverageCompliance, resolveCoverageInput } from '../../terrain/coverage-spec';
import type { CoverageRaster } from '../../terrain/coverage';
import { resolveMission } from '../../terrain/mission';
import { utmCrs } from '../../terrain/crs';

/** A 6 x 4 raster of 2 m cells, every cell in the area but the top-left one; 6 views and 2 cm everywhere to start with. */
function raster(): CoverageRaster {
  const w = 6, h = 4, n = w * h;
  const inside = new Uint8Array(n).fill(1);
  inside[0] = 0;
  const f = (v: number) => new Float32Array(n).fill(v);
  return {
    cells: { width: w, height: h, transform: [1000, 2, 0, 2000, 0, -2], crs: utmCrs(31, false), cellM: 2, cellAreaM2: 4, inside, z: f(10), nodes: { step: 16, cols: 2, rows: 2, x: new Float64Array(4), y: new Float64Array(4) }, insideCount: n - 1 },
    views: new Uint16Array(n).fill(6), viewsPlanned: new Uint16Array(n).fill(6), viewsAtSpecGsd: new Uint16Array(n).fill(6),
    finestGsdCm: f(2), maxRayAngleDeg: f(40), sigmaVerticalM: f(0.01), sigmaHorizontalM: f(0.005),
    guaranteed: true, envelopeMarginPx: 10, imageErrorPx: 0.5,
  };
}

describe('compliance of a coverage raster with the spec', () => {
  it('gives the share of area per item and each connected failing patch with its area, centre and worst value', () => {
    const r = raster();
    const at = (row: number, col: number) => row * 6 + col;
    // views: a 2 x 2 block (rows 1–2, cols 1–2) with 3 views and, apart from it, one cell with 4 (row 3, col 5)
    for (const [row, col] of [[1, 1], [1, 2], [2, 1], [2, 2]]) r.views[at(row, col)] = 3;
    r.views[at(3, 5)] = 4;
    // GSD: three cells of row 0 (cols 3–5) only reach 3 cm, one has no view at all
    r.finestGsdCm[at(0, 3)] = 3; r.finestGsdCm[at(0, 4)] = 3.4; r.finestGsdCm[at(0, 5)] = NaN;
    // the cell outside the area fails everything but is not counted
    r.views[0] = 0; r.finestGsdCm[0] = NaN;
    const c = coverageCompliance(r, { maxGsdCm: 2.5, minViews: 5, maxSigmaVerticalM: null, maxSigmaHorizontalM: null, maxDirectionGapDeg: null, obliqueDeg: 30 });
    expect(c.cellsInArea).toBe(23);
    expect(c.areaM2).toBe(92);
    const item = (name: string) => c.items.find((it) => it.item === name)!;
    expect(item('views').share).toBeCloseTo(1 - 5 / 23, 12);
    expect(item('views').failingAreaM2).toBe(20);
    expect(item('gsd').share).toBeCloseTo(1 - 3 / 23, 12);
    expect(c.shareAll).toBeCloseTo(1 - 8 / 23, 12);
    expect(c.items.map((it) => it.item)).toEqual(['gsd', 'views']); // no sigma item asked, no unknown ground
    const views = c.patches.filter((p) => p.reason === 'views');
    expect(views.map((p) => p.cells)).toEqual([4, 1]); // largest first
    // the block's centre: columns 1–2 and rows 1–2 -> x = 1000 + 2·2, y = 2000 − 2·2
    expect(views[0].centroidX).toBeCloseTo(1004, 9);
    expect(views[0].centroidY).toBeCloseTo(1996, 9);
    expect(views[0].worst).toBe(3);
    expect(views[0].areaM2).toBe(16);
    const gsd = c.patches.filter((p) => p.reason === 'gsd');
    expect(gsd).toHaveLength(1);
    expect(gsd[0].cells).toBe(3);
    expect(gsd[0].worst).toBeNull(); // one cell has no view at all: the worst there is "none"
    expect(gsd[0].message).toMatch(/no view at or finer than 2.5 cm \(guaranteed under the attitude envelope\); finest there none/);
  });

  it('reports unknown ground as its own item and patch, and checks σ only when the spec asks', () => {
    const r = raster();
    r.cells.z[7] = NaN;
    r.sigmaVerticalM[10] = 0.05;
    const c = coverageCompliance(r, { maxGsdCm: 2.5, minViews: 5, maxSigmaVerticalM: 0.02, maxSigmaHorizontalM: null, maxDirectionGapDeg: null, obliqueDeg: 30 });
    expect(c.items.map((it) => it.item)).toEqual(['gsd', 'views', 'sigma-vertical', 'ground-unknown']);
    expect(c.patches.map((p) => p.reason).sort()).toEqual(['ground-unknown', 'sigma-vertical']);
    expect(c.patches.find((p) => p.reason === 'sigma-vertical')!.worst).toBeCloseTo(0.05, 6);
  });

  it('reads the spec, the envelope and the settings from a mission, with defaults and messages for bad values', () => {
    const base = {
      area: { type: 'Polygon', coordinates: [[[4.48, 46.76], [4.49, 46.76], [4.49, 46.77], [4.48, 46.76]]] },
      camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 },
      targetGsdCm: 2.5, takeoff: { lon: 4.48, lat: 46.76 },
    };
    const plain = resolveCoverageInput(base, resolveMission(base));
    expect(plain.spec).toEqual({ maxGsdCm: 2.5 * 1.1, minViews: 2, maxSigmaVerticalM: null, maxSigmaHorizontalM: null, maxDirectionGapDeg: null, obliqueDeg: 30 });
    expect(plain.envelope).toBeNull();
    expect(plain.settings).toEqual({ cellM: null, maxCells: 4_000_000, imageErrorPx: 0.5, occlusion: true });
    const fw = { ...base, envelope: { preset: 'fixed-wing', windMps: 7, rollDeg: 10 } };
    expect(resolveCoverageInput(fw, resolveMission(fw)).envelope).toEqual({ rollDeg: 10, pitchDeg: 8, windMps: 7, windFromDeg: 0, airspeedMps: 10, crabs: true, stepDeg: 5 });
    const bad = { ...base, envelope: { rollDeg: 60 } };
    expect(() => resolveCoverageInput(bad, resolveMission(bad))).toThrow(/envelope.rollDeg must be a number from 0 to 45, got 60/);
  });
});

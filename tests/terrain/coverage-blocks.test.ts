import { describe, expect, it } from 'vitest';
import { computeCoverage, type CoverageOptions, type CoveragePhoto, type CoverageRaster } from '../../terrain/coverage';
import { TILE } from '../../terrain/coverage-pass';
import { cellX, cellY, coverageCells } from '../../terrain/coverage-grid';
import { createGrid } from '../../terrain/grid';
import { WGS84, createTransform, utmCrs } from '../../terrain/crs';
import { localFrameFor } from '../../terrain/local-frame';
import type { AttitudeEnvelope } from '../../terrain/attitude-envelope';
import type { Camera } from '../../terrain/camera';
import { syntheticSite } from './coverage-site';

// The block decisions (coverage-blocks.ts, image-bounds.ts) stand in for projecting every cell into every photo;
// here they are held to that per-cell test (`exactPass`) cell for cell, on rough ground with a cliff step.

const plain: Camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };
const distorted: Camera = { ...plain, distortion: { k1: -0.08, k2: 0.02, k3: 0, p1: 0.001, p2: -0.0005 } };
const rough = (x: number, y: number) => 25 * Math.sin(x / 40) * Math.cos(y / 55) + 8 * Math.sin(x / 9 + y / 13) + (x > 40 ? 18 : 0);
const site = syntheticSite(260, 2, rough);
const area = site.area(-240, -235, 240, 235);

/** Three flight lines, some photos rolled and pitched, one line at an odd heading. */
function photos(): CoveragePhoto[] {
  const out: CoveragePhoto[] = [];
  for (let line = 0; line < 4; line++) {
    for (let k = 0; k < 8; k++) {
      out.push({ xM: -150 + line * 100, yM: -170 + k * 48, altitudeM: 90 + 10 * line, yawDeg: line === 3 ? 37 : line % 2 ? 180 : 0, rollDeg: k % 3 === 0 ? 4 : 0, pitchDeg: k % 4 === 1 ? -3 : 0 });
    }
  }
  return out;
}

const bands = ['views', 'viewsPlanned', 'viewsAtSpecGsd', 'finestGsdCm', 'maxRayAngleDeg', 'sigmaHorizontalM', 'sigmaVerticalM'] as const;

/** Cells whose value differs in any band (NaN equals NaN). */
function differences(a: CoverageRaster, b: CoverageRaster): string[] {
  const out: string[] = [];
  for (const band of bands) {
    for (let i = 0; i < a[band].length; i++) if (!Object.is(a[band][i], b[band][i])) out.push(`${band}[${i}]: ${a[band][i]} vs ${b[band][i]}`);
  }
  return out;
}

const envelope: AttitudeEnvelope = { rollDeg: 5, pitchDeg: 5, windMps: 0, windFromDeg: 0, airspeedMps: 10, crabs: false, stepDeg: 5 };

describe('coverage by blocks of cells', () => {
  for (const [name, camera, opts] of [
    ['views only', plain, { viewsOnly: true }],
    ['views only, under an attitude envelope', plain, { viewsOnly: true, envelope }],
    ['views only, lens distortion', distorted, { viewsOnly: true }],
    ['occlusion, GSD, ray angles and σ', plain, {}],
    ['occlusion, GSD, ray angles and σ under an attitude envelope, lens distortion', distorted, { envelope }],
  ] as Array<[string, Camera, Partial<CoverageOptions>]>) {
    it(`gives cell for cell what projecting every cell into every photo gives: ${name}`, () => {
      const o = { cellM: 1.5, specGsdCm: 4, ...opts };
      const blocks = computeCoverage(site.grid, site.frame, area, camera, photos(), o);
      const exact = computeCoverage(site.grid, site.frame, area, camera, photos(), { ...o, exactPass: true });
      expect(differences(blocks, exact).slice(0, 5)).toEqual([]);
      // not vacuous: the area holds cells with no view, cells with many, and cells on footprint edges in between
      const counts = new Set<number>();
      for (let i = 0; i < exact.views.length; i++) if (exact.cells.inside[i]) counts.add(exact.views[i]);
      expect(counts.has(0)).toBe(true);
      expect(Math.max(...counts)).toBeGreaterThan(3);
      expect(counts.size).toBeGreaterThan(3);
    }, 60_000);
  }

  it('stops at the same cell either way: the first cell, tile by tile and row by row in a tile, that the question says true for', () => {
    const full = computeCoverage(site.grid, site.frame, area, plain, photos(), { cellM: 1.5, specGsdCm: 4 });
    const { width, height, inside } = full.cells;
    // the visiting order the raster documents, worked out here on its own
    let first = -1;
    for (let ty = 0; ty * TILE < height && first < 0; ty++) {
      for (let tx = 0; tx * TILE < width && first < 0; tx++) {
        for (let r = ty * TILE; r < Math.min(height, (ty + 1) * TILE) && first < 0; r++) {
          for (let c = tx * TILE; c < Math.min(width, (tx + 1) * TILE); c++) {
            const i = r * width + c;
            if (inside[i] && full.views[i] >= 4 && full.views[i] < 6) { first = i; break; }
          }
        }
      }
    }
    expect(first).toBeGreaterThan(0);
    const stopAt = (i: number, r: CoverageRaster) => r.views[i] >= 4 && r.views[i] < 6;
    for (const exactPass of [false, true]) {
      const r = computeCoverage(site.grid, site.frame, area, plain, photos(), { cellM: 1.5, specGsdCm: 4, stopAt, exactPass });
      expect(r.stoppedAtCell).toBe(first);
      expect(r.views[first]).toBe(full.views[first]);
    }
  }, 60_000);

  it('visits the tiles of `firstCells` first: the same figures in every cell, and a stop in the first of those tiles that holds a cell the question says true for', () => {
    const full = computeCoverage(site.grid, site.frame, area, plain, photos(), { cellM: 1.5, specGsdCm: 4 });
    const { width, height, inside } = full.cells;
    const tiles = Math.ceil(width / TILE) * Math.ceil(height / TILE);
    const tileOf = (i: number) => Math.floor(Math.floor(i / width) / TILE) * Math.ceil(width / TILE) + Math.floor((i % width) / TILE);
    // the last cell in plain order with 4 or 5 views: in plain order its tile is among the last visited
    let late = -1;
    for (let i = inside.length - 1; i >= 0 && late < 0; i--) if (inside[i] && full.views[i] >= 4 && full.views[i] < 6) late = i;
    expect(late).toBeGreaterThan(0);
    expect(tileOf(late)).toBeGreaterThan(tiles / 2);
    const stopAt = (i: number, r: CoverageRaster) => r.views[i] >= 4 && r.views[i] < 6;
    const r = computeCoverage(site.grid, site.frame, area, plain, photos(), { cellM: 1.5, specGsdCm: 4, stopAt, firstCells: [late] });
    // it stopped inside the late cell's tile (the first visited), at a cell the question says true for
    expect(r.stoppedAtCell).toBeDefined();
    expect(tileOf(r.stoppedAtCell!)).toBe(tileOf(late));
    expect(stopAt(r.stoppedAtCell!, full)).toBe(true);
    // with no stop, every figure of every cell is the plain order's
    const reordered = computeCoverage(site.grid, site.frame, area, plain, photos(), { cellM: 1.5, specGsdCm: 4, firstCells: [late, 0, late, width * height - 1] });
    expect(differences(reordered, full).slice(0, 5)).toEqual([]);
    expect(reordered.stoppedAtCell).toBeUndefined();
    expect(() => computeCoverage(site.grid, site.frame, area, plain, photos(), { cellM: 1.5, specGsdCm: 4, firstCells: [width * height] })).toThrow(/firstCells: .* is not a cell/);
  }, 60_000);

  it('adds photos to a raster: the same figures in every cell as the whole raster, with only the tiles the added photos may see worked out again', () => {
    // two low photos (spot photos over the cliff step, one of them rolled) added in the middle of the photo list
    const spots: CoveragePhoto[] = [{ xM: 45, yM: 20, altitudeM: 60, yawDeg: 15 }, { xM: -60, yM: -120, altitudeM: 50, yawDeg: 200, rollDeg: 3 }];
    const base = photos();
    const all = [...base.slice(0, 13), spots[0], ...base.slice(13, 20), spots[1], ...base.slice(20)];
    for (const opts of [{}, { envelope }, { envelope, obliqueDeg: 20 }] as Array<Partial<CoverageOptions>>) {
      const o = { cellM: 1.5, specGsdCm: 4, ...opts };
      const before = computeCoverage(site.grid, site.frame, area, plain, base, o);
      const whole = computeCoverage(site.grid, site.frame, area, plain, all, o);
      const added = computeCoverage(site.grid, site.frame, area, plain, all, { ...o, adding: { raster: before, fresh: [13, 21] } });
      expect(differences(added, whole).slice(0, 5)).toEqual([]);
      if (o.obliqueDeg) for (let i = 0; i < whole.views.length; i++) if (!Object.is(added.directionGapDeg![i], whole.directionGapDeg![i])) throw new Error(`directionGapDeg[${i}]`);
      // not vacuous: the spots add views to some cells and not to others
      let more = 0, same = 0;
      for (let i = 0; i < whole.views.length; i++) if (whole.cells.inside[i]) { if (whole.views[i] > before.views[i]) more++; else same++; }
      expect(more).toBeGreaterThan(100);
      expect(same).toBeGreaterThan(more);
    }
    // asked of a raster it cannot have come from, it says so
    const small = computeCoverage(site.grid, site.frame, site.area(-100, -100, 100, 100), plain, base, { cellM: 1.5, specGsdCm: 4 });
    expect(() => computeCoverage(site.grid, site.frame, area, plain, all, { cellM: 1.5, specGsdCm: 4, adding: { raster: small, fresh: [13] } })).toThrow(/same .* cells/);
    expect(() => computeCoverage(site.grid, site.frame, area, plain, all, { cellM: 1.5, specGsdCm: 4, stopAt: () => false, adding: { raster: small, fresh: [13] } })).toThrow(/not with stopAt/);
  });
});

describe('cell positions blended between exact nodes', () => {
  const frame = localFrameFor(4.48, 46.77);
  const corners = (lon0: number, lat0: number, lon1: number, lat1: number) => ({ type: 'Polygon' as const, coordinates: [[[lon0, lat0], [lon1, lat0], [lon1, lat1], [lon0, lat1], [lon0, lat0]]] });
  // a grid in geographic degrees and one in the next UTM zone east, both over the frame's origin: neither maps
  // to the frame's UTM zone by an affine transform
  const geographic = createGrid({ width: 400, height: 300, data: new Float32Array(400 * 300).fill(200), transform: [4.47, 1e-5 * 4, 0, 46.775, 0, -1e-5 * 4], crs: WGS84 });
  const zone32 = createTransform(WGS84, utmCrs(32, false));
  const [e32, n32] = zone32.forward(4.47, 46.775);
  const nextZone = createGrid({ width: 600, height: 500, data: new Float32Array(600 * 500).fill(200), transform: [Math.floor(e32), 2, 0, Math.ceil(n32), 0, -2], crs: utmCrs(32, false) });
  for (const [name, grid, cellM] of [['geographic grid, 1 m cells', geographic, 1], ['geographic grid, 3 m cells', geographic, 3], ['UTM 32N grid, 2 m cells', nextZone, 2], ['UTM 32N grid, 0.5 m cells', nextZone, 0.5]] as const) {
    it(`lie within 1 mm of the exact transform of every cell centre (PROJ's transform through proj4js): ${name}`, () => {
      const cells = coverageCells(grid, frame, corners(4.472, 46.768, 4.485, 46.7735), cellM);
      const [x0, sx, , yTop, , negSy] = cells.transform;
      const toFrame = createTransform(grid.crs, frame.crs);
      let worst = 0, n = 0;
      for (let r = 0; r < cells.height; r++) {
        for (let c = 0; c < cells.width; c++) {
          const [e, no] = toFrame.forward(x0 + (c + 0.5) * sx, yTop + (r + 0.5) * negSy);
          const x = (e - frame.originE) / frame.scale, y = (no - frame.originN) / frame.scale;
          const i = r * cells.width + c;
          worst = Math.max(worst, Math.hypot(cellX(cells, i) - x, cellY(cells, i) - y));
          n++;
        }
      }
      expect(n).toBeGreaterThan(10_000);
      expect(cells.nodes.step).toBeGreaterThan(1);
      expect(worst).toBeLessThan(1e-3);
    }, 60_000);
  }
});

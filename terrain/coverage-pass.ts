/** The per-cell pass of the coverage raster: for each cell the candidate photos of its tile, the views that count and the figures from them. */
import type { CoverageCells } from './coverage-grid';
import type { CoveragePhoto } from './coverage-photo';
import type { AttitudeEnvelope } from './attitude-envelope';
import { insideImage, projectPoint, type ImageModel } from './pose';
import { viewGsdCm } from './view-gsd';
import { addView, sigmaFromNormal } from './ray-intersection';
import { latticeHeight, occluded, type HeightLattice } from './occlusion';

/** Cells per tile side; each tile is matched once against the photos' boxes. */
export const TILE = 16;
/** A surface seen at less than about 1.1° (cos of the incidence below 0.02) is treated as unseen: back-facing or grazing. */
const MIN_COS_INCIDENCE = 0.02;

/** Whether the offset (dx, dy) from a camera lies in its box in the heading frame (6 numbers from `at`: sin ψ, cos ψ, along and across bounds). */
function inOrientedBox(o: Float64Array, at: number, dx: number, dy: number): boolean {
  const a = o[at] * dx + o[at + 1] * dy, c = o[at + 1] * dx - o[at] * dy;
  return a >= o[at + 2] && a <= o[at + 3] && c >= o[at + 4] && c <= o[at + 5];
}

/** Everything the per-cell pass reads and writes (one small function, so the engine optimises its loops on their own). */
interface CellPass {
  th: number; tw: number; tileLists: Int32Array[];
  /** Per tile, parallel to its photo list: the steepest ground a ray from the tile's cells to that camera crosses. */
  tileSlopes: Float64Array[]; width: number; height: number; inside: Uint8Array; cells: CoverageCells;
  views: Uint16Array; viewsPlanned: Uint16Array; viewsAtSpecGsd: Uint16Array; finestGsdCm: Float32Array; maxRayAngleDeg: Float32Array;
  sigmaHorizontalM: Float32Array; sigmaVerticalM: Float32Array; viewsOnly: boolean; boxes: Float64Array; obox: Float64Array; pos: Float64Array;
  photos: readonly CoveragePhoto[]; model: ImageModel; rots: Float64Array[]; uv: Float64Array; env: AttitudeEnvelope | null; envCount: Int32Array;
  envRots: Float64Array[]; boxTop: Float64Array;
  /** Per photo: the steepest rise of the ground between its footprint and the camera (a ray rising faster cannot be hidden). */
  boxSlope: Float64Array; marginPx: number; lattice: HeightLattice; hStep: number; N: Float64Array; useOcclusion: boolean; tol: number; spec: number;
  rays: Float64Array; sigmaPx: number; sig: Float64Array;
  /** Stop after the first cell for which this says true (null: visit every cell). */
  stop: ((cell: number) => boolean) | null;
}

/** The per-cell pass over the tiles: views and the figures from them. Returns the cell it stopped at (`stop`), else -1. */
export function fillCells(c: CellPass): number {
  const { th, tw, tileLists, tileSlopes, width, height, inside, stop } = c;
  for (let ty = 0; ty < th; ty++) {
    for (let tx = 0; tx < tw; tx++) {
      const list = tileLists[ty * tw + tx], slopes = tileSlopes[ty * tw + tx];
      for (let r = ty * TILE; r < Math.min(height, (ty + 1) * TILE); r++) {
        for (let col = tx * TILE; col < Math.min(width, (tx + 1) * TILE); col++) {
          const i = r * width + col;
          if (!inside[i]) continue;
          visitCell(c, list, slopes, i);
          if (stop !== null && stop(i)) return i;
        }
      }
    }
  }
  return -1;
}

/** One cell: the photos of its tile that see its ground point, and the figures from them (small, so it is optimised early). */
function visitCell(c: CellPass, list: Int32Array, slopes: Float64Array, i: number): void {
  const { cells, views, viewsPlanned, viewsAtSpecGsd, viewsOnly, boxes, obox, pos, photos, model, rots, uv, env, envCount, envRots, boxTop, marginPx, lattice, hStep, N, useOcclusion, tol, spec, rays, sigmaPx, finestGsdCm, maxRayAngleDeg, sig, sigmaHorizontalM, sigmaVerticalM } = c;
  const px = cells.x[i], py = cells.y[i], pz = cells.z[i];
  if (!(pz === pz)) { views[i] = 0; viewsPlanned[i] = 0; viewsAtSpecGsd[i] = 0; return; }
  if (viewsOnly) {
    let count = 0;
    for (let li = 0; li < list.length; li++) {
      const j = list[li];
      const b = j * 4;
      if (px < boxes[b] || px > boxes[b + 2] || py < boxes[b + 1] || py > boxes[b + 3]) continue;
      if (!inOrientedBox(obox, j * 6, px - pos[j * 3], py - pos[j * 3 + 1])) continue;
      const p = photos[j];
      if (!projectPoint(model, rots[j], p.xM, p.yM, p.altitudeM, px, py, pz, uv) || !insideImage(model, uv[0], uv[1])) continue;
      if (env) {
        let ok = true;
        for (let s = 0; s < envCount[j] && ok; s++) ok = projectPoint(model, envRots[j], p.xM, p.yM, p.altitudeM, px, py, pz, uv, s * 9) && insideImage(model, uv[0], uv[1], marginPx);
        if (!ok) continue;
      }
      count++;
    }
    views[i] = count;
    return;
  }
  // ground normal from the lattice (central differences); level where unknown
  let gx = (latticeHeight(lattice, px + hStep, py) - latticeHeight(lattice, px - hStep, py)) / (2 * hStep);
  let gy = (latticeHeight(lattice, px, py + hStep) - latticeHeight(lattice, px, py - hStep)) / (2 * hStep);
  if (!(gx === gx)) gx = 0;
  if (!(gy === gy)) gy = 0;
  const nl = Math.sqrt(gx * gx + gy * gy + 1);
  const nx = -gx / nl, ny = -gy / nl, nz = 1 / nl;
  // the lattice's surface at the point against the cell's own height: a ray leaving the surface and rising faster
  // than any ground it crosses can rise cannot meet that ground (occlusion.ts blockSlope)
  const lift = latticeHeight(lattice, px, py) - pz;
  const nearSurface = lift <= tol;
  let planned = 0, k = 0, atSpec = 0, finest = Infinity;
  N.fill(0);
  for (let li = 0; li < list.length; li++) {
    const j = list[li];
    const b = j * 4;
    if (px < boxes[b] || px > boxes[b + 2] || py < boxes[b + 1] || py > boxes[b + 3]) continue;
    if (!inOrientedBox(obox, j * 6, px - pos[j * 3], py - pos[j * 3 + 1])) continue;
    const p = photos[j];
    const rot = rots[j];
    if (!projectPoint(model, rot, p.xM, p.yM, p.altitudeM, px, py, pz, uv) || !insideImage(model, uv[0], uv[1])) continue;
    const dx = px - p.xM, dy = py - p.yM, dz = pz - p.altitudeM;
    const R = Math.sqrt(dx * dx + dy * dy + dz * dz);
    const rx = dx / R, ry = dy / R, rz = dz / R;
    if (-(nx * rx + ny * ry + nz * rz) < MIN_COS_INCIDENCE) continue;
    if (useOcclusion && !(nearSurface && -dz >= slopes[li] * Math.sqrt(dx * dx + dy * dy)) && occluded(lattice, px, py, pz, p.xM, p.yM, p.altitudeM, tol, boxTop[j])) continue;
    planned++;
    if (env) {
      const er = envRots[j];
      let ok = true;
      for (let s = 0; s < envCount[j] && ok; s++) {
        ok = projectPoint(model, er, p.xM, p.yM, p.altitudeM, px, py, pz, uv, s * 9) && insideImage(model, uv[0], uv[1], marginPx);
      }
      if (!ok) continue;
    }
    const g = viewGsdCm(rot, model.fxPx, model.fyPx, R, rx, ry, rz, nx, ny, nz);
    if (g < finest) finest = g;
    if (g <= spec) atSpec++;
    rays[k * 3] = -rx; rays[k * 3 + 1] = -ry; rays[k * 3 + 2] = -rz;
    addView(N, 0, rot, model.fxPx, model.fyPx, dx, dy, dz, sigmaPx);
    k++;
  }
  views[i] = k;
  viewsPlanned[i] = planned;
  viewsAtSpecGsd[i] = atSpec;
  if (k > 0) finestGsdCm[i] = finest;
  if (k > 1) {
    let minDot = 1;
    for (let a = 0; a < k; a++) {
      const ax = rays[a * 3], ay = rays[a * 3 + 1], az = rays[a * 3 + 2];
      for (let bI = a + 1; bI < k; bI++) {
        const d = ax * rays[bI * 3] + ay * rays[bI * 3 + 1] + az * rays[bI * 3 + 2];
        if (d < minDot) minDot = d;
      }
    }
    maxRayAngleDeg[i] = (Math.acos(Math.max(-1, Math.min(1, minDot))) * 180) / Math.PI;
    sigmaFromNormal(N, 0, sig);
    sigmaHorizontalM[i] = sig[0];
    sigmaVerticalM[i] = sig[1];
  }
}

/** Cells no nadir plan can meet within the limits, with the reason: unknown ground, or a slope that makes the GSD at the clearance height coarser than the spec. */
import { cellX, cellY, type CoverageCells } from './coverage-grid';
import type { CoverageRaster } from './coverage';
import type { CoverageSpec } from './coverage-spec';

/** Per cell: 0 reachable, 1 unknown ground, 2 slope; and the slope of each cell (degrees, NaN unknown). */
export interface Reach {
  code: Uint8Array;
  slopeDeg: Float32Array;
}

/**
 * A photo straight above a cell at the lowest allowed height (clearance plus obstacle allowance) gives the finest
 * GSD a nadir pattern can reach there; on ground sloping at β it spans h·p/f / cos β along the slope (the
 * incidence factor of `view-gsd.ts`). Where even that is coarser than the spec no plan of this pattern meets it.
 */
export function reachability(cells: CoverageCells, spec: CoverageSpec, lowestAglM: number, gsdPerM: number): Reach {
  const { width, height, z, inside } = cells;
  const n = width * height;
  const code = new Uint8Array(n);
  const slopeDeg = new Float32Array(n).fill(NaN);
  const at = (r: number, c: number) => (r >= 0 && r < height && c >= 0 && c < width ? r * width + c : -1);
  for (let r = 0; r < height; r++) {
    for (let c = 0; c < width; c++) {
      const i = r * width + c;
      if (!inside[i]) continue;
      if (!(z[i] === z[i])) { code[i] = 1; continue; }
      // central differences in the local frame (one-sided at the edges and beside unknown ground)
      const slope = (i0: number, i1: number) => {
        const a = i0 >= 0 && z[i0] === z[i0] ? i0 : i, b = i1 >= 0 && z[i1] === z[i1] ? i1 : i;
        if (a === b) return 0;
        const d = Math.hypot(cellX(cells, b) - cellX(cells, a), cellY(cells, b) - cellY(cells, a));
        return d > 0 ? (z[b] - z[a]) / d : 0;
      };
      const gx = slope(at(r, c - 1), at(r, c + 1)), gy = slope(at(r - 1, c), at(r + 1, c));
      const beta = Math.atan(Math.hypot(gx, gy));
      slopeDeg[i] = (beta * 180) / Math.PI;
      if ((lowestAglM * gsdPerM) / Math.cos(beta) > spec.maxGsdCm) code[i] = 2;
    }
  }
  return { code, slopeDeg };
}

/** The raster with the unreachable cells taken out of the area (for compliance over the reachable cells only). */
export function reachableOnly(raster: CoverageRaster, reach: Reach): CoverageRaster {
  const inside = Uint8Array.from(raster.cells.inside);
  let insideCount = 0;
  for (let i = 0; i < inside.length; i++) { if (reach.code[i]) inside[i] = 0; if (inside[i]) insideCount++; }
  return { ...raster, cells: { ...raster.cells, inside, insideCount } };
}

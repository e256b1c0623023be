/** Cells no nadir plan can meet within the limits, with the reason: unknown ground, or a slope that makes the GSD at the clearance height coarser than the spec. */
import type { CoverageCells } from './coverage-grid';
import type { CoverageRaster } from './coverage';
import type { CoverageSpec } from './coverage-spec';

/** Per cell: 0 reachable, 1 unknown ground, 2 slope; and the slope of each cell (degrees, NaN unknown). */
export interface Reach {
  code: Uint8Array;
  slopeDeg: Float32Array;
}

/**
 * A photo straight above a cell at the lowest allowed height (clearance plus obstacle allowance) gives the finest
 * GSD a nadir photo can reach there; on ground sloping at β it spans h·p/f / cos β along the slope (the
 * incidence factor of `view-gsd.ts`). Where even that is coarser than the spec no nadir photo meets it. The slopes
 * are the raster's own (`cellSlopesDeg`), so reach is judged on the ground the proof judges.
 */
export function reachability(cells: CoverageCells, slopes: Float32Array, spec: CoverageSpec, lowestAglM: number, gsdPerM: number): Reach {
  const { width, height, z, inside } = cells;
  const n = width * height;
  const code = new Uint8Array(n);
  const slopeDeg = new Float32Array(n).fill(NaN);
  for (let i = 0; i < n; i++) {
    if (!inside[i]) continue;
    if (!(z[i] === z[i])) { code[i] = 1; continue; }
    slopeDeg[i] = slopes[i];
    if ((lowestAglM * gsdPerM) / Math.cos((slopes[i] * Math.PI) / 180) > spec.maxGsdCm) code[i] = 2;
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

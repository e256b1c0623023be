/**
 * One coverage run of an analysed plan and the document that reports it: the raster over every ground cell, the
 * compliance with the client's spec (share of area per item, failing patches) and the spread of each measure.
 * The command line prints this document and the server stores it with the version, so both say the same.
 */
import type { Grid } from './grid';
import { WGS84, createTransform } from './crs';
import type { PlanResult } from './plan-result';
import type { Mission } from './mission';
import { coverageFrame, planPhotos } from './coverage-photos';
import { computeCoverage, type CoverageRaster } from './coverage';
import { coverageLayout, gridCellM } from './coverage-grid';
import { coverageCompliance, resolveCoverageInput, specRasterOptions, type Compliance, type CoverageSpec } from './coverage-spec';
import { coverageBandNames, COVERAGE_NODATA } from './coverage-raster-file';
import type { AttitudeEnvelope } from './attitude-envelope';
import { TerrainError } from './errors';

const round = (v: number, d: number) => { const f = 10 ** d; return Math.round(v * f) / f; };

/** Most failing patches the document lists (largest first); `patchCount` gives them all. */
const MAX_LISTED_PATCHES = 100;

type Spread = { min: number | null; median: number | null; max: number | null };

/** Min, median and max of a band over the area's cells that have a value. */
function spread(band: ArrayLike<number>, inside: Uint8Array, digits: number): Spread {
  let n = 0;
  for (let i = 0; i < band.length; i++) if (inside[i] && band[i] === band[i]) n++;
  if (n === 0) return { min: null, median: null, max: null };
  const s = new Float32Array(n);
  n = 0;
  for (let i = 0; i < band.length; i++) if (inside[i] && band[i] === band[i]) s[n++] = band[i];
  s.sort();
  return { min: round(s[0], digits), median: round(s[s.length >> 1], digits), max: round(s[s.length - 1], digits) };
}

/** What one coverage run gives: the raster (for the file and the map layers), its compliance and the document. */
interface CoverageRun {
  raster: CoverageRaster;
  spec: CoverageSpec;
  envelope: AttitudeEnvelope | null;
  compliance: Compliance;
  document: CoverageDocument;
}

/** The coverage document (contracts/coverage.ts coverageDocumentSchema is its zod shape). */
interface CoverageDocument {
  raster: {
    width: number; height: number; cellM: number; cellAreaM2: number;
    crs: { epsg: number | null; name: string };
    geotransform: number[]; nodata: number; bands: string[]; noValue: string;
  };
  spec: CoverageSpec & { basis: string };
  envelope: (AttitudeEnvelope & { marginPx: number; lines: Array<{ line: number; headingDeg: number; crabDeg: number }> }) | null;
  compliance: {
    cellsInArea: number; areaM2: number;
    items: Array<{ item: Compliance['items'][number]['item']; asks: string; share: number; failingAreaM2: number }>;
    shareAll: number; plannedShareMinViews: number;
  };
  patchCount: number;
  patches: Array<{ reason: Compliance['patches'][number]['reason']; message: string; cells: number; areaM2: number; centroid: { lon: number; lat: number }; worst: number | null }>;
  summary: {
    photoCount: number; views: Spread; viewsPlanned: Spread; finestGsdCm: Spread; maxRayAngleDeg: Spread; sigmaVerticalM: Spread; sigmaHorizontalM: Spread;
  };
  precision: string;
  timingMs: { coverage: number };
}

/** The cell size a run uses: the asked one, else the mission's setting, else the grid's own resolution. */
function coverageCellM(grid: Grid, mission: Mission, settingCellM: number | null, asked: number | null = null): number {
  const ring = mission.area.coordinates[0];
  const meanLat = ring.slice(0, -1).reduce((t, p) => t + p[1], 0) / (ring.length - 1);
  return asked ?? settingCellM ?? gridCellM(grid, meanLat);
}

/**
 * Refuse, before any plan is analysed, a run that cannot be written or would be too large: a grid without an
 * EPSG code (the raster file must name its CRS) or more cells than the limit (the message names the smallest
 * cell size that fits).
 */
export function checkCoverageRun(grid: Grid, input: unknown, mission: Mission, askedCellM: number | null = null): void {
  const { settings } = resolveCoverageInput(input, mission);
  if (grid.crs.epsg === null) throw new TerrainError('unsupported', `The grid's CRS (${grid.crs.name}) has no EPSG code, so the coverage raster cannot name it; reproject the grid to an EPSG CRS (gdalwarp -t_srs EPSG:…).`);
  coverageLayout(grid, mission.area, coverageCellM(grid, mission, settings.cellM, askedCellM), settings.maxCells);
}

/** The coverage of an analysed plan over its area, under the mission's spec and attitude envelope. */
export function runCoverage(grid: Grid, input: unknown, mission: Mission, plan: PlanResult, opts: { cellM?: number | null; now?: () => number } = {}): CoverageRun {
  const now = opts.now ?? (() => Date.now());
  const { spec, envelope, settings } = resolveCoverageInput(input, mission);
  checkCoverageRun(grid, input, mission, opts.cellM ?? null);
  const cellM = coverageCellM(grid, mission, settings.cellM, opts.cellM ?? null);
  const t0 = now();
  const frame = coverageFrame(mission.area);
  const { photos, lines: crabLines } = planPhotos(plan, frame, envelope);
  const raster = computeCoverage(grid, frame, mission.area, mission.camera, photos, {
    cellM, maxCells: settings.maxCells, ...specRasterOptions(spec), imageErrorPx: settings.imageErrorPx, envelope, occlusion: settings.occlusion,
  });
  const compliance = coverageCompliance(raster, spec);
  const t1 = now();
  const toLonLat = createTransform(grid.crs, WGS84);
  const { cells } = raster;
  const inside = cells.inside;
  let plannedMeet = 0;
  for (let i = 0; i < inside.length; i++) if (inside[i] && raster.viewsPlanned[i] >= spec.minViews) plannedMeet++;
  const document: CoverageDocument = {
    raster: {
      width: cells.width, height: cells.height, cellM: round(cells.cellM, 4), cellAreaM2: round(cells.cellAreaM2, 4),
      crs: { epsg: grid.crs.epsg, name: grid.crs.name }, geotransform: [...cells.transform], nodata: COVERAGE_NODATA,
      bands: coverageBandNames(raster), noValue: 'NaN inside the area where a measure has no value (no view, or fewer than 2 views for angles and σ)',
    },
    spec: { ...spec, basis: raster.guaranteed ? 'guaranteed: a view counts only if the point stays in the image at every attitude of the envelope' : 'as planned (no attitude envelope in the mission)' },
    envelope: envelope ? { ...envelope, marginPx: round(raster.envelopeMarginPx, 2), lines: crabLines.map((l) => ({ ...l, crabDeg: round(l.crabDeg, 3) })) } : null,
    compliance: {
      cellsInArea: compliance.cellsInArea,
      areaM2: round(compliance.areaM2, 1),
      items: compliance.items.map((it) => ({ ...it, share: round(it.share, 6), failingAreaM2: round(it.failingAreaM2, 1) })),
      shareAll: round(compliance.shareAll, 6),
      plannedShareMinViews: compliance.cellsInArea ? round(plannedMeet / compliance.cellsInArea, 6) : 0,
    },
    patchCount: compliance.patches.length,
    patches: compliance.patches.slice(0, MAX_LISTED_PATCHES).map((p) => {
      const [lon, lat] = toLonLat.forward(p.centroidX, p.centroidY);
      return { reason: p.reason, message: p.message, cells: p.cells, areaM2: round(p.areaM2, 1), centroid: { lon: round(lon, 7), lat: round(lat, 7) }, worst: p.worst === null ? null : round(p.worst, 4) };
    }),
    summary: {
      photoCount: photos.length,
      views: spread(raster.views, inside, 0),
      viewsPlanned: spread(raster.viewsPlanned, inside, 0),
      finestGsdCm: spread(raster.finestGsdCm, inside, 4),
      maxRayAngleDeg: spread(raster.maxRayAngleDeg, inside, 3),
      sigmaVerticalM: spread(raster.sigmaVerticalM, inside, 4),
      sigmaHorizontalM: spread(raster.sigmaHorizontalM, inside, 4),
    },
    precision: `Predicted σ is advisory: a least-squares intersection of the viewing rays with an image measurement error of ${raster.imageErrorPx} px, camera poses taken as exact; real accuracy depends on ground control, calibration and matching and is proven with check points.`,
    timingMs: { coverage: round(t1 - t0, 1) },
  };
  return { raster, spec, envelope, compliance, document };
}

/** The proof of a plan: its own coverage raster (computeCoverage) and compliance (coverageCompliance) over the cells a plan can reach. */
import type { Grid } from './grid';
import type { Mission } from './mission';
import type { PlanResult } from './plan-result';
import type { AttitudeEnvelope } from './attitude-envelope';
import type { LocalFrame } from './local-frame';
import { cellSlopesDeg, computeCoverage, type CoverageOptions, type CoverageRaster } from './coverage';
import type { CoveragePhoto } from './coverage-photo';
import { coverageCells, gridCellM, type CoverageCells } from './coverage-grid';
import { coverageCompliance, meetsDirections, specRasterOptions, type Compliance, type CoverageSpec, type CoverageSettings } from './coverage-spec';
import { coverageFrame, planPhotos } from './coverage-photos';
import { reachability, reachableOnly, type Reach } from './solve-reach';

/** A plan's verdict over the reachable cells. */
export interface Verdict {
  raster: CoverageRaster;
  /** Compliance over the reachable cells only. */
  compliance: Compliance;
  meets: boolean;
  /** Reachable cells that fail some item (indices into the raster's cells) with the first item they fail. */
  failing: Array<{ cell: number; item: 'gsd' | 'views' | 'directions' | 'other' }>;
}

/** Checks plans over one site with one spec. */
export interface Verifier {
  frame: LocalFrame;
  cells: CoverageCells;
  cellM: number;
  reach: Reach;
  check(plan: PlanResult): Verdict;
  /**
   * Whether the plan meets the spec on every reachable cell, answered at the first short cell: its full verdict
   * when it does (every cell was visited), null at the first reachable cell that falls short (no share known).
   * `firstCells` are visited first (`CoverageOptions.firstCells`): where other plans fell short. `short`, when
   * given, receives the cell a raster stopped at.
   */
  verdictIfMeets(plan: PlanResult, firstCells?: ArrayLike<number>, short?: { cell: number }): Verdict | null;
  /**
   * The verdict of `plan` when it holds every photo of `base`'s plan and more (spot photos added to a checked
   * layout): only the cells the added photos may see are worked out again (`CoverageOptions.adding`), the same
   * verdict as `check`. A plan that lacks some photo of the base is checked whole.
   */
  checkAdding(plan: PlanResult, base: { plan: PlanResult; verdict: Verdict }): Verdict;
  /** Whether two plans take the same photos (the same poses, whatever their order): then their rasters are the same. */
  samePhotos(a: PlanResult, b: PlanResult): boolean;
}

/** A photo's pose as a key: the same key, the same photo in every raster. */
const poseKey = (p: CoveragePhoto) => `${p.xM} ${p.yM} ${p.altitudeM} ${p.yawDeg} ${p.pitchDeg ?? 0} ${p.rollDeg ?? 0} ${p.mountTiltDeg ?? 0} ${p.crabDeg ?? 0}`;

/** Indices of the photos of `all` that `base` lacks, or null when `base` has one that `all` lacks. */
function freshPhotos(all: readonly CoveragePhoto[], base: readonly CoveragePhoto[]): number[] | null {
  const left = new Map<string, number>();
  for (const p of base) { const k = poseKey(p); left.set(k, (left.get(k) ?? 0) + 1); }
  const fresh: number[] = [];
  all.forEach((p, j) => {
    const k = poseKey(p), n = left.get(k) ?? 0;
    if (n > 0) left.set(k, n - 1); else fresh.push(j);
  });
  for (const n of left.values()) if (n > 0) return null;
  return fresh;
}

/**
 * The cell size the solver proves plans on: the mission's `coverage.cellM`, else the grid's own cell but at least
 * 4 m (a 4 m raster of the demo takes half a second; the whole solve makes a dozen).
 */
function solverCellM(grid: Grid, mission: Mission, settings: CoverageSettings): number {
  const ring = mission.area.coordinates[0];
  const lat = ring.slice(0, -1).reduce((t, p) => t + p[1], 0) / (ring.length - 1);
  return settings.cellM ?? Math.max(4, gridCellM(grid, lat));
}

export function makeVerifier(grid: Grid, mission: Mission, spec: CoverageSpec, envelope: AttitudeEnvelope | null, settings: CoverageSettings, gsdPerM: number): Verifier {
  const frame = coverageFrame(mission.area);
  const cellM = solverCellM(grid, mission, settings);
  const cells = coverageCells(grid, frame, mission.area, cellM, settings.maxCells);
  const reach = reachability(cells, cellSlopesDeg(grid, frame, mission.area, cellM, settings.maxCells), spec, mission.clearanceM + mission.obstacleAllowanceM, gsdPerM);
  /** The first spec item a reachable cell fails, or null (unreachable cells and cells that meet every item). */
  const shortOf = (raster: CoverageRaster, i: number): Verdict['failing'][number]['item'] | null => {
    if (reach.code[i]) return null;
    const gsd = !(raster.finestGsdCm[i] <= spec.maxGsdCm);
    const views = raster.views[i] < spec.minViews;
    const sv = spec.maxSigmaVerticalM !== null && !(raster.sigmaVerticalM[i] <= spec.maxSigmaVerticalM);
    const sh = spec.maxSigmaHorizontalM !== null && !(raster.sigmaHorizontalM[i] <= spec.maxSigmaHorizontalM);
    const dirs = !meetsDirections(raster, spec, i);
    return gsd ? 'gsd' : views ? 'views' : dirs ? 'directions' : sv || sh ? 'other' : null;
  };
  const rasterOf = (plan: PlanResult, stopAtShort: boolean, firstCells?: ArrayLike<number>, adding?: CoverageOptions['adding'], photos = planPhotos(plan, frame, envelope).photos) => computeCoverage(grid, frame, mission.area, mission.camera, photos, {
    cellM, maxCells: settings.maxCells, ...specRasterOptions(spec), imageErrorPx: settings.imageErrorPx, envelope, occlusion: settings.occlusion,
    stopAt: stopAtShort ? (i, r) => shortOf(r, i) !== null : undefined, firstCells, adding,
  });
  const verdictOf = (raster: CoverageRaster): Verdict => {
    const compliance = coverageCompliance(reachableOnly(raster, reach), spec);
    const failing: Verdict['failing'] = [];
    const { inside } = raster.cells;
    for (let i = 0; i < inside.length; i++) {
      if (!inside[i]) continue;
      const item = shortOf(raster, i);
      if (item) failing.push({ cell: i, item });
    }
    return { raster, compliance, meets: failing.length === 0, failing };
  };
  return {
    frame, cells, cellM, reach,
    check: (plan) => verdictOf(rasterOf(plan, false)),
    checkAdding(plan, base) {
      const photos = planPhotos(plan, frame, envelope).photos;
      const fresh = base.verdict.raster.stoppedAtCell === undefined ? freshPhotos(photos, planPhotos(base.plan, frame, envelope).photos) : null;
      return verdictOf(rasterOf(plan, false, undefined, fresh ? { raster: base.verdict.raster, fresh } : undefined, photos));
    },
    samePhotos(a, b) {
      const fresh = freshPhotos(planPhotos(a, frame, envelope).photos, planPhotos(b, frame, envelope).photos);
      return fresh !== null && fresh.length === 0;
    },
    verdictIfMeets(plan, firstCells, short) {
      const raster = rasterOf(plan, true, firstCells);
      if (raster.stoppedAtCell === undefined) return verdictOf(raster);
      if (short) short.cell = raster.stoppedAtCell;
      return null;
    },
  };
}

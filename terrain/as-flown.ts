/** As-flown coverage: the coverage raster from the photos' real poses, its compliance with the spec, and what the flight lost against the plan. */
import type { Grid } from './grid';
import type { Mission } from './mission';
import type { PlanResult } from './plan-result';
import type { LocalFrame } from './local-frame';
import { computeCoverage, type CoveragePhoto, type CoverageRaster } from './coverage';
import { coverageFrame, planPhotos } from './coverage-photos';
import { cellMeetsSpec, coverageCompliance, specRasterOptions, type Compliance, type CoverageSpec } from './coverage-spec';
import { matchPhotos, type FlownPhoto, type PhotoMatch } from './as-flown-match';

/** Raster settings of an as-flown analysis (the mission's `coverage` settings with the cell size resolved). */
export interface AsFlownSettings {
  cellM: number;
  maxCells: number;
  imageErrorPx: number;
  occlusion: boolean;
}

/**
 * Coverage poses of the photos: position and altitude (grid datum) as matched, the camera's yaw, roll and
 * pitch from the record (pitch from nadir is the mount tilt of `CameraPose`, roll the aircraft's). A photo
 * without a heading takes its line's heading (the one it was matched to, else the nearest); one without pitch
 * or roll looks straight down. `assumed` lists the photos (0-based) for which anything was assumed.
 */
function flownPoses(photos: readonly FlownPhoto[], match: PhotoMatch, plan: PlanResult): { poses: CoveragePhoto[]; assumed: number[] } {
  const poses: CoveragePhoto[] = [];
  const assumed: number[] = [];
  photos.forEach((p, k) => {
    const li = match.lineOfPhoto[k];
    const lineHeading = li >= 0 ? plan.lines[li].headingDeg : plan.summary.headingDeg;
    if (p.yawDeg === null || p.pitchDeg === null || p.rollDeg === null) assumed.push(k);
    poses.push({
      xM: match.x[k], yM: match.y[k], altitudeM: match.altitudeDatumM[k],
      yawDeg: p.yawDeg ?? lineHeading, rollDeg: p.rollDeg ?? 0, mountTiltDeg: p.pitchDeg ?? 0,
    });
  });
  return { poses, assumed };
}

/** Connected cells (4-neighbour) of a mask, each as its cell indices. */
export function maskPatches(mask: Uint8Array, width: number, height: number): Int32Array[] {
  const seen = new Uint8Array(mask.length);
  const stack = new Int32Array(mask.length);
  const out: Int32Array[] = [];
  for (let s0 = 0; s0 < mask.length; s0++) {
    if (!mask[s0] || seen[s0]) continue;
    const cells: number[] = [];
    let top = 0;
    stack[top++] = s0; seen[s0] = 1;
    while (top > 0) {
      const i = stack[--top];
      cells.push(i);
      const r = (i / width) | 0, c = i - r * width;
      for (const j of [c > 0 ? i - 1 : -1, c < width - 1 ? i + 1 : -1, r > 0 ? i - width : -1, r < height - 1 ? i + width : -1]) {
        if (j >= 0 && mask[j] && !seen[j]) { seen[j] = 1; stack[top++] = j; }
      }
    }
    out.push(Int32Array.from(cells));
  }
  return out.sort((a, b) => b.length - a.length);
}

/** Planned against flown, cell by cell. */
interface CoverageDifference {
  /** 1 where the cell meets the whole spec as planned but not as flown. */
  lost: Uint8Array;
  lostCells: number;
  lostAreaM2: number;
  /** Cells that meet the spec as flown but not as planned (e.g. a lower pass over a ridge). */
  gainedCells: number;
  gainedAreaM2: number;
  /** Connected lost cells, largest first. */
  lostPatches: Int32Array[];
  /** Cells failing as flown that fail as planned too: flying the plan again would not mend them. */
  failingAsPlannedCells: number;
}

/** The whole as-flown analysis. */
export interface AsFlown {
  plan: PlanResult;
  frame: LocalFrame;
  match: PhotoMatch;
  /** Every photo's pose (log order); those in `farAway` (0-based) lie too far from the area to see it and are left out of the raster. */
  poses: CoveragePhoto[];
  farAway: number[];
  assumedAttitude: number[];
  planned: CoverageRaster;
  flown: CoverageRaster;
  compliance: { planned: Compliance; flown: Compliance };
  difference: CoverageDifference;
}

/**
 * The as-flown analysis of a log of photos against an analysed plan: matching (`as-flown-match.ts`), the
 * coverage raster of the photos' real poses and of the planned stations on the same cells (`computeCoverage`;
 * both as flown/planned, no attitude envelope: the real attitude is known), compliance of each with the spec
 * (`coverageCompliance`) and the cells the flight lost.
 */
export function analyseAsFlown(grid: Grid, mission: Mission, plan: PlanResult, photos: readonly FlownPhoto[], spec: CoverageSpec, settings: AsFlownSettings): AsFlown {
  const frame = coverageFrame(mission.area);
  const match = matchPhotos(plan, frame, photos, mission.camera);
  const { poses, assumed } = flownPoses(photos, match, plan);
  // a stray photo far from the area sees none of it, but would stretch the height lattice over the gap
  const reachM = plan.summary.footprintAcrossM + plan.summary.footprintAlongM;
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const [lon, lat] of mission.area.coordinates[0]) {
    const [x, y] = frame.toLocal(lon, lat);
    x0 = Math.min(x0, x); x1 = Math.max(x1, x); y0 = Math.min(y0, y); y1 = Math.max(y1, y);
  }
  const farAway: number[] = [];
  const near = poses.filter((p, k) => {
    const ok = p.xM > x0 - reachM && p.xM < x1 + reachM && p.yM > y0 - reachM && p.yM < y1 + reachM;
    if (!ok) farAway.push(k);
    return ok;
  });
  const opts = { cellM: settings.cellM, maxCells: settings.maxCells, ...specRasterOptions(spec), imageErrorPx: settings.imageErrorPx, envelope: null, occlusion: settings.occlusion };
  const planned = computeCoverage(grid, frame, mission.area, mission.camera, planPhotos(plan, frame, null).photos, opts);
  const flown = computeCoverage(grid, frame, mission.area, mission.camera, near, opts);
  const { width, height, inside, cellAreaM2 } = flown.cells;
  const n = width * height;
  const lost = new Uint8Array(n);
  let lostCells = 0, gainedCells = 0, failingAsPlannedCells = 0;
  for (let i = 0; i < n; i++) {
    if (!inside[i]) continue;
    const p = cellMeetsSpec(planned, spec, i), f = cellMeetsSpec(flown, spec, i);
    if (p && !f) { lost[i] = 1; lostCells++; }
    else if (!p && f) gainedCells++;
    else if (!p && !f) failingAsPlannedCells++;
  }
  return {
    plan, frame, match, poses, farAway, assumedAttitude: assumed, planned, flown,
    compliance: { planned: coverageCompliance(planned, spec), flown: coverageCompliance(flown, spec) },
    difference: { lost, lostCells, lostAreaM2: lostCells * cellAreaM2, gainedCells, gainedAreaM2: gainedCells * cellAreaM2, lostPatches: maskPatches(lost, width, height), failingAsPlannedCells },
  };
}

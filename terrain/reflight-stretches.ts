/**
 * The same-day re-flight as stretches of the lines already signed off: every planned photo station that sees
 * ground the flight lost (ground that met the spec as planned) is taken again, along its own line at the line's
 * own heights. Flying those stations again restores every view the plan gave that ground, so the lost ground
 * meets the spec again by construction (the check recomputes it with the photos already taken). A pilot can fly
 * these at once: they are parts of the reviewed plan, at its reviewed heights, so nothing new needs a sign-off.
 */
import { cellX, cellY } from './coverage-grid';
import type { Grid } from './grid';
import type { Mission } from './mission';
import type { PlanLine } from './plan-result';
import { cellMeetsSpec, specRasterOptions, type CoverageSpec } from './coverage-spec';
import { planPhotos } from './coverage-photos';
import { computeCoverage } from './coverage';
import { cameraToLocal } from './footprint';
import { imageModel, insideImage, projectPoint } from './pose';
import type { AsFlown, AsFlownSettings } from './as-flown';
import { MIN_REFLIGHT_PATCH_SHARE } from './reflight';

/** One leg of a stretch: the signed-off leg's straight climb or descent between two distances along its line. */
interface StretchLeg {
  fromM: number;
  toM: number;
  altitudeStartAboveTakeoffM: number;
  altitudeEndAboveTakeoffM: number;
  altitudeStartM: number;
  altitudeEndM: number;
}

/** One stretch of one signed-off line. */
interface ReflightStretch {
  /** Line number on the signed-off leg sheet (1-based, flying order). */
  line: number;
  /** Distances along the line from its start (metres): half a photo spacing before the first station to half after the last. */
  fromM: number;
  toM: number;
  lengthM: number;
  headingDeg: number;
  start: { lon: number; lat: number };
  end: { lon: number; lat: number };
  /** The line's photo stations inside the stretch (1-based within the line), and how many. */
  firstPhoto: number;
  lastPhoto: number;
  photos: number;
  legs: StretchLeg[];
  /** Time on the stretch at the legs' speed (s). */
  timeS: number;
}

interface ReflightStretches {
  stretches: ReflightStretch[];
  /** Lost cells in patches worth re-flying, and how many meet the whole spec with the stretches' photos added to those taken. */
  targetCells: number;
  coveredCells: number;
  /** Planned stations that see the lost ground (all of them are in the stretches). */
  neededStations: number;
  lengthM: number;
  timeS: number;
  photos: number;
}

/** Two runs of needed stations closer than this many unneeded stations fly as one stretch (a turn costs more than a few photos). */
const MERGE_GAP = 2;

/** Linear height along a leg at distance d. */
function at(d: number, s: number, e: number, hs: number, he: number): number {
  return e > s ? hs + ((he - hs) * (d - s)) / (e - s) : hs;
}

/** The stretch of `line` (0-based `li`) over stations `first`..`last` (0-based). */
function stretchOf(line: PlanLine, li: number, first: number, last: number, spacingM: number, speedMps: number): ReflightStretch {
  const d0 = Math.max(0, line.stations[first].distanceM - spacingM / 2);
  const d1 = Math.min(line.lengthM, line.stations[last].distanceM + spacingM / 2);
  const legs: StretchLeg[] = [];
  let timeS = 0;
  for (const leg of line.legs) {
    const s = leg.start.distanceM, e = leg.end.distanceM;
    const from = Math.max(s, d0), to = Math.min(e, d1);
    if (!(to > from)) continue;
    legs.push({
      fromM: from, toM: to,
      altitudeStartAboveTakeoffM: at(from, s, e, leg.altitudeStartAboveTakeoffM, leg.altitudeEndAboveTakeoffM),
      altitudeEndAboveTakeoffM: at(to, s, e, leg.altitudeStartAboveTakeoffM, leg.altitudeEndAboveTakeoffM),
      altitudeStartM: at(from, s, e, leg.altitudeStartM, leg.altitudeEndM),
      altitudeEndM: at(to, s, e, leg.altitudeStartM, leg.altitudeEndM),
    });
    timeS += (to - from) / (leg.speedMps ?? speedMps);
  }
  // the line is straight from its start to its end: a point at distance d lies that share of the way along
  const point = (d: number) => {
    const t = line.lengthM > 0 ? d / line.lengthM : 0;
    return { lon: line.start.lon + (line.end.lon - line.start.lon) * t, lat: line.start.lat + (line.end.lat - line.start.lat) * t };
  };
  return {
    line: li + 1, fromM: d0, toM: d1, lengthM: d1 - d0, headingDeg: line.headingDeg, start: point(d0), end: point(d1),
    firstPhoto: first + 1, lastPhoto: last + 1, photos: last - first + 1, legs, timeS,
  };
}

/**
 * The stations of the plan (`a.plan`, the version's own) whose image holds a lost cell's ground point, as stretches
 * of their lines, and how many of the lost cells the photos taken plus those stations make meet the spec.
 */
export function reflightStretches(grid: Grid, mission: Mission, a: AsFlown, spec: CoverageSpec, settings: AsFlownSettings): ReflightStretches {
  const plan = a.plan;
  const { cells } = a.flown;
  // the lost cells worth re-flying (as the re-flight areas take them: patches of at least a quarter of a station's ground)
  const minCells = (MIN_REFLIGHT_PATCH_SHARE * plan.summary.triggerDistanceM * plan.summary.lineSpacingM) / cells.cellAreaM2;
  const target: number[] = [];
  for (const p of a.difference.lostPatches) if (p.length >= minCells) for (const i of p) target.push(i);
  const { photos } = planPhotos(plan, a.frame, null);
  const model = imageModel(mission.camera);
  const uv = new Float64Array(2);
  const needed: boolean[][] = plan.lines.map((l) => l.stations.map(() => false));
  let k = 0, neededStations = 0;
  plan.lines.forEach((line, li) => line.stations.forEach((_, si) => {
    const p = photos[k++];
    const rot = cameraToLocal(mission.camera, p);
    for (const i of target) {
      if (projectPoint(model, rot, p.xM, p.yM, p.altitudeM, cellX(cells, i), cellY(cells, i), cells.z[i], uv) && insideImage(model, uv[0], uv[1])) {
        needed[li][si] = true;
        neededStations++;
        break;
      }
    }
  }));
  const stretches: ReflightStretch[] = [];
  plan.lines.forEach((line, li) => {
    const spacing = plan.summary.triggerDistanceM;
    let first = -1, last = -1;
    for (let si = 0; si <= line.stations.length; si++) {
      const want = si < line.stations.length && needed[li][si];
      if (want && first >= 0 && si - last - 1 <= MERGE_GAP) { last = si; continue; }
      if (want && first < 0) { first = last = si; continue; }
      if (want) { stretches.push(stretchOf(line, li, first, last, spacing, mission.speedMps)); first = last = si; continue; }
      if (si === line.stations.length && first >= 0) stretches.push(stretchOf(line, li, first, last, spacing, mission.speedMps));
    }
  });
  // what the stretches mend: the coverage of the photos taken plus every station the stretches take again
  let coveredCells = 0;
  if (target.length) {
    const flown = a.poses.filter((_, j) => !a.farAway.includes(j));
    // each line's first photo's place in the plan's photo list (planPhotos lists them line by line)
    const lineStart = plan.lines.reduce<number[]>((acc, l, li) => { acc.push(li === 0 ? 0 : acc[li - 1] + plan.lines[li - 1].stations.length); return acc; }, []);
    const again = stretches.flatMap((st) => photos.slice(lineStart[st.line - 1] + st.firstPhoto - 1, lineStart[st.line - 1] + st.lastPhoto));
    const after = computeCoverage(grid, a.frame, mission.area, mission.camera, [...flown, ...again], {
      cellM: settings.cellM, maxCells: settings.maxCells, ...specRasterOptions(spec), imageErrorPx: settings.imageErrorPx, envelope: null, occlusion: settings.occlusion,
    });
    for (const i of target) if (cellMeetsSpec(after, spec, i)) coveredCells++;
  }
  return {
    stretches, targetCells: target.length, coveredCells, neededStations,
    lengthM: stretches.reduce((t, s) => t + s.lengthM, 0),
    timeS: stretches.reduce((t, s) => t + s.timeS, 0),
    photos: stretches.reduce((t, s) => t + s.photos, 0),
  };
}

/** Re-flight: the fewest extra lines over the ground a flight lost, as missions the plan analysis takes, and what they cover with the photos already taken. */
import type { Grid } from './grid';
import type { AreaPolygon, Mission } from './mission';
import type { PlanResult } from './plan-result';
import type { LocalFrame } from './local-frame';
import type { CoverageCells } from './coverage-grid';
import type { CoverageSpec } from './coverage-spec';
import { analysePlan, type AnalyseOptions } from './plan';
import { planPhotos } from './coverage-photos';
import { computeCoverage } from './coverage';
import { cellMeetsSpec, type AsFlown, type AsFlownSettings } from './as-flown';

const DEG = Math.PI / 180;

/** One re-flight area: a rectangle along the plan's heading over one or more lost patches. */
export interface ReflightArea {
  /** Lost patches (connected cells) it takes in, and their cells and ground area. */
  patches: number;
  cells: number;
  areaM2: number;
  /** Its size along and across the plan's heading (m). */
  alongM: number;
  acrossM: number;
  polygon: AreaPolygon;
}

/** Boxes [a0, a1, c0, c1] in the plan's heading frame (a along the heading, c to its right). */
type Box = [number, number, number, number];

/**
 * Rectangles along the plan's heading over the lost patches: each patch's extent, lengthened along by half a
 * footprint at each end (so photos before and after the patch see its ends, as the forward overlap does
 * inside a line) and widened across by `acrossMarginM`; rectangles that come within one line spacing of each
 * other are merged (one rectangle flies in fewer turns and transits than two).
 */
export function reflightAreas(plan: PlanResult, frame: LocalFrame, cells: CoverageCells, patches: readonly Int32Array[], acrossMarginM = 0): ReflightArea[] {
  const h = plan.summary.headingDeg * DEG;
  const sin = Math.sin(h), cos = Math.cos(h);
  const half = cells.cellM / 2;
  const padA = plan.summary.footprintAlongM / 2, padC = acrossMarginM, join = plan.summary.lineSpacingM;
  let boxes: Array<{ box: Box; patches: number; cells: number }> = patches.map((p) => {
    let a0 = Infinity, a1 = -Infinity, c0 = Infinity, c1 = -Infinity;
    for (const i of p) {
      const a = cells.x[i] * sin + cells.y[i] * cos, c = cells.x[i] * cos - cells.y[i] * sin;
      a0 = Math.min(a0, a - half); a1 = Math.max(a1, a + half); c0 = Math.min(c0, c - half); c1 = Math.max(c1, c + half);
    }
    return { box: [a0 - padA, a1 + padA, c0 - padC, c1 + padC] as Box, patches: 1, cells: p.length };
  });
  // merge until no two boxes come within one line spacing of each other
  for (let merged = true; merged;) {
    merged = false;
    outer: for (let i = 0; i < boxes.length; i++) {
      for (let j = i + 1; j < boxes.length; j++) {
        const [p, q] = [boxes[i].box, boxes[j].box];
        const gapA = Math.max(p[0] - q[1], q[0] - p[1]), gapC = Math.max(p[2] - q[3], q[2] - p[3]);
        if (gapA <= join && gapC <= join) {
          boxes[i] = { box: [Math.min(p[0], q[0]), Math.max(p[1], q[1]), Math.min(p[2], q[2]), Math.max(p[3], q[3])], patches: boxes[i].patches + boxes[j].patches, cells: boxes[i].cells + boxes[j].cells };
          boxes = boxes.filter((_, k) => k !== j);
          merged = true;
          break outer;
        }
      }
    }
  }
  return boxes.map(({ box: [a0, a1, c0, c1], patches: np, cells: nc }) => {
    // heading frame back to the local frame: x = a·sin + c·cos, y = a·cos − c·sin
    const corner = (a: number, c: number) => frame.toLonLat(a * sin + c * cos, a * cos - c * sin);
    const ring = [corner(a0, c0), corner(a1, c0), corner(a1, c1), corner(a0, c1)];
    ring.push(ring[0]);
    return { patches: np, cells: nc, areaM2: nc * cells.cellAreaM2, alongM: a1 - a0, acrossM: c1 - c0, polygon: { type: 'Polygon' as const, coordinates: [ring.map(([lon, lat]) => [lon, lat])] } };
  });
}

/** A proposed re-flight: its missions (one per area, each a complete mission the plan analysis takes), their plans, and what they cover. */
export interface Reflight {
  areas: ReflightArea[];
  missions: Array<Record<string, unknown>>;
  plans: PlanResult[];
  lineCount: number;
  photoCount: number;
  lineLengthM: number;
  flightTimeS: number;
  /** Lost cells, and how many of them meet the whole spec with the re-flight's photos added to those taken. */
  targetCells: number;
  coveredCells: number;
  /** Cells of the whole area meeting the spec with the re-flight added. */
  shareAllAfter: number;
  acrossMarginM: number;
}

/**
 * The re-flight of the cells an as-flown analysis lost: the original mission (camera, overlaps, mode, limits,
 * takeoff) over each `reflightArea`, flown along the plan's heading; each is analysed with `analysePlan`, and
 * the coverage of the photos taken plus the re-flight's planned stations says how many lost cells it mends.
 * When some stay short, the areas are widened across by half a line spacing, then one, and tried again (at most
 * three tries): a lost strip whose neighbours' views are also short needs the neighbouring lines too.
 */
export function planReflight(grid: Grid, missionInput: Record<string, unknown>, mission: Mission, asFlown: AsFlown, spec: CoverageSpec, settings: AsFlownSettings, opts: AnalyseOptions = {}): Reflight | null {
  const { difference, frame, flown } = asFlown;
  if (difference.lostCells === 0) return null;
  const plan0 = asFlown.plan;
  const S = plan0.summary.lineSpacingM;
  let best: Reflight | null = null;
  for (const acrossMarginM of [0, S / 2, S]) {
    const areas = reflightAreas(plan0, frame, flown.cells, difference.lostPatches, acrossMarginM);
    const missions = areas.map((a, k) => {
      const name = typeof missionInput.name === 'string' ? `${missionInput.name} — re-flight ${k + 1} of ${areas.length}` : `Re-flight ${k + 1} of ${areas.length}`;
      return { ...missionInput, name, area: a.polygon, headingDeg: plan0.summary.headingDeg };
    });
    const plans = missions.map((m) => analysePlan(grid, m, opts));
    const extra = plans.flatMap((p) => planPhotos(p, frame, null).photos);
    const after = computeCoverage(grid, frame, mission.area, mission.camera, [...asFlown.poses, ...extra], {
      cellM: settings.cellM, maxCells: settings.maxCells, specGsdCm: spec.maxGsdCm, imageErrorPx: settings.imageErrorPx, envelope: null, occlusion: settings.occlusion,
    });
    let covered = 0, meets = 0;
    const { inside } = after.cells;
    for (let i = 0; i < inside.length; i++) {
      if (!inside[i]) continue;
      const ok = cellMeetsSpec(after, spec, i);
      if (ok) meets++;
      if (ok && difference.lost[i]) covered++;
    }
    const r: Reflight = {
      areas, missions, plans,
      lineCount: plans.reduce((t, p) => t + p.summary.lineCount, 0),
      photoCount: plans.reduce((t, p) => t + p.summary.photoCount, 0),
      lineLengthM: plans.reduce((t, p) => t + p.lines.reduce((u, l) => u + l.lengthM, 0), 0),
      flightTimeS: plans.reduce((t, p) => t + p.summary.flightTimeS, 0),
      targetCells: difference.lostCells, coveredCells: covered,
      shareAllAfter: after.cells.insideCount ? meets / after.cells.insideCount : 0,
      acrossMarginM,
    };
    if (!best || r.coveredCells > best.coveredCells) best = r;
    if (covered === difference.lostCells) break;
  }
  return best;
}

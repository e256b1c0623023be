/** Re-flight: the fewest extra lines over the ground a flight lost, as missions the plan analysis takes, and what they cover with the photos already taken. */
import type { Grid } from './grid';
import type { AreaPolygon, Mission } from './mission';
import type { PlanResult } from './plan-result';
import type { LocalFrame } from './local-frame';
import { cellX, cellY, type CoverageCells } from './coverage-grid';
import { cellMeetsSpec, specRasterOptions, type CoverageSpec } from './coverage-spec';
import { analysePlan, type AnalyseOptions } from './plan';
import { planPhotos } from './coverage-photos';
import { computeCoverage } from './coverage';
import type { AsFlown, AsFlownSettings } from './as-flown';

const DEG = Math.PI / 180;

/** One re-flight area: a rectangle along the plan's heading over one or more lost patches. */
interface ReflightArea {
  /** Lost patches (connected cells) it takes in (their indices in the patch list), and their cells and ground area. */
  patches: number;
  patchIndices: number[];
  cells: number;
  areaM2: number;
  /** Its size along and across the plan's heading (m). */
  alongM: number;
  acrossM: number;
  polygon: AreaPolygon;
  /** The rectangle in the plan's heading frame of the local frame (a along the heading, c to its right; metres). */
  box: { alongFromM: number; alongToM: number; acrossFromM: number; acrossToM: number };
}

/** Boxes [a0, a1, c0, c1] in the plan's heading frame (a along the heading, c to its right). */
type Box = [number, number, number, number];

/** Patches smaller than this share of the ground one station adds (air base × line spacing) are left to the report, not re-flown. */
export const MIN_REFLIGHT_PATCH_SHARE = 0.25;

/**
 * Rectangles along the plan's heading over the lost patches. Each patch's extent is lengthened along by half a
 * footprint at each end (so photos before and after the patch see its ends, as the forward overlap does inside
 * a line); rectangles that come within one line spacing of each other are merged (one rectangle flies in fewer
 * turns and transits than two). Across, each rectangle is snapped to the plan's own line positions: it spans
 * the lines within half a spacing of the patch, plus `extraLines` on each side (one figure, or one per area), so the plan analysis lays its
 * lines exactly on the original ones (same ground geometry, so the same GSD the plan promised). Patches smaller
 * than `MIN_REFLIGHT_PATCH_SHARE` of one station's ground are not re-flown.
 */
function reflightAreas(plan: PlanResult, frame: LocalFrame, cells: CoverageCells, patches: readonly Int32Array[], extraLines: number | readonly number[] = 0): ReflightArea[] {
  const h = plan.summary.headingDeg * DEG;
  const sin = Math.sin(h), cos = Math.cos(h);
  const half = cells.cellM / 2;
  const S = plan.summary.lineSpacingM;
  const padA = plan.summary.footprintAlongM / 2;
  const minCells = (MIN_REFLIGHT_PATCH_SHARE * plan.summary.triggerDistanceM * S) / cells.cellAreaM2;
  // the plan's line positions across the heading (c of each line's start)
  const offsets = [...new Set(plan.lines.map((l) => { const [x, y] = frame.toLocal(l.start.lon, l.start.lat); return Math.round((x * cos - y * sin) * 1000) / 1000; }))].sort((p, q) => p - q);
  let boxes: Array<{ box: Box; patches: number[]; cells: number }> = [];
  patches.forEach((p, pi) => {
    if (p.length < minCells) return;
    let a0 = Infinity, a1 = -Infinity, c0 = Infinity, c1 = -Infinity;
    for (const i of p) {
      const a = cellX(cells, i) * sin + cellY(cells, i) * cos, c = cellX(cells, i) * cos - cellY(cells, i) * sin;
      a0 = Math.min(a0, a - half); a1 = Math.max(a1, a + half); c0 = Math.min(c0, c - half); c1 = Math.max(c1, c + half);
    }
    boxes.push({ box: [a0 - padA, a1 + padA, c0, c1], patches: [pi], cells: p.length });
  });
  // merge until no two boxes come within one line spacing of each other
  for (let merged = true; merged;) {
    merged = false;
    outer: for (let i = 0; i < boxes.length; i++) {
      for (let j = i + 1; j < boxes.length; j++) {
        const [p, q] = [boxes[i].box, boxes[j].box];
        const gapA = Math.max(p[0] - q[1], q[0] - p[1]), gapC = Math.max(p[2] - q[3], q[2] - p[3]);
        if (gapA <= S && gapC <= S) {
          boxes[i] = { box: [Math.min(p[0], q[0]), Math.max(p[1], q[1]), Math.min(p[2], q[2]), Math.max(p[3], q[3])], patches: [...boxes[i].patches, ...boxes[j].patches], cells: boxes[i].cells + boxes[j].cells };
          boxes = boxes.filter((_, k) => k !== j);
          merged = true;
          break outer;
        }
      }
    }
  }
  /** Offset of the k-th line position, extended past the plan's outer lines at the same spacing. */
  const lineAt = (k: number) => (k < 0 ? offsets[0] + k * S : k >= offsets.length ? offsets[offsets.length - 1] + (k - offsets.length + 1) * S : offsets[k]);
  const indexNear = (c: number) => {
    if (c < offsets[0]) return Math.round((c - offsets[0]) / S);
    if (c > offsets[offsets.length - 1]) return offsets.length - 1 + Math.round((c - offsets[offsets.length - 1]) / S);
    let best = 0;
    for (let k = 1; k < offsets.length; k++) if (Math.abs(offsets[k] - c) < Math.abs(offsets[best] - c)) best = k;
    return best;
  };
  return boxes.map(({ box: [a0, a1, c0, c1], patches: np, cells: nc }, bi) => {
    const extra = typeof extraLines === 'number' ? extraLines : extraLines[bi] ?? 0;
    const k0 = indexNear(c0) - extra, k1 = indexNear(c1) + extra;
    // half a spacing beyond the outer lines, less a hair, so the layout counts exactly k1 − k0 + 1 lines
    const eps = 1e-3 * S;
    const cLo = lineAt(k0) - S / 2 + eps, cHi = lineAt(k1) + S / 2 - eps;
    // heading frame back to the local frame: x = a·sin + c·cos, y = a·cos − c·sin
    const corner = (a: number, c: number) => frame.toLonLat(a * sin + c * cos, a * cos - c * sin);
    const ring = [corner(a0, cLo), corner(a1, cLo), corner(a1, cHi), corner(a0, cHi)];
    ring.push(ring[0]);
    return { patches: np.length, patchIndices: np, cells: nc, areaM2: nc * cells.cellAreaM2, alongM: a1 - a0, acrossM: cHi - cLo, polygon: { type: 'Polygon' as const, coordinates: [ring.map(([lon, lat]) => [lon, lat])] }, box: { alongFromM: a0, alongToM: a1, acrossFromM: cLo, acrossToM: cHi } };
  });
}

/** A proposed re-flight: its missions (one per area, each a complete mission the plan analysis takes), their plans, and what they cover. */
interface Reflight {
  areas: ReflightArea[];
  missions: Array<Record<string, unknown>>;
  plans: PlanResult[];
  lineCount: number;
  photoCount: number;
  lineLengthM: number;
  flightTimeS: number;
  /** Lost cells in patches worth re-flying, and how many of them meet the whole spec with the re-flight's photos added to those taken. */
  targetCells: number;
  coveredCells: number;
  /** Cells of the whole area meeting the spec with the re-flight added. */
  shareAllAfter: number;
  /** Lines added on each side of each area beyond those over its lost patches (0 or 1). */
  extraLines: number[];
  /** Lost cells in patches too small to re-fly (see `MIN_REFLIGHT_PATCH_SHARE`). */
  smallPatchCells: number;
}

/**
 * The re-flight of the cells an as-flown analysis lost: the original mission (camera, overlaps, mode, limits,
 * takeoff) over each `reflightArea`, flown along the plan's heading; each is analysed with `analysePlan`, and
 * the coverage of the photos taken plus the re-flight's planned stations says how many lost cells it mends.
 * When some stay short, the areas holding them are widened by one line on each side and tried again: a lost
 * strip whose neighbours' views are also short needs the neighbouring lines too. The better of the two is kept.
 */
export function planReflight(grid: Grid, missionInput: Record<string, unknown>, mission: Mission, asFlown: AsFlown, spec: CoverageSpec, settings: AsFlownSettings, opts: AnalyseOptions = {}): Reflight | null {
  const { difference, frame, flown } = asFlown;
  if (difference.lostCells === 0) return null;
  const plan0 = asFlown.plan;
  const minCells = (MIN_REFLIGHT_PATCH_SHARE * plan0.summary.triggerDistanceM * plan0.summary.lineSpacingM) / flown.cells.cellAreaM2;
  // the cells the re-flight is for: lost ones in patches large enough to re-fly
  const target = new Uint8Array(difference.lost.length);
  let targetCells = 0;
  for (const p of difference.lostPatches) if (p.length >= minCells) for (const i of p) { target[i] = 1; targetCells++; }
  const smallPatchCells = difference.lostCells - targetCells;
  const empty: Reflight = {
    areas: [], missions: [], plans: [], lineCount: 0, photoCount: 0, lineLengthM: 0, flightTimeS: 0,
    targetCells: 0, coveredCells: 0, shareAllAfter: asFlown.compliance.flown.shareAll, extraLines: [], smallPatchCells,
  };
  if (targetCells === 0) return empty;
  let best: Reflight | null = null;
  let extraLines: number[] | number = 0;
  for (let attempt = 0; attempt < 2; attempt++) {
    const areas = reflightAreas(plan0, frame, flown.cells, difference.lostPatches, extraLines);
    const missions = areas.map((a, k) => {
      const name = typeof missionInput.name === 'string' ? `${missionInput.name} — re-flight ${k + 1} of ${areas.length}` : `Re-flight ${k + 1} of ${areas.length}`;
      return { ...missionInput, name, area: a.polygon, headingDeg: plan0.summary.headingDeg };
    });
    const plans = missions.map((m) => analysePlan(grid, m, opts));
    const extra = plans.flatMap((p) => planPhotos(p, frame, null).photos);
    const after = computeCoverage(grid, frame, mission.area, mission.camera, [...asFlown.poses.filter((_, k) => !asFlown.farAway.includes(k)), ...extra], {
      cellM: settings.cellM, maxCells: settings.maxCells, ...specRasterOptions(spec), imageErrorPx: settings.imageErrorPx, envelope: null, occlusion: settings.occlusion,
    });
    let covered = 0, meets = 0;
    const { inside } = after.cells;
    const ok = new Uint8Array(inside.length);
    for (let i = 0; i < inside.length; i++) {
      if (!inside[i]) continue;
      ok[i] = cellMeetsSpec(after, spec, i) ? 1 : 0;
      if (ok[i]) meets++;
      if (ok[i] && target[i]) covered++;
    }
    const r: Reflight = {
      areas, missions, plans,
      lineCount: plans.reduce((t, p) => t + p.summary.lineCount, 0),
      photoCount: plans.reduce((t, p) => t + p.summary.photoCount, 0),
      lineLengthM: plans.reduce((t, p) => t + p.lines.reduce((u, l) => u + l.lengthM, 0), 0),
      flightTimeS: plans.reduce((t, p) => t + p.summary.flightTimeS, 0),
      targetCells, coveredCells: covered,
      shareAllAfter: after.cells.insideCount ? meets / after.cells.insideCount : 0,
      extraLines: areas.map((_, k) => (typeof extraLines === 'number' ? extraLines : extraLines[k])), smallPatchCells,
    };
    if (!best || r.coveredCells > best.coveredCells) best = r;
    if (covered === targetCells) break;
    // widen by one line on each side only the areas some of whose cells stay short
    extraLines = areas.map((a) => (a.patchIndices.every((pi) => difference.lostPatches[pi].every((i) => ok[i])) ? 0 : 1));
  }
  return best;
}

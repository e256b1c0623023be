/** The client's spec for a coverage raster (one-sided items), the attitude envelope and raster settings from a mission, and compliance: share of area per item and failing patches. */
import type { Mission } from './mission';
import { ENVELOPE_PRESETS, type AttitudeEnvelope, type EnvelopePresetId } from './attitude-envelope';
import type { CoverageRaster } from './coverage';
import { check } from './errors';
import { DEFAULT_MAX_COVERAGE_CELLS } from './coverage-grid';
import { COVERAGE_RANGES } from './coverage-ranges';
import { gsdBandCm } from './gsd';

/** The GSD band's coarse end, without the float noise of the product (2.5 × 1.1 is 2.7500000000000004, said "2.75"). */
function bandTopCm(mission: { targetGsdCm: number; gsdTolerance: number }): number {
  return Number(gsdBandCm(mission).max.toPrecision(12));
}

/** What the client asks of every ground cell; each item one-sided. */
export interface CoverageSpec {
  /** The coarsest GSD allowed anywhere: some view of every cell must be at least this fine (cm). */
  maxGsdCm: number;
  /** Fewest views (photos that see the point) per cell. */
  minViews: number;
  /** Largest advisory predicted vertical / horizontal σ allowed (m), or null when the spec has none. */
  maxSigmaVerticalM: number | null;
  maxSigmaHorizontalM: number | null;
  /**
   * Views from all round (for 3D): the widest gap allowed between the compass directions of a cell's oblique views
   * (`view-directions.ts`), degrees, or null when the spec does not ask for it.
   */
  maxDirectionGapDeg: number | null;
  /** The least angle from the vertical at which a view counts as oblique for that item, degrees. */
  obliqueDeg: number;
}

/** The raster options a spec needs beyond the GSD: the oblique angle when it asks for views from all round. */
export function specRasterOptions(spec: CoverageSpec): { specGsdCm: number; obliqueDeg?: number } {
  return spec.maxDirectionGapDeg === null ? { specGsdCm: spec.maxGsdCm } : { specGsdCm: spec.maxGsdCm, obliqueDeg: spec.obliqueDeg };
}

/** Whether cell `i` meets the views-from-all-round item (true when the spec has none). */
export function meetsDirections(r: CoverageRaster, spec: CoverageSpec, i: number): boolean {
  if (spec.maxDirectionGapDeg === null) return true;
  const gap = r.directionGapDeg ? r.directionGapDeg[i] : NaN;
  return gap <= spec.maxDirectionGapDeg;
}

/** Raster settings. */
export interface CoverageSettings {
  /** Cell side (m); null = the grid's own resolution. */
  cellM: number | null;
  maxCells: number;
  imageErrorPx: number;
  occlusion: boolean;
}

/** Whether cell `i` meets every item of the spec (as `coverageCompliance` counts them: unknown ground meets none). */
export function cellMeetsSpec(r: CoverageRaster, spec: CoverageSpec, i: number): boolean {
  if (!(r.cells.z[i] === r.cells.z[i])) return false;
  if (!(r.finestGsdCm[i] <= spec.maxGsdCm) || r.views[i] < spec.minViews) return false;
  if (spec.maxSigmaVerticalM !== null && !(r.sigmaVerticalM[i] <= spec.maxSigmaVerticalM)) return false;
  if (spec.maxSigmaHorizontalM !== null && !(r.sigmaHorizontalM[i] <= spec.maxSigmaHorizontalM)) return false;
  return meetsDirections(r, spec, i);
}

type R = keyof typeof COVERAGE_RANGES;

function num(obj: Record<string, unknown>, where: string, key: string, range: R, fallback: number): number;
function num(obj: Record<string, unknown>, where: string, key: string, range: R, fallback: null): number | null;
function num(obj: Record<string, unknown>, where: string, key: string, range: R, fallback: number | null): number | null {
  const v = obj[key];
  if (v === undefined || v === null) return fallback;
  const r = COVERAGE_RANGES[range];
  check(typeof v === 'number' && Number.isFinite(v) && v >= r.min && v <= r.max, `${where}.${key} must be a number from ${r.min} to ${r.max}, got ${JSON.stringify(v)}.`);
  return v;
}

function objectOf(m: Record<string, unknown>, key: string): Record<string, unknown> {
  const v = m[key];
  if (v === undefined || v === null) return {};
  check(typeof v === 'object' && !Array.isArray(v), `${key} must be an object, got ${JSON.stringify(v)}.`);
  return v as Record<string, unknown>;
}

/**
 * The spec, envelope and settings of a mission written by a user (optional fields `spec`, `envelope`,
 * `coverage`). Spec defaults: the coarse end of the mission's GSD band, and 2 views (the fewest rays that fix a
 * point at all). No envelope unless the mission names one; a preset fills roll, pitch and crabbing, each editable.
 */
export function resolveCoverageInput(input: unknown, mission: Mission): { spec: CoverageSpec; envelope: AttitudeEnvelope | null; settings: CoverageSettings } {
  const m = input as Record<string, unknown>;
  const s = objectOf(m, 'spec');
  const minViews = num(s, 'spec', 'minViews', 'minViews', 2);
  check(Number.isInteger(minViews), `spec.minViews must be a whole number, got ${minViews}.`);
  const spec: CoverageSpec = {
    maxGsdCm: num(s, 'spec', 'maxGsdCm', 'maxGsdCm', bandTopCm(mission)),
    minViews,
    maxSigmaVerticalM: num(s, 'spec', 'maxSigmaVerticalM', 'maxSigmaM', null),
    maxSigmaHorizontalM: num(s, 'spec', 'maxSigmaHorizontalM', 'maxSigmaM', null),
    maxDirectionGapDeg: num(s, 'spec', 'maxDirectionGapDeg', 'maxDirectionGapDeg', null),
    // 30° from the vertical: a slant at which a face is seen well enough to match (our choice, common practice for oblique capture)
    obliqueDeg: num(s, 'spec', 'obliqueDeg', 'obliqueDeg', 30),
  };
  let envelope: AttitudeEnvelope | null = null;
  if (m.envelope !== undefined && m.envelope !== null) {
    const e = objectOf(m, 'envelope');
    const presetId = (e.preset ?? 'multirotor') as EnvelopePresetId;
    check(presetId === 'multirotor' || presetId === 'fixed-wing', `envelope.preset must be "multirotor" or "fixed-wing", got ${JSON.stringify(e.preset)}.`);
    const preset = ENVELOPE_PRESETS[presetId];
    check(e.crabs === undefined || typeof e.crabs === 'boolean', `envelope.crabs must be true or false, got ${JSON.stringify(e.crabs)}.`);
    envelope = {
      rollDeg: num(e, 'envelope', 'rollDeg', 'rollDeg', preset.rollDeg),
      pitchDeg: num(e, 'envelope', 'pitchDeg', 'pitchDeg', preset.pitchDeg),
      windMps: num(e, 'envelope', 'windMps', 'windMps', 0),
      windFromDeg: num(e, 'envelope', 'windFromDeg', 'windFromDeg', 0) % 360,
      airspeedMps: num(e, 'envelope', 'airspeedMps', 'airspeedMps', mission.speedMps),
      crabs: (e.crabs as boolean | undefined) ?? preset.crabs,
      stepDeg: num(e, 'envelope', 'stepDeg', 'stepDeg', 5),
    };
  }
  const c = objectOf(m, 'coverage');
  check(c.occlusion === undefined || typeof c.occlusion === 'boolean', `coverage.occlusion must be true or false, got ${JSON.stringify(c.occlusion)}.`);
  const maxCells = num(c, 'coverage', 'maxCells', 'maxCells', DEFAULT_MAX_COVERAGE_CELLS);
  const settings: CoverageSettings = {
    cellM: num(c, 'coverage', 'cellM', 'cellM', null),
    maxCells: Math.floor(maxCells),
    imageErrorPx: num(c, 'coverage', 'imageErrorPx', 'imageErrorPx', 0.5),
    occlusion: (c.occlusion as boolean | undefined) ?? true,
  };
  return { spec, envelope, settings };
}

/** Why a cell fails the spec. */
type CoverageFailure = 'gsd' | 'views' | 'sigma-vertical' | 'sigma-horizontal' | 'directions' | 'ground-unknown';

/** One spec item's outcome over the area. */
interface ComplianceItem {
  item: CoverageFailure;
  /** What the item asks, in words. */
  asks: string;
  /** Share of the area's cells that meet it (fraction). */
  share: number;
  failingAreaM2: number;
}

/** Connected failing cells (4-neighbour) with one reason. */
interface FailingPatch {
  reason: CoverageFailure;
  message: string;
  cells: number;
  areaM2: number;
  /** Mean of the cell centres in the raster's CRS (x, y) and the worst value of the measure in the patch. */
  centroidX: number;
  centroidY: number;
  worst: number | null;
}

/** Compliance of a raster with a spec. */
export interface Compliance {
  cellsInArea: number;
  areaM2: number;
  items: ComplianceItem[];
  /** Share of cells that meet every item. */
  shareAll: number;
  patches: FailingPatch[];
}

/**
 * Share of area meeting each item and the failing patches, largest first. A cell whose ground is unknown fails
 * every item (it cannot be shown to meet any) and is reported as its own reason.
 */
export function coverageCompliance(raster: CoverageRaster, spec: CoverageSpec): Compliance {
  const { cells } = raster;
  const { width, height, inside } = cells;
  const n = width * height;
  const items: Array<{ item: CoverageFailure; asks: string; fails: (i: number) => boolean; worstOf: (i: number) => number; worse: (a: number, b: number) => boolean; what: (w: number | null) => string }> = [];
  const unknown = (i: number) => !(cells.z[i] === cells.z[i]);
  const basis = raster.guaranteed ? 'guaranteed under the attitude envelope' : 'as planned';
  items.push({
    item: 'gsd', asks: `a view with GSD at most ${spec.maxGsdCm} cm`,
    fails: (i) => !unknown(i) && !(raster.finestGsdCm[i] <= spec.maxGsdCm),
    worstOf: (i) => raster.finestGsdCm[i], worse: (a, b) => !(a <= b),
    what: (w) => `no view at or finer than ${spec.maxGsdCm} cm (${basis}); finest there ${w === null || !Number.isFinite(w) ? 'none' : `${w.toFixed(2)} cm`}`,
  });
  items.push({
    item: 'views', asks: `at least ${spec.minViews} views`,
    fails: (i) => !unknown(i) && raster.views[i] < spec.minViews,
    worstOf: (i) => raster.views[i], worse: (a, b) => a < b,
    what: (w) => `fewer than ${spec.minViews} views (${basis}); fewest there ${w}`,
  });
  if (spec.maxSigmaVerticalM !== null) {
    const lim = spec.maxSigmaVerticalM;
    items.push({
      item: 'sigma-vertical', asks: `predicted vertical σ at most ${lim} m (advisory)`,
      fails: (i) => !unknown(i) && !(raster.sigmaVerticalM[i] <= lim),
      worstOf: (i) => raster.sigmaVerticalM[i], worse: (a, b) => !(a <= b),
      what: (w) => `predicted vertical σ above ${lim} m (advisory); worst there ${w === null || !Number.isFinite(w) ? 'not determined (fewer than 2 views)' : `${w.toFixed(3)} m`}`,
    });
  }
  if (spec.maxSigmaHorizontalM !== null) {
    const lim = spec.maxSigmaHorizontalM;
    items.push({
      item: 'sigma-horizontal', asks: `predicted horizontal σ at most ${lim} m (advisory)`,
      fails: (i) => !unknown(i) && !(raster.sigmaHorizontalM[i] <= lim),
      worstOf: (i) => raster.sigmaHorizontalM[i], worse: (a, b) => !(a <= b),
      what: (w) => `predicted horizontal σ above ${lim} m (advisory); worst there ${w === null || !Number.isFinite(w) ? 'not determined (fewer than 2 views)' : `${w.toFixed(3)} m`}`,
    });
  }
  if (spec.maxDirectionGapDeg !== null) {
    const lim = spec.maxDirectionGapDeg;
    items.push({
      item: 'directions', asks: `views from all round: no gap wider than ${lim}° between the directions of views at least ${spec.obliqueDeg}° from the vertical`,
      fails: (i) => !unknown(i) && !meetsDirections(raster, spec, i),
      worstOf: (i) => (raster.directionGapDeg ? raster.directionGapDeg[i] : NaN), worse: (a, b) => !(a <= b),
      // the figure right after "widest gap", so it cannot be read as an angle from the vertical
      what: (w) => `seen from too few sides (${basis}): widest gap ${w === null || !Number.isFinite(w) ? 'not known' : w >= 360 ? '360° (fewer than 2 such views)' : `${w.toFixed(0)}°`} between views at least ${spec.obliqueDeg}° from the vertical, the spec allows ${lim}°`,
    });
  }
  items.push({ item: 'ground-unknown', asks: 'known ground height', fails: unknown, worstOf: () => NaN, worse: () => false, what: () => 'the elevation grid has no height here' });
  const a = cells.cellAreaM2;
  const t = cells.transform;
  const failAny = new Uint8Array(n);
  const outItems: ComplianceItem[] = [];
  const patches: FailingPatch[] = [];
  const mask = new Uint8Array(n);
  const stack = new Int32Array(n);
  for (const it of items) {
    let failing = 0;
    mask.fill(0);
    for (let i = 0; i < n; i++) if (inside[i] && it.fails(i)) { mask[i] = 1; failAny[i] = 1; failing++; }
    if (it.item !== 'ground-unknown' || failing > 0) {
      outItems.push({ item: it.item, asks: it.asks, share: cells.insideCount ? 1 - failing / cells.insideCount : 0, failingAreaM2: failing * a });
    }
    // connected components by flood fill (4-neighbours), one explicit stack for all
    for (let s0 = 0; s0 < n; s0++) {
      if (mask[s0] !== 1) continue;
      let top = 0, count = 0, sx = 0, sy = 0, worst: number | null = null;
      stack[top++] = s0; mask[s0] = 2;
      while (top > 0) {
        const i = stack[--top];
        const r = (i / width) | 0, c = i - r * width;
        count++; sx += c; sy += r;
        const w = it.worstOf(i);
        if (worst === null || it.worse(w, worst)) worst = w;
        if (c > 0 && mask[i - 1] === 1) { mask[i - 1] = 2; stack[top++] = i - 1; }
        if (c < width - 1 && mask[i + 1] === 1) { mask[i + 1] = 2; stack[top++] = i + 1; }
        if (r > 0 && mask[i - width] === 1) { mask[i - width] = 2; stack[top++] = i - width; }
        if (r < height - 1 && mask[i + width] === 1) { mask[i + width] = 2; stack[top++] = i + width; }
      }
      const worstOut = worst !== null && Number.isFinite(worst) ? worst : null;
      patches.push({
        reason: it.item, message: it.what(worstOut), cells: count, areaM2: count * a,
        centroidX: t[0] + (sx / count + 0.5) * t[1], centroidY: t[3] + (sy / count + 0.5) * t[5], worst: worstOut,
      });
    }
  }
  let fails = 0;
  for (let i = 0; i < n; i++) if (inside[i] && failAny[i]) fails++;
  patches.sort((p, q) => q.areaM2 - p.areaM2);
  return { cellsInArea: cells.insideCount, areaM2: cells.insideCount * a, items: outItems, shareAll: cells.insideCount ? 1 - fails / cells.insideCount : 0, patches };
}

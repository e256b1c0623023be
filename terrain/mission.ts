/** The mission a plan is analysed for: the Mission type, its defaults and ranges, and the boundary check that applies them. */
import type { Camera } from './camera';
import { checkCamera } from './camera';
import type { AltitudeMode } from './altitude';
import { TerrainError, check } from './errors';
import { surveyAreaProblem, type AreaPolygon } from './survey-area';

export type { AreaPolygon } from './survey-area';

/** Everything a plan analysis needs; heights in metres, overlaps and tolerances as fractions, speeds in m/s. */
export interface Mission {
  area: AreaPolygon;
  camera: Camera;
  targetGsdCm: number;
  gsdTolerance: number;
  forwardOverlap: number;
  sideOverlap: number;
  /** Flight direction of the first line (degrees clockwise from north), or "advise" to pick the least AGL spread. */
  headingDeg: number | 'advise';
  mode: AltitudeMode;
  clearanceM: number;
  obstacleAllowanceM: number;
  maxAglM: number;
  speedMps: number;
  climbMps: number;
  descentMps: number;
  takeoff: { lon: number; lat: number };
  minLegLengthM: number;
  maxLegsPerLine: number;
  altitudeRoundingM: number;
  runInM: number;
  enduranceMin: number;
  batteryReserve: number;
  turnTimeS: number;
  /** Ground-profile sample step along lines; null = from the grid's pixel size (clamped to 1..10 m). */
  stationStepM: number | null;
}

/** A mission as written by a user: the required fields, the rest optional (defaults below). */
export type MissionInput = Pick<Mission, 'area' | 'camera' | 'targetGsdCm' | 'takeoff'> & Partial<Omit<Mission, 'area' | 'camera' | 'targetGsdCm' | 'takeoff'>>;

/** A numeric range: inclusive unless `exclusiveMin`; `integer` for whole numbers. */
export interface NumberRange {
  min: number;
  max: number;
  exclusiveMin?: boolean;
  integer?: boolean;
}

/** Ranges of the numeric mission fields (shared with the zod contract). */
export const MISSION_RANGES = Object.freeze({
  targetGsdCm: { min: 0.1, max: 100 },
  gsdTolerance: { min: 0, max: 0.5 },
  forwardOverlap: { min: 0, max: 0.95 },
  sideOverlap: { min: 0, max: 0.95 },
  headingDeg: { min: 0, max: 360 },
  clearanceM: { min: 0, max: 1000 },
  obstacleAllowanceM: { min: 0, max: 1000 },
  maxAglM: { min: 0, max: 3000, exclusiveMin: true },
  speedMps: { min: 0, max: 60, exclusiveMin: true },
  climbMps: { min: 0, max: 30, exclusiveMin: true },
  descentMps: { min: 0, max: 30, exclusiveMin: true },
  minLegLengthM: { min: 0, max: 10_000 },
  maxLegsPerLine: { min: 1, max: 200, integer: true },
  altitudeRoundingM: { min: 0, max: 50 },
  runInM: { min: 0, max: 2000 },
  enduranceMin: { min: 0, max: 1440, exclusiveMin: true },
  batteryReserve: { min: 0, max: 0.9 },
  turnTimeS: { min: 0, max: 600 },
  stationStepM: { min: 0.25, max: 100 },
} satisfies Record<string, NumberRange>);

/**
 * Defaults of the optional fields. Overlaps follow the usual photogrammetric 80 % / 70 % (common practice,
 * see DOMAIN.md); the 120 m height limit is a common regulatory figure that local rules override; run-in,
 * leg and battery figures are common practice for small multirotors, not any aircraft's specification.
 */
export const MISSION_DEFAULTS = Object.freeze({
  gsdTolerance: 0.1,
  forwardOverlap: 0.8,
  sideOverlap: 0.7,
  headingDeg: 'advise' as number | 'advise',
  mode: 'follow' as AltitudeMode,
  clearanceM: 30,
  obstacleAllowanceM: 0,
  maxAglM: 120,
  speedMps: 10,
  climbMps: 3,
  descentMps: 2,
  minLegLengthM: 50,
  maxLegsPerLine: 10,
  altitudeRoundingM: 1,
  runInM: 20,
  enduranceMin: 25,
  batteryReserve: 0.25,
  turnTimeS: 10,
  stationStepM: null as number | null,
});

function inRange(name: string, v: unknown, r: NumberRange): number {
  const ok = typeof v === 'number' && Number.isFinite(v) && (r.exclusiveMin ? v > r.min : v >= r.min) && v <= r.max && (!r.integer || Number.isInteger(v));
  check(ok, `${name} must be ${r.integer ? 'a whole number' : 'a number'} ${r.exclusiveMin ? 'above' : 'from'} ${r.min} to ${r.max}, got ${JSON.stringify(v)}.`);
  return v as number;
}

/** Throw `invalid-input` unless `area` is a closed, simple WGS 84 polygon of sensible size (the rules: survey-area.ts). */
export function checkArea(area: unknown): AreaPolygon {
  const problem = surveyAreaProblem(area);
  if (problem) throw new TerrainError('invalid-input', problem.message);
  return area as AreaPolygon;
}

/** Apply defaults and range checks to a mission written by a user; throws TerrainError('invalid-input') saying what is wrong. */
export function resolveMission(input: unknown): Mission {
  if (input === null || typeof input !== 'object') throw new TerrainError('invalid-input', `mission must be a JSON object, got ${JSON.stringify(input)}.`);
  const m = input as Record<string, unknown>;
  const area = checkArea(m.area);
  checkCamera(m.camera as Camera);
  const take = m.takeoff as { lon: number; lat: number } | undefined;
  check(take !== null && typeof take === 'object' && Number.isFinite(take.lon) && Number.isFinite(take.lat) && Math.abs(take.lon) <= 180 && Math.abs(take.lat) <= 90,
    `takeoff must be { "lon": …, "lat": … } in degrees, got ${JSON.stringify(take)}.`);
  const num = (k: keyof typeof MISSION_RANGES) => {
    const v = m[k] === undefined ? (MISSION_DEFAULTS as Record<string, unknown>)[k] : m[k];
    return inRange(k, v, MISSION_RANGES[k]);
  };
  const heading = m.headingDeg === undefined ? MISSION_DEFAULTS.headingDeg : m.headingDeg;
  const headingDeg = heading === 'advise' ? 'advise' : inRange('headingDeg', heading, MISSION_RANGES.headingDeg) % 360;
  const mode = (m.mode ?? MISSION_DEFAULTS.mode) as AltitudeMode;
  check(mode === 'hold' || mode === 'steps' || mode === 'follow', `mode must be "hold", "steps" or "follow", got ${JSON.stringify(m.mode)}.`);
  const step = m.stationStepM === undefined || m.stationStepM === null ? null : inRange('stationStepM', m.stationStepM, MISSION_RANGES.stationStepM);
  const out: Mission = {
    area,
    camera: m.camera as Camera,
    targetGsdCm: inRange('targetGsdCm', m.targetGsdCm, MISSION_RANGES.targetGsdCm),
    gsdTolerance: num('gsdTolerance'),
    forwardOverlap: num('forwardOverlap'),
    sideOverlap: num('sideOverlap'),
    headingDeg,
    mode,
    clearanceM: num('clearanceM'),
    obstacleAllowanceM: num('obstacleAllowanceM'),
    maxAglM: num('maxAglM'),
    speedMps: num('speedMps'),
    climbMps: num('climbMps'),
    descentMps: num('descentMps'),
    takeoff: { lon: take.lon, lat: take.lat },
    minLegLengthM: num('minLegLengthM'),
    maxLegsPerLine: num('maxLegsPerLine'),
    altitudeRoundingM: num('altitudeRoundingM'),
    runInM: num('runInM'),
    enduranceMin: num('enduranceMin'),
    batteryReserve: num('batteryReserve'),
    turnTimeS: num('turnTimeS'),
    stationStepM: step,
  };
  check(out.clearanceM + out.obstacleAllowanceM < out.maxAglM,
    `clearance plus obstacle allowance (${out.clearanceM + out.obstacleAllowanceM} m) must be below the maximum height above ground (${out.maxAglM} m).`);
  return out;
}

/** The mission input of a plan (CLI, API, plan form): zod schema with the terrain core's ranges and defaults. */
import { z } from 'zod';
import { missionCoverageFieldsSchema } from './coverage';
import { MISSION_DEFAULTS, MISSION_RANGES, type NumberRange } from '../terrain/mission';
import { areaRingsProblem, surveyAreaProblem } from '../terrain/survey-area';
import { layoutBySchema, solveSettingsSchema } from './solve';

/** A number in a mission range, with a message that says the range. */
function ranged(name: string, r: NumberRange) {
  const what = r.integer ? 'a whole number' : 'a number';
  const msg = `${name} must be ${what} ${r.exclusiveMin ? 'above' : 'from'} ${r.min} to ${r.max}.`;
  let s = z.number({ error: msg });
  s = r.exclusiveMin ? s.gt(r.min, { error: msg }) : s.gte(r.min, { error: msg });
  s = s.lte(r.max, { error: msg });
  return r.integer ? s.int({ error: msg }) : s;
}

const R = MISSION_RANGES;
const D = MISSION_DEFAULTS;
const positive = (name: string, max: number) => z.number({ error: `${name} must be a number.` }).gt(0, { error: `${name} must be above 0.` }).lte(max, { error: `${name} must be at most ${max}.` });

const altitudeModes = ['hold', 'steps', 'follow'] as const;
/** Altitude modes: one altitude per line, a few level legs, or sloped legs that track the ground. */
export const altitudeModeSchema = z.enum(altitudeModes);

const distortionSchema = z.object({
  k1: z.number().gt(-10).lt(10), k2: z.number().gt(-10).lt(10), k3: z.number().gt(-10).lt(10),
  p1: z.number().gt(-10).lt(10), p2: z.number().gt(-10).lt(10),
});

/** Camera: sensor (mm), lens (mm), image (px); which image side runs along track; optional principal point and Brown distortion. */
const cameraSchema = z
  .object({
    sensorWidthMm: positive('camera.sensorWidthMm', 500),
    sensorHeightMm: positive('camera.sensorHeightMm', 500),
    focalLengthMm: positive('camera.focalLengthMm', 1000),
    imageWidthPx: positive('camera.imageWidthPx', 100_000).int({ error: 'camera.imageWidthPx must be whole pixels.' }),
    imageHeightPx: positive('camera.imageHeightPx', 100_000).int({ error: 'camera.imageHeightPx must be whole pixels.' }),
    alongTrackSide: z.enum(['height', 'width']).optional(),
    principalPointPx: z.object({ x: z.number().gte(0), y: z.number().gte(0) }).optional(),
    distortion: distortionSchema.optional(),
  })
  .superRefine((c, ctx) => {
    if (c.principalPointPx && (c.principalPointPx.x > c.imageWidthPx || c.principalPointPx.y > c.imageHeightPx)) {
      ctx.addIssue({ code: 'custom', path: ['principalPointPx'], message: `camera.principalPointPx must lie inside the ${c.imageWidthPx} x ${c.imageHeightPx} image.` });
    }
  });

export { MAX_AREA_CORNERS } from '../terrain/survey-area';

/** Polygon coordinates, checked by the survey-area rules' one plain loop (zod's nested arrays were far slower). */
const ringsSchema = z.custom<number[][][]>().superRefine((v, ctx) => {
  const problem = areaRingsProblem(v, false);
  if (problem) ctx.addIssue({ code: 'custom', message: problem.message });
});

/** The GeoJSON Polygon shape of a survey area, without the geometry checks (for areas already checked when saved). */
const areaPolygonShapeSchema = z.object({
  type: z.literal('Polygon', { error: 'area.type must be "Polygon".' }),
  coordinates: ringsSchema,
});

/** Survey area: a closed, simple GeoJSON Polygon in WGS 84 longitude/latitude (the rules of terrain/survey-area.ts). */
const areaPolygonSchema = areaPolygonShapeSchema.superRefine((a, ctx) => {
  const problem = surveyAreaProblem(a);
  if (problem) ctx.addIssue({ code: 'custom', message: problem.message });
});

const lonLatSchema = z.object({ lon: z.number().gte(-180).lte(180), lat: z.number().gte(-90).lte(90) });

/** The mission's fields; `area` is given by the two schemas below. */
const missionFields = z.object({
  area: areaPolygonShapeSchema,
  camera: cameraSchema,
  targetGsdCm: ranged('targetGsdCm', R.targetGsdCm),
  gsdTolerance: ranged('gsdTolerance', R.gsdTolerance).default(D.gsdTolerance),
  forwardOverlap: ranged('forwardOverlap', R.forwardOverlap).default(D.forwardOverlap),
  sideOverlap: ranged('sideOverlap', R.sideOverlap).default(D.sideOverlap),
  headingDeg: z.union([ranged('headingDeg', R.headingDeg), z.literal('advise')]).default(D.headingDeg),
  mode: altitudeModeSchema.default(D.mode),
  clearanceM: ranged('clearanceM', R.clearanceM).default(D.clearanceM),
  obstacleAllowanceM: ranged('obstacleAllowanceM', R.obstacleAllowanceM).default(D.obstacleAllowanceM),
  maxAglM: ranged('maxAglM', R.maxAglM).default(D.maxAglM),
  speedMps: ranged('speedMps', R.speedMps).default(D.speedMps),
  climbMps: ranged('climbMps', R.climbMps).default(D.climbMps),
  descentMps: ranged('descentMps', R.descentMps).default(D.descentMps),
  takeoff: lonLatSchema,
  minLegLengthM: ranged('minLegLengthM', R.minLegLengthM).default(D.minLegLengthM),
  maxLegsPerLine: ranged('maxLegsPerLine', R.maxLegsPerLine).default(D.maxLegsPerLine),
  altitudeRoundingM: ranged('altitudeRoundingM', R.altitudeRoundingM).default(D.altitudeRoundingM),
  runInM: ranged('runInM', R.runInM).default(D.runInM),
  enduranceMin: ranged('enduranceMin', R.enduranceMin).default(D.enduranceMin),
  batteryReserve: ranged('batteryReserve', R.batteryReserve).default(D.batteryReserve),
  turnTimeS: ranged('turnTimeS', R.turnTimeS).default(D.turnTimeS),
  stationStepM: ranged('stationStepM', R.stationStepM).nullable().default(D.stationStepM),
  /** The client's spec for every ground cell, the attitude envelope and the coverage raster's settings (all optional). */
  ...missionCoverageFieldsSchema.shape,
  /** Who lays the lines out (default `settings`); with `solver`, the solver's own settings. */
  layoutBy: layoutBySchema.optional(),
  solve: solveSettingsSchema.optional(),
});

/** The mission: required area, camera, target GSD and takeoff; everything else has a default. */
export const missionSchema = missionFields
  .extend({ area: areaPolygonSchema })
  .superRefine((m, ctx) => {
    if (m.clearanceM + m.obstacleAllowanceM >= m.maxAglM) {
      ctx.addIssue({ code: 'custom', path: ['clearanceM'], message: `clearance plus obstacle allowance (${m.clearanceM + m.obstacleAllowanceM} m) must be below the maximum height above ground (${m.maxAglM} m).` });
    }
  });

/**
 * A mission as Loftline stored it (every check and default already applied when it was saved): read back in
 * responses without the area's geometry checks, so listing plans never repeats them.
 */
export const storedMissionSchema = missionFields;
/** A mission with every default applied. */
export type MissionValues = z.output<typeof missionSchema>;

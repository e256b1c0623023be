/** The plan analysis result (CLI `plan`, worker, API): zod schema of what `analysePlan` returns. */
import { z } from 'zod';
import { unmetReasons } from '../terrain/unmet-words';
import { altitudeModeSchema } from './mission';
import { solveReportSchema } from './solve';

const n = z.number();
const nn = z.number().nullable();
const fraction = z.number().gte(0).lte(1);

const stationFlagCodes = ['ground-unknown', 'footprint-off-grid', 'forward-overlap-low', 'side-overlap-low', 'forward-overlap-envelope', 'side-overlap-envelope', 'gsd-coarse', 'gsd-fine', 'above-max-agl', 'below-clearance'] as const;
/** The engine's reasons a stretch leaves the band (listed, and said in words, in `terrain/unmet-words.ts`). */
export { unmetReasons };

const stationFlagSchema = z.object({ code: z.enum(stationFlagCodes), reason: z.string() });
const planWarningSchema = z.object({ code: z.string(), message: z.string() });

const planPointSchema = z.object({ lon: n, lat: n, distanceM: n });

/** One exposure station; heights above the grid's vertical datum unless named "AboveTakeoff". */
export const planStationSchema = z.object({
  lon: n, lat: n, distanceM: n,
  groundM: nn, altitudeM: n, altitudeAboveTakeoffM: n, aglM: nn, gsdCm: nn,
  forwardOverlap: fraction.nullable(), sideOverlap: fraction.nullable(),
  // as guaranteed under the mission's attitude envelope (null without one; absent in results stored before)
  forwardOverlapGuaranteed: fraction.nullable().optional(), sideOverlapGuaranteed: fraction.nullable().optional(),
  flags: z.array(stationFlagSchema),
});

/** One straight altitude leg; gradient is rise over run in the flying direction. */
export const planLegSchema = z.object({
  start: planPointSchema, end: planPointSchema,
  altitudeStartM: n, altitudeEndM: n, altitudeStartAboveTakeoffM: n, altitudeEndAboveTakeoffM: n,
  aglMinM: n, aglMaxM: n, gsdMinCm: n, gsdMaxCm: n, gradient: n,
  // solved plans only: ground speed and photo spacing per leg
  speedMps: n.optional(), triggerDistanceM: z.object({ min: n, max: n }).optional(),
});

const unmetStretchSchema = z.object({ startM: n, endM: n, reason: z.enum(unmetReasons), message: z.string() });

export const planLineSchema = z.object({
  index: z.number().int(), headingDeg: n, lengthM: n,
  start: z.object({ lon: n, lat: n }), end: z.object({ lon: n, lat: n }),
  areaStartM: n, areaEndM: n,
  // oblique capture: the camera tilted on its mount towards the nose, degrees from straight down (absent: straight down)
  cameraTiltDeg: n.optional(),
  // the altitude above takeoff the straight way home from the line's end keeps the clearance at (a battery change
  // after it); optional: results stored before had none
  returnAltitudeAboveTakeoffM: n.optional(),
  stations: z.array(planStationSchema), legs: z.array(planLegSchema),
  unmet: z.array(unmetStretchSchema), warnings: z.array(planWarningSchema),
});

/** The attitude envelope the guaranteed overlaps hold under (angles in degrees, speeds in m/s). */
const overlapEnvelopeSchema = z.object({
  rollDeg: n, pitchDeg: n, windMps: n, windFromDeg: n, airspeedMps: n, crabs: z.boolean(), crabDegMax: n, stepDeg: n,
  marginPx: n, attitudeCount: z.number().int(), words: z.string(),
});

const planSummarySchema = z.object({
  lineCount: z.number().int(), photoCount: z.number().int(), flightDistanceM: n, flightTimeS: n, batteries: z.number().int(),
  gsdCm: z.object({ min: nn, median: nn, max: nn }),
  forwardOverlapMin: fraction.nullable(), sideOverlapMin: fraction.nullable(), aglMinM: nn, aglMaxM: nn,
  // optional and nullable: results stored before had none; null = the mission has no envelope (as planned only)
  forwardOverlapGuaranteedMin: fraction.nullable().optional(), sideOverlapGuaranteedMin: fraction.nullable().optional(),
  overlapEnvelope: overlapEnvelopeSchema.nullable().optional(),
  shareWithinGsdTarget: fraction, flaggedStationCount: z.number().int(), unmetLengthM: n,
  mode: altitudeModeSchema, headingDeg: n, plannedHeightM: n, gsdBandCm: z.object({ min: n, max: n }),
  lineSpacingM: n, triggerDistanceM: n, footprintAcrossM: n, footprintAlongM: n, maxDistanceFromTakeoffM: n,
});

const headingOptionSchema = z.object({ headingDeg: n, lineCount: z.number().int(), flightDistanceM: n, aglSpreadM: n, aglRangeMaxM: n });

/** The whole analysis. */
export const planResultSchema = z.object({
  lines: z.array(planLineSchema),
  summary: planSummarySchema,
  warnings: z.array(planWarningSchema),
  // returnAltitude…: the altitude (above the datum, and above takeoff) the straight return from the last line's end
  // to the takeoff keeps the clearance at, never below that end's own (optional: results stored before had none)
  takeoff: z.object({ lon: n, lat: n, groundM: n, geoidUndulationM: n, returnAltitudeM: n.optional(), returnAltitudeAboveTakeoffM: n.optional() }),
  heights: z.object({ datum: z.string(), aboveTakeoff: z.string(), verticalDatum: z.object({ epsg: z.number().int().nullable(), name: z.string() }).nullable() }),
  headingAdvice: z.object({ recommendedDeg: n, options: z.array(headingOptionSchema) }).nullable(),
  frame: z.object({ crs: z.string(), epsg: z.number().int().nullable() }),
  /** Present when the solver laid the lines out (mission `layoutBy: "solver"`): why, and its proof. */
  solved: solveReportSchema.optional(),
});

export type PlanResultData = z.infer<typeof planResultSchema>;

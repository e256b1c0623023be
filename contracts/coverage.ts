/** The coverage fields of a mission (spec, attitude envelope, raster settings) and the compliance summary of a coverage raster: zod shapes with the terrain core's ranges. */
import { z } from 'zod';
import { COVERAGE_RANGES } from '../terrain/coverage-spec';

type Range = { min: number; max: number };
function ranged(name: string, r: Range) {
  const msg = `${name} must be a number from ${r.min} to ${r.max}.`;
  return z.number({ error: msg }).gte(r.min, { error: msg }).lte(r.max, { error: msg });
}
const R = COVERAGE_RANGES;

/** What every ground cell must meet, one-sided; left-out items take the mission's defaults (GSD band's coarse end, 2 views). */
export const coverageSpecSchema = z.object({
  maxGsdCm: ranged('spec.maxGsdCm', R.maxGsdCm).optional(),
  minViews: ranged('spec.minViews', R.minViews).int({ error: 'spec.minViews must be a whole number.' }).optional(),
  maxSigmaVerticalM: ranged('spec.maxSigmaVerticalM', R.maxSigmaM).nullable().optional(),
  maxSigmaHorizontalM: ranged('spec.maxSigmaHorizontalM', R.maxSigmaM).nullable().optional(),
});

export const envelopePresets = ['multirotor', 'fixed-wing'] as const;

/** Wind, airspeed and attitude limits a guaranteed view must hold under; a preset fills what is left out. */
export const attitudeEnvelopeSchema = z.object({
  preset: z.enum(envelopePresets, { error: 'envelope.preset must be "multirotor" or "fixed-wing".' }).optional(),
  rollDeg: ranged('envelope.rollDeg', R.rollDeg).optional(),
  pitchDeg: ranged('envelope.pitchDeg', R.pitchDeg).optional(),
  windMps: ranged('envelope.windMps', R.windMps).optional(),
  windFromDeg: ranged('envelope.windFromDeg', R.windFromDeg).optional(),
  airspeedMps: ranged('envelope.airspeedMps', R.airspeedMps).optional(),
  crabs: z.boolean().optional(),
  stepDeg: ranged('envelope.stepDeg', R.stepDeg).optional(),
});

/** Raster settings: cell size (default the grid's resolution), cell cap, image measurement error, occlusion. */
export const coverageSettingsSchema = z.object({
  cellM: ranged('coverage.cellM', R.cellM).nullable().optional(),
  maxCells: ranged('coverage.maxCells', R.maxCells).int({ error: 'coverage.maxCells must be a whole number.' }).optional(),
  imageErrorPx: ranged('coverage.imageErrorPx', R.imageErrorPx).optional(),
  occlusion: z.boolean().optional(),
});

/** The optional coverage fields a mission may carry (to be merged into the mission's fields). */
export const missionCoverageFieldsSchema = z.object({
  spec: coverageSpecSchema.optional(),
  envelope: attitudeEnvelopeSchema.nullable().optional(),
  coverage: coverageSettingsSchema.optional(),
});

export const coverageFailureSchema = z.enum(['gsd', 'views', 'sigma-vertical', 'sigma-horizontal', 'ground-unknown']);

/** The compliance part of the `terrain coverage` document: share of area per spec item and the failing patches. */
export const coverageComplianceSchema = z.object({
  compliance: z.object({
    cellsInArea: z.number().int(),
    areaM2: z.number(),
    items: z.array(z.object({ item: coverageFailureSchema, asks: z.string(), share: z.number().min(0).max(1), failingAreaM2: z.number() })),
    shareAll: z.number().min(0).max(1),
    plannedShareMinViews: z.number().min(0).max(1),
  }),
  patchCount: z.number().int(),
  patches: z.array(z.object({
    reason: coverageFailureSchema, message: z.string(), cells: z.number().int(), areaM2: z.number(),
    centroid: z.object({ lon: z.number(), lat: z.number() }), worst: z.number().nullable(),
  })),
});
export type CoverageComplianceDoc = z.infer<typeof coverageComplianceSchema>;

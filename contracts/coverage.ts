/** The coverage fields of a mission (spec, attitude envelope, raster settings) and the compliance summary of a coverage raster: zod shapes with the terrain core's ranges. */
import { z } from 'zod';
import { COVERAGE_RANGES } from '../terrain/coverage-ranges';
import { coverageMeasures } from '../terrain/coverage-measures';

type Range = { min: number; max: number };
function ranged(name: string, r: Range) {
  const msg = `${name} must be a number from ${r.min} to ${r.max}.`;
  return z.number({ error: msg }).gte(r.min, { error: msg }).lte(r.max, { error: msg });
}
const R = COVERAGE_RANGES;

/** What every ground cell must meet, one-sided; left-out items take the mission's defaults (GSD band's coarse end, 2 views). */
const coverageSpecSchema = z.object({
  maxGsdCm: ranged('spec.maxGsdCm', R.maxGsdCm).optional(),
  minViews: ranged('spec.minViews', R.minViews).int({ error: 'spec.minViews must be a whole number.' }).optional(),
  maxSigmaVerticalM: ranged('spec.maxSigmaVerticalM', R.maxSigmaM).nullable().optional(),
  maxSigmaHorizontalM: ranged('spec.maxSigmaHorizontalM', R.maxSigmaM).nullable().optional(),
  // views from all round (3D): the widest gap between the directions of views at least obliqueDeg from the vertical
  maxDirectionGapDeg: ranged('spec.maxDirectionGapDeg', R.maxDirectionGapDeg).nullable().optional(),
  obliqueDeg: ranged('spec.obliqueDeg', R.obliqueDeg).optional(),
});

const envelopePresets = ['multirotor', 'fixed-wing'] as const;

/** Wind, airspeed and attitude limits a guaranteed view must hold under; a preset fills what is left out. */
const attitudeEnvelopeSchema = z.object({
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
const coverageSettingsSchema = z.object({
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

export const coverageFailureSchema = z.enum(['gsd', 'views', 'sigma-vertical', 'sigma-horizontal', 'directions', 'ground-unknown']);

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

const spread = z.object({ min: z.number().nullable(), median: z.number().nullable(), max: z.number().nullable() });

/** The coverage document of a plan (terrain/coverage-document.ts builds it; the command line prints it with the raster's path). */
const coverageDocumentSchema = coverageComplianceSchema.extend({
  raster: z.object({
    width: z.number().int(), height: z.number().int(), cellM: z.number(), cellAreaM2: z.number(),
    crs: z.object({ epsg: z.number().int().nullable(), name: z.string() }),
    geotransform: z.array(z.number()).length(6), nodata: z.number(), bands: z.array(z.string()), noValue: z.string(),
  }),
  spec: z.object({
    maxGsdCm: z.number(), minViews: z.number().int(), maxSigmaVerticalM: z.number().nullable(), maxSigmaHorizontalM: z.number().nullable(), basis: z.string(),
    // documents stored before the views-from-all-round item had neither field
    maxDirectionGapDeg: z.number().nullable().default(null), obliqueDeg: z.number().default(30),
  }),
  envelope: z.object({
    rollDeg: z.number(), pitchDeg: z.number(), windMps: z.number(), windFromDeg: z.number(), airspeedMps: z.number(), crabs: z.boolean(), stepDeg: z.number(),
    marginPx: z.number(), lines: z.array(z.object({ line: z.number().int(), headingDeg: z.number(), crabDeg: z.number() })),
  }).nullable(),
  summary: z.object({
    photoCount: z.number().int(), views: spread, viewsPlanned: spread, finestGsdCm: spread, maxRayAngleDeg: spread, sigmaVerticalM: spread, sigmaHorizontalM: spread,
  }),
  precision: z.string(),
  timingMs: z.object({ coverage: z.number() }),
});
export type CoverageDocument = z.infer<typeof coverageDocumentSchema>;

export const coverageMeasureSchema = z.enum(coverageMeasures, { error: 'The coverage measure must be "gsd", "views" or "sigma".' });

/** How one map layer colours a measure: the ends of its scale, the spec's limit, which end is better, legend stops. */
const coverageLayerInfoSchema = z.object({
  measure: coverageMeasureSchema,
  label: z.string(),
  unit: z.string(),
  min: z.number(),
  max: z.number(),
  limit: z.number().nullable(),
  better: z.enum(['low', 'high']),
  stops: z.array(z.object({ value: z.number(), colour: z.string().regex(/^#[0-9a-f]{6}$/) })),
});
export type CoverageLayerInfo = z.infer<typeof coverageLayerInfoSchema>;

/** What a version keeps of its coverage run: the document and the layers' legends (the images and raster are stored files). */
export const storedCoverageSchema = z.discriminatedUnion('state', [
  z.object({ state: z.literal('ready'), document: coverageDocumentSchema, layers: z.array(coverageLayerInfoSchema) }),
  /** The run was refused (too many cells, no EPSG code …): the plan's analysis stands, the reason says what to change. */
  z.object({ state: z.literal('refused'), reason: z.string() }),
]);
export type StoredCoverage = z.infer<typeof storedCoverageSchema>;

/** GET …/versions/:versionId/coverage: the stored run, with the addresses of the raster and the layer images. */
export const versionCoverageSchema = z.discriminatedUnion('state', [
  z.object({
    state: z.literal('ready'), document: coverageDocumentSchema, layers: z.array(coverageLayerInfoSchema.extend({ imageUrl: z.string() })),
    failingImageUrl: z.string(), rasterUrl: z.string(),
  }),
  z.object({ state: z.literal('refused'), reason: z.string() }),
  /** The analysis has not finished, or the version was analysed before coverage runs existed. */
  z.object({ state: z.literal('none'), reason: z.string() }),
]);
export type VersionCoverage = z.infer<typeof versionCoverageSchema>;

/** GET …/coverage/cell?lon=&lat=: the figures of the cell under a point and the spec items it fails. */
export const coverageCellSchema = z.object({
  lon: z.number(), lat: z.number(),
  inside: z.boolean(),
  views: z.number().nullable(),
  finestGsdCm: z.number().nullable(),
  viewsAtSpecGsd: z.number().nullable(),
  maxRayAngleDeg: z.number().nullable(),
  sigmaVerticalM: z.number().nullable(),
  fails: z.array(z.string()),
});
export type CoverageCell = z.infer<typeof coverageCellSchema>;

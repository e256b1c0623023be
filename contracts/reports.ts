/** The compliance report of one plan version: the client's spec, the results per line and overall, the DEM, sign-off. */
import { z } from 'zod';
import { asFlownDocSchema } from './as-flown';
import { reviewStateSchema } from './reviews';

const num = z.number();
const nullableNum = z.number().nullable();

/** Figures over a set of stations (one line, or all). Overlaps are fractions (0.75); null where no station had a value. */
const stationStatsSchema = z.object({
  stationCount: z.number().int(),
  /** Stations with a known ground height (the rest fell on nodata or outside the grid). */
  knownCount: z.number().int(),
  /** Share 0..1 of all stations whose GSD lies in the target band; unknown stations count as not meeting it. */
  shareMeetingGsd: nullableNum,
  gsdCm: z.object({ min: nullableNum, p5: nullableNum, median: nullableNum, max: nullableNum }),
  forwardOverlapMin: nullableNum,
  sideOverlapMin: nullableNum,
  aglMinM: nullableNum,
  aglMaxM: nullableNum,
});
export type StationStats = z.infer<typeof stationStatsSchema>;

/** One requirement of the spec against what the plan achieves. */
const specCheckSchema = z.object({
  key: z.enum(['gsd-band', 'forward-overlap', 'side-overlap', 'clearance', 'height-limit', 'cells', 'cells-gsd', 'cells-views', 'cells-sigma-vertical', 'cells-sigma-horizontal', 'cells-directions', 'cells-ground-unknown']),
  label: z.string(),
  required: z.string(),
  achieved: z.string(),
  pass: z.boolean(),
});
export type SpecCheck = z.infer<typeof specCheckSchema>;

const reportLineSchema = stationStatsSchema.extend({
  /** Position in the flying order, 1 first (as printed). */
  number: z.number().int(),
  lengthM: num,
  headingDeg: nullableNum,
  legCount: z.number().int(),
  warnings: z.array(z.string()),
  /** GSD along the line for the chart: distance from the line start and GSD (null where unknown). */
  gsdSeries: z.array(z.object({ distanceM: num, gsdCm: nullableNum })),
});
export type ReportLine = z.infer<typeof reportLineSchema>;

const reportCoverageSchema = z.object({
  state: z.enum(['ready', 'refused', 'none']),
  /** How views were counted (ready), or why there is no coverage. */
  note: z.string(),
  spec: z.string().nullable(),
  cellM: nullableNum,
  areaM2: nullableNum,
  items: z.array(z.object({ item: z.string(), title: z.string(), share: num, failingAreaM2: num })),
  shareAll: nullableNum,
  patchCount: z.number().int(),
  /** The largest patches short of the spec (at most 10). */
  patches: z.array(z.object({ message: z.string(), areaM2: num, lon: num, lat: num })),
});
export type ReportCoverage = z.infer<typeof reportCoverageSchema>;

/** The latest check of the photos as flown (when one was made): the spec as flown next to as planned. */
const reportAsFlownSchema = z.object({
  checkedAt: z.string(),
  checkedBy: z.string().nullable(),
  label: z.string(),
  photoCount: z.number().int(),
  /** Checks made of this version in all (the report shows the latest). */
  checkCount: z.number().int(),
  shareAllFlown: num,
  shareAllPlanned: num,
  items: z.array(z.object({ item: z.string(), title: z.string(), flown: num, planned: num })),
  matched: z.number().int(),
  missedTriggers: z.number().int(),
  missedRuns: z.array(z.string()),
  extraPhotos: z.number().int(),
  offTrack: z.array(z.string()),
  lostAreaM2: num,
  reflight: z.string(),
  heights: z.string(),
  /** The check's as-flown map (null for checks stored before it existed). */
  map: asFlownDocSchema.shape.map.unwrap().nullable(),
});
export type ReportAsFlown = z.infer<typeof reportAsFlownSchema>;

/** The version's confirmation as flown, after the flight (see contracts/flown-confirmation.ts). */
const reportFlownSchema = z.object({
  required: z.boolean(),
  confirmedBy: z.string().nullable(),
  confirmedAt: z.string().nullable(),
  statement: z.string(),
  reasons: z.array(z.object({ key: z.string(), label: z.string(), reason: z.string() })),
});
export type ReportFlown = z.infer<typeof reportFlownSchema>;

export const complianceReportSchema = z.object({
  version: z.object({
    id: z.string(),
    planId: z.string(),
    number: z.number().int(),
    reviewState: reviewStateSchema,
    analysedAt: z.string().nullable(),
    createdBy: z.string().nullable(),
  }),
  project: z.object({ name: z.string(), client: z.string() }),
  plan: z.object({ name: z.string() }),
  /** The client's spec as the plan states it. */
  spec: z.object({
    targetGsdCm: num,
    /** Fraction either side of the target (0.1 = ±10 %). */
    gsdTolerance: num,
    gsdBandCm: z.tuple([num, num]),
    forwardOverlap: num,
    sideOverlap: num,
    clearanceM: num,
    obstacleAllowanceM: num,
    maxAglM: num,
    altitudeMode: z.string(),
  }),
  overall: stationStatsSchema.extend({ lineCount: z.number().int(), photoCount: z.number().int(), flightTimeS: nullableNum }),
  checks: z.array(specCheckSchema),
  /** The spec checked in every ground cell (the coverage run), or why it was not. */
  coverage: reportCoverageSchema,
  /** The latest check of the photos as flown, or null before any. */
  asFlown: reportAsFlownSchema.nullable(),
  lines: z.array(reportLineSchema),
  dem: z.object({
    siteName: z.string(),
    fileName: z.string(),
    crs: z.object({ name: z.string(), epsg: z.number().int().nullable() }),
    resolution: z.tuple([num, num]),
    resolutionUnit: z.string(),
    verticalDatum: z.string(),
    surfaceKind: z.enum(['bare-earth', 'surface']),
    elevationRangeM: z.tuple([nullableNum, nullableNum]),
  }),
  /** Accuracy figures derived from GSD: advisory only, never a guarantee. */
  accuracy: z.object({
    label: z.literal('ADVISORY'),
    basisGsdCm: nullableNum,
    horizontalCm: z.tuple([num, num]).nullable(),
    verticalCm: z.tuple([num, num]).nullable(),
    ruleOfThumb: z.string(),
    source: z.literal('common practice'),
    deferral: z.string(),
  }),
  assumptions: z.array(z.string()),
  /** Plan-wide warnings of the analysis (flagged stations, distance from takeoff, batteries…). */
  warnings: z.array(z.string()),
  cautions: z.array(z.string()),
  signOff: z.object({
    state: reviewStateSchema,
    signedOffBy: z.string().nullable(),
    signedOffAt: z.string().nullable(),
    statement: z.string(),
    /** Requirements unmet at sign-off, each with the surveyor's reason (empty when all were met). */
    reasons: z.array(z.object({ key: z.string(), label: z.string(), required: z.string(), achieved: z.string(), reason: z.string() })),
  }),
  /** After the flight: the confirmation as flown (null in reports built before it existed). */
  flown: reportFlownSchema.nullable(),
  /** How the 5th percentile and median are computed. */
  percentileMethod: z.string(),
  generatedAt: z.string(),
});
export type ComplianceReport = z.infer<typeof complianceReportSchema>;

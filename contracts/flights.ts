/** The pilot's side: signed-off flights of a team and the leg sheet of one version (heights in metres, datum named). */
import { z } from 'zod';
import { reviewStateSchema } from './reviews';

const n = z.number();
const nn = z.number().nullable();
const lonLat = z.object({ lon: n, lat: n });
const along = lonLat.extend({ distanceM: n });

/** One signed-off version in the flights list. */
const flightSummarySchema = z.object({
  versionId: z.string(),
  planId: z.string(),
  number: z.number().int(),
  planName: z.string(),
  projectName: z.string(),
  client: z.string(),
  signedOffBy: z.string().nullable(),
  signedOffAt: z.string().nullable(),
  lineCount: z.number().int(),
  photoCount: z.number().int(),
  flightTimeS: nn,
});
export type FlightSummary = z.infer<typeof flightSummarySchema>;

export const flightListSchema = z.object({ flights: z.array(flightSummarySchema) });

/** One straight altitude leg of a line, in flying direction. */
const sheetLegSchema = z.object({
  number: z.number().int(),
  start: along,
  end: along,
  /** What the pilot sets: altitude above the takeoff point. */
  altitudeAboveTakeoffM: z.object({ start: n, end: n }),
  /** The same altitude above the grid's vertical datum (see `datum`). */
  altitudeAboveDatumM: z.object({ start: n, end: n }),
  aglM: z.object({ min: nn, max: nn }),
  gsdCm: z.object({ min: nn, max: nn }),
  headingDeg: nn,
  lengthM: n,
  timeS: n,
  /** Rise over run in per cent, climb positive. */
  gradientPct: n,
  kind: z.enum(['level', 'climb', 'descent']),
});
export type SheetLeg = z.infer<typeof sheetLegSchema>;

const sheetLineSchema = z.object({
  /** Flying order, 1 first. */
  number: z.number().int(),
  /** A line of the layout, or a spot photo the solver added (one photo straight above short ground; sheets kept before: a line). */
  kind: z.enum(['line', 'spot']).default('line'),
  /** Which set of lines in a plan of two sets across each other (lattice, slant): 1 or 2; absent: one set. */
  set: z.number().int().optional(),
  headingDeg: nn,
  lengthM: n,
  timeS: n,
  photoCount: z.number().int(),
  /** Camera tilt on its mount towards the nose, degrees from straight down; absent: straight down. */
  cameraTiltDeg: n.optional(),
  start: lonLat,
  end: lonLat,
  legs: z.array(sheetLegSchema),
  warnings: z.array(z.string()),
});
export type SheetLine = z.infer<typeof sheetLineSchema>;

/** Lines grouped into battery packs in flying order; each pack starts and ends at the takeoff point. */
const batteryPlanSchema = z.object({
  enduranceMin: n,
  reserve: n,
  usablePerBatteryS: n,
  count: z.number().int(),
  packs: z.array(
    z.object({
      number: z.number().int(),
      lines: z.array(z.number().int()),
      flightTimeS: n,
      /** True when one line alone needs more than a battery's usable time. */
      overBudget: z.boolean(),
      /**
       * The altitude above takeoff the pack flies home at from its last line (that line's end, or higher where the
       * ground on the straight way home needs it to keep the clearance), and how much it climbs over the end first.
       */
      homeAboveTakeoffM: n.optional(),
      homeClimbM: n.optional(),
    }),
  ),
  notes: z.array(z.string()),
});
export type BatteryPlan = z.infer<typeof batteryPlanSchema>;

const checklistItemSchema = z.object({ id: z.string(), kind: z.enum(['caution', 'check']), text: z.string() });
export type ChecklistItem = z.infer<typeof checklistItemSchema>;

export const legSheetSchema = z.object({
  version: z.object({
    id: z.string(),
    planId: z.string(),
    number: z.number().int(),
    planName: z.string(),
    projectName: z.string(),
    client: z.string(),
    reviewState: reviewStateSchema,
    signedOff: z.boolean(),
    signedOffBy: z.string().nullable(),
    signedOffAt: z.string().nullable(),
  }),
  /** Display units the project asks for; every figure here is metric. */
  units: z.enum(['metric', 'imperial']),
  datum: z.object({
    /** Vertical datum of the elevation grid and of every "above datum" altitude. */
    name: z.string(),
    takeoff: lonLat,
    /** Ground height of the takeoff point above that datum, from the grid. */
    takeoffGroundM: nn,
  }),
  speedMps: n,
  altitudeMode: z.string(),
  lines: z.array(sheetLineSchema),
  batteries: batteryPlanSchema,
  checklist: z.array(checklistItemSchema),
  cautions: z.array(z.string()),
  /** Plan-wide warnings of the analysis beyond the cautions. */
  warnings: z.array(z.string()),
  generatedAt: z.string(),
});
export type LegSheet = z.infer<typeof legSheetSchema>;

/** The as-flown document (`terrain as-flown`, and what an import of photos reports): matching, as-flown and planned compliance, the planned-vs-flown difference and the re-flight. */
import { z } from 'zod';
import { coverageFailureSchema } from './coverage';
import { photoLogSchema } from './photo-log';

const lonLat = z.object({ lon: z.number(), lat: z.number() });
const nullableM = z.number().nullable();

/** How one line was flown: photos against stations, drift across the line, altitude error against its legs. */
const lineFlownSchema = z.object({
  line: z.number().int().min(1), stations: z.number().int(), photos: z.number().int(), missed: z.number().int(),
  crossTrackMeanM: nullableM, crossTrackMaxAbsM: nullableM, crossTrackRmsM: nullableM,
  altitudeErrorMeanM: nullableM, altitudeErrorMaxAbsM: nullableM, offTrack: z.boolean(), outOfOrder: z.number().int(),
});

const photoMatchSchema = z.object({
  limits: z.object({ gateM: z.number(), lineReachM: z.number(), offTrackM: z.number(), focalToleranceMm: z.number() }),
  matched: z.number().int(),
  missed: z.array(z.object({ line: z.number().int(), station: z.number().int(), lon: z.number(), lat: z.number(), distanceM: z.number() })),
  extra: z.array(z.object({ photo: z.number().int(), file: z.string(), reason: z.enum(['off-lines', 'no-station-near']), nearestLine: z.number().int().nullable(), crossTrackM: nullableM })),
  lines: z.array(lineFlownSchema),
  camera: z.object({
    plannedFocalLengthMm: z.number(), focalLengthsMm: z.array(z.number()), models: z.array(z.string()),
    focalMismatch: z.array(z.object({ photo: z.number().int(), file: z.string(), focalLengthMm: z.number() })), messages: z.array(z.string()),
  }),
  photos: z.array(z.object({
    photo: z.number().int(), file: z.string(), line: z.number().int(), station: z.number().int(),
    alongErrorM: z.number(), crossTrackM: z.number(), altitudeErrorM: z.number(),
  })),
});

const complianceSchema = z.object({
  cellsInArea: z.number().int(), areaM2: z.number(), shareAll: z.number().min(0).max(1),
  items: z.array(z.object({ item: coverageFailureSchema, asks: z.string(), share: z.number().min(0).max(1), failingAreaM2: z.number() })),
});

export const asFlownDocSchema = z.object({
  /** `datum` names the heights' vertical datum on its own (checks stored before it was added lack it). */
  heights: z.object({ datum: z.string().optional(), reference: z.string(), conversions: z.string() }),
  photos: z.object({ count: z.number().int(), attitudeAssumed: z.array(z.string()), attitudeNote: z.string().nullable(), leftOutFarAway: z.array(z.string()) }),
  matching: photoMatchSchema,
  spec: z.object({
    maxGsdCm: z.number(), minViews: z.number().int(), maxSigmaVerticalM: z.number().nullable(), maxSigmaHorizontalM: z.number().nullable(), basis: z.string(),
    maxDirectionGapDeg: z.number().nullable().default(null), obliqueDeg: z.number().default(30),
  }),
  raster: z.object({ width: z.number().int(), height: z.number().int(), cellM: z.number(), cellAreaM2: z.number(), crs: z.object({ epsg: z.number().int().nullable(), name: z.string() }) }),
  planned: complianceSchema,
  flown: complianceSchema,
  patchCount: z.number().int(),
  patches: z.array(z.object({ reason: coverageFailureSchema, message: z.string(), cells: z.number().int(), areaM2: z.number(), centroid: lonLat, worst: z.number().nullable() })),
  difference: z.object({
    lostCells: z.number().int(), lostAreaM2: z.number(), gainedCells: z.number().int(), gainedAreaM2: z.number(), failingAsPlannedCells: z.number().int(), note: z.string(),
    patches: z.array(z.object({ cells: z.number().int(), areaM2: z.number(), centroid: lonLat })),
  }),
  reflight: z.object({
    covers: z.string(), targetCells: z.number().int(), coveredCells: z.number().int(), shareAllAfter: z.number().min(0).max(1),
    lineCount: z.number().int(), photoCount: z.number().int(), lineLengthM: z.number(), flightTimeS: z.number(),
    extraLinesEachSide: z.array(z.number().int()), smallPatchCells: z.number().int(), smallPatches: z.string(),
    areas: z.array(z.object({ patches: z.number().int(), cells: z.number().int(), areaM2: z.number(), alongM: z.number(), acrossM: z.number(), polygon: z.object({ type: z.literal('Polygon'), coordinates: z.array(z.array(z.array(z.number()))) }) })),
    missions: z.array(z.record(z.string(), z.unknown())),
    /** Stretches of the signed-off lines through the re-flight areas (checks stored before they existed lack them). */
    stretches: z.object({
      note: z.string(),
      /** Lost cells worth re-flying, and how many meet the whole spec with the stretches' photos added to those taken. */
      targetCells: z.number().int(), coveredCells: z.number().int(), neededStations: z.number().int(),
      lengthM: z.number(), timeS: z.number(), photos: z.number().int(),
      items: z.array(z.object({
        line: z.number().int(), fromM: z.number(), toM: z.number(), lengthM: z.number(), headingDeg: z.number(),
        start: lonLat, end: lonLat, firstPhoto: z.number().int(), lastPhoto: z.number().int(), photos: z.number().int(), timeS: z.number(),
        legs: z.array(z.object({ fromM: z.number(), toM: z.number(), altitudeStartAboveTakeoffM: z.number(), altitudeEndAboveTakeoffM: z.number(), altitudeStartM: z.number(), altitudeEndM: z.number() })),
      })),
    }).optional(),
    lines: z.array(z.array(z.object({
      start: lonLat, end: lonLat, lengthM: z.number(), headingDeg: z.number(), photos: z.number().int(),
      legs: z.array(z.object({ startDistanceM: z.number(), endDistanceM: z.number(), altitudeStartAboveTakeoffM: z.number(), altitudeEndAboveTakeoffM: z.number(), altitudeStartM: z.number(), altitudeEndM: z.number() })),
    }))),
  }).nullable(),
  /** The as-flown map (checks stored before it existed lack it): one PNG, north up, with its legend in words. */
  map: z.object({
    widthPx: z.number().int(), heightPx: z.number().int(), pxPerCell: z.number().int(), cellM: z.number(), note: z.string(),
    legend: z.array(z.object({ colour: z.string(), name: z.string(), words: z.string() })), pngBase64: z.string(),
  }).optional(),
  timingMs: z.object({ plan: z.number(), asFlown: z.number(), reflight: z.number() }),
  cautions: z.array(z.string()),
});
export type AsFlownDoc = z.infer<typeof asFlownDocSchema>;

/** Where a check's photo log came from: the photos' EXIF/XMP read on the device, or a CSV photo log. */
const asFlownSources = ['photos', 'csv'] as const;

/** POST …/flights/:versionId/as-flown-checks: only the photos' metadata travels, never the photos. */
export const newAsFlownCheckSchema = z.object({
  source: z.enum(asFlownSources, { error: 'source must be "photos" or "csv".' }),
  label: z.string().trim().min(1, { error: 'label must say where the photos came from (a file or folder name).' }).max(200, { error: 'label must be at most 200 characters.' }),
  photos: photoLogSchema,
});
export type NewAsFlownCheck = z.infer<typeof newAsFlownCheckSchema>;

/** A check in lists: who ran it, when, on how many photos, and its headline figures. */
const asFlownCheckSummarySchema = z.object({
  id: z.uuid(),
  versionId: z.uuid(),
  source: z.enum(asFlownSources),
  label: z.string(),
  photoCount: z.number().int(),
  createdAt: z.string(),
  createdBy: z.object({ id: z.string(), name: z.string() }).nullable(),
  /** Share of the area meeting the whole spec as flown, and as planned on the same cells. */
  shareAllFlown: z.number().min(0).max(1),
  shareAllPlanned: z.number().min(0).max(1),
  missedTriggers: z.number().int(),
  lostAreaM2: z.number(),
});
export type AsFlownCheckSummary = z.infer<typeof asFlownCheckSummarySchema>;

export const asFlownCheckSchema = asFlownCheckSummarySchema.extend({ document: asFlownDocSchema });
export type AsFlownCheck = z.infer<typeof asFlownCheckSchema>;

export const asFlownCheckListSchema = z.object({ checks: z.array(asFlownCheckSummarySchema) });

/**
 * Live coverage of a signed-off version while it is flown: the photos the link has recorded so far (flight_trigger
 * rows) analysed as flown against the plan (terrain/as-flown.ts), pushed to the leg sheet as server-sent events.
 */
import { z } from 'zod';

const n = z.number();
const lonLat = z.object({ lon: n, lat: n });

/** A patch of ground cells the aircraft has passed that fall short of the spec, to re-fly before landing. */
const livePatchSchema = z.object({ cells: z.number().int(), areaM2: n, centroid: lonLat });

export const liveCoverageSchema = z.object({
  versionId: z.string(),
  /** `empty`: no photo recorded yet; `ready`: the analysis below; `refused`: the engine could not analyse (reason). */
  state: z.enum(['empty', 'ready', 'refused']),
  reason: z.string().nullable(),
  photoCount: z.number().int(),
  matched: z.number().int(),
  extra: z.number().int(),
  /** Planned stations up to the aircraft's progress that no photo was taken at. */
  missedSoFar: z.number().int(),
  /** The furthest planned station a photo was matched to (1-based line and station), or null. */
  progress: z.object({ line: z.number().int(), station: z.number().int() }).nullable(),
  raster: z.object({ width: z.number().int(), height: z.number().int(), cellM: n }).nullable(),
  spec: z.object({ maxGsdCm: n, minViews: z.number().int() }).nullable(),
  /** Share of the whole area meeting each spec item from the photos so far (it grows as the aircraft flies). */
  flown: z.object({ shareAll: n, items: z.array(z.object({ item: z.string(), asks: z.string(), share: n })) }).nullable(),
  /**
   * Ground the aircraft has passed: the cells the planned stations up to its progress would make meet the spec.
   * `short` are those the photos so far leave short (largest patches first, at most 50).
   */
  passed: z
    .object({ cells: z.number().int(), areaM2: n, shortCells: z.number().int(), shortAreaM2: n, patches: z.array(livePatchSchema) })
    .nullable(),
  /**
   * Map images of the raster (one pixel per cell, PNG as base64) and where they lie: `geotransform` (GDAL order) in
   * the grid's CRS, like the version's coverage raster. `views` colours the views so far (viridis, `viewsMax` at the
   * light end); `short` is white where passed ground falls short.
   */
  map: z
    .object({ geotransform: z.array(n).length(6), width: z.number().int(), height: z.number().int(), viewsPngBase64: z.string(), viewsMax: n, shortPngBase64: z.string() })
    .nullable(),
  /** How the photos' heights were read, named. */
  heights: z.string(),
  cautions: z.array(z.string()),
  computedAt: z.string(),
});
export type LiveCoverage = z.infer<typeof liveCoverageSchema>;

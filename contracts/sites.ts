/** Shapes of sites: an uploaded elevation grid (GeoTIFF DEM) of a project, its metadata and hillshade preview. */
import { z } from 'zod';
import { userText } from './text';
import type { GridMetadata } from '../terrain/metadata';
import { apiErrorSchema } from './errors';

export const surfaceKinds = ['bare-earth', 'surface'] as const;
/** What the heights describe, as the planner states it: bare ground, or the tops of trees and buildings. */
export const surfaceKindSchema = z.enum(surfaceKinds, { error: 'surfaceKind must be "bare-earth" or "surface".' });
export type SurfaceKind = z.infer<typeof surfaceKindSchema>;

/**
 * The text fields of the multipart upload (the file itself goes in the part named `file`).
 * `verticalDatum` may be left out when the GeoTIFF declares one (its GeoKeys); otherwise the planner must state it.
 */
export const siteUploadFieldsSchema = z.object({
  name: userText().trim().min(1, 'Give the site a name.').max(120, 'Keep the site name under 120 characters.').optional(),
  surfaceKind: surfaceKindSchema,
  verticalDatum: userText().trim().min(1, 'State the vertical datum of the heights (for example "EGM96").').max(80, 'Keep the datum under 80 characters.').optional(),
});

/** Name of the multipart part that carries the DEM. */
export const siteFileField = 'file';

export const siteUpdateSchema = z
  .object({
    name: userText().trim().min(1, 'Give the site a name.').max(120, 'Keep the site name under 120 characters.').optional(),
    surfaceKind: surfaceKindSchema.optional(),
    verticalDatum: userText().trim().min(1, 'State the vertical datum of the heights.').max(80, 'Keep the datum under 80 characters.').optional(),
  })
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'Send at least one field to change.' });
export type SiteUpdate = z.infer<typeof siteUpdateSchema>;

const bbox = z.tuple([z.number(), z.number(), z.number(), z.number()]);
const lengthUnit = z.enum(['metre', 'foot', 'us-survey-foot', 'degree']);

/** The terrain engine's GridMetadata (terrain/metadata.ts). */
const gridMetadataSchema = z.object({
  width: z.number().int(),
  height: z.number().int(),
  crs: z.object({ epsg: z.number().int().nullable(), proj4: z.string(), name: z.string() }),
  resolution: z.tuple([z.number(), z.number()]),
  bounds: bbox,
  boundsWgs84: bbox,
  elevation: z.object({ min: z.number().nullable(), max: z.number().nullable(), mean: z.number().nullable() }),
  nodataShare: z.number().min(0).max(1),
  verticalUnit: lengthUnit,
});
// compile-time check that the schema and the engine's type agree both ways
const _metadataMatches: [GridMetadata, z.infer<typeof gridMetadataSchema>] = [{} as z.infer<typeof gridMetadataSchema>, {} as GridMetadata];
void _metadataMatches;

/** What the file itself says about its encoding and datum (from the GeoTIFF header). */
const demFileInfoSchema = z.object({
  compression: z.string(),
  sampleType: z.string(),
  tiled: z.boolean(),
  nodata: z.number().nullable(),
  /** Vertical datum declared by the file's GeoKeys, when it has one. */
  declaredVerticalDatum: z.object({ epsg: z.number().int().nullable(), name: z.string() }).nullable(),
});
export type DemFileInfo = z.infer<typeof demFileInfoSchema>;

/** Where the hillshade image lies: its size, WGS 84 bounds and grid-CRS geotransform of its pixels (GDAL order). */
const hillshadeInfoSchema = z.object({
  width: z.number().int(),
  height: z.number().int(),
  boundsWgs84: bbox,
  transform: z.tuple([z.number(), z.number(), z.number(), z.number(), z.number(), z.number()]),
});
export type HillshadeInfo = z.infer<typeof hillshadeInfoSchema>;

export const siteSchema = z.object({
  id: z.string().uuid(),
  teamId: z.string(),
  projectId: z.string().uuid(),
  name: z.string(),
  fileName: z.string(),
  sizeBytes: z.number().int(),
  /** Lower-case hex SHA-256 of the uploaded file. */
  sha256: z.string().regex(/^[0-9a-f]{64}$/),
  surfaceKind: surfaceKindSchema,
  verticalDatum: z.string(),
  metadata: gridMetadataSchema,
  file: demFileInfoSchema,
  hillshade: hillshadeInfoSchema,
  /** API path of the hillshade PNG. */
  hillshadeUrl: z.string(),
  /** Plans that use this site (a site in use cannot be deleted). */
  planCount: z.number().int(),
  createdAt: z.string(),
});
export type Site = z.infer<typeof siteSchema>;

/**
 * A stored site whose record no longer reads as a site (for example metadata written before a check existed):
 * listed apart so the list still answers and the site can be deleted.
 */
const unreadableSiteSchema = z.object({
  id: z.string().uuid(),
  name: z.string(),
  fileName: z.string(),
  createdAt: z.string(),
  problem: z.string(),
});
export type UnreadableSite = z.infer<typeof unreadableSiteSchema>;

export const siteListSchema = z.object({ sites: z.array(siteSchema), unreadable: z.array(unreadableSiteSchema).default([]) });

/** 409 body when the same file (same SHA-256) is already a site of the project. */
export const duplicateSiteErrorSchema = apiErrorSchema.extend({
  error: apiErrorSchema.shape.error.extend({ code: z.literal('duplicate_site'), existingSiteId: z.string().uuid() }),
});
export type DuplicateSiteError = z.infer<typeof duplicateSiteErrorSchema>;

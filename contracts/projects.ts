/** Shapes of projects: one job for one client, with its display units. */
import { z } from 'zod';
import { userText } from './text';

const unitSystems = ['metric', 'imperial'] as const;
/** Display units: metric, or imperial (feet for heights, and speeds in feet per second or knots on screen). */
export const unitSystemSchema = z.enum(unitSystems);
export type UnitSystem = z.infer<typeof unitSystemSchema>;

const name = userText().trim().min(2, 'A project name needs at least 2 characters.').max(120, 'Keep the project name under 120 characters.');
const client = userText().trim().max(120, 'Keep the client name under 120 characters.');
const notes = userText().max(4000, 'Keep the notes under 4000 characters.');

export const createProjectSchema = z.object({
  name,
  client: client.default(''),
  notes: notes.default(''),
  units: unitSystemSchema.default('metric'),
});
export type CreateProject = z.input<typeof createProjectSchema>;

/** A partial edit; `archived` archives (true) or restores (false) the project. */
export const updateProjectSchema = z
  .object({
    name: name.optional(),
    client: client.optional(),
    notes: notes.optional(),
    units: unitSystemSchema.optional(),
    archived: z.boolean().optional(),
  })
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'Send at least one field to change.' });
export type UpdateProject = z.infer<typeof updateProjectSchema>;

const projectSortKeys = ['name', 'updated', 'created'] as const;

/** Query string of the project list: search text, sort key and order, archived filter. */
export const projectListQuerySchema = z.object({
  q: userText().trim().max(120).optional(),
  sort: z.enum(projectSortKeys).default('updated'),
  order: z.enum(['asc', 'desc']).optional(),
  /** 'active' (default) hides archived projects, 'archived' shows only them, 'all' both. */
  archived: z.enum(['active', 'archived', 'all']).default('active'),
});
export type ProjectListQuery = z.input<typeof projectListQuerySchema>;

export const projectSchema = z.object({
  id: z.string().uuid(),
  teamId: z.string(),
  name: z.string(),
  client: z.string(),
  notes: z.string(),
  units: unitSystemSchema,
  archivedAt: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  /** Counts for the list screen. */
  siteCount: z.number().int(),
  planCount: z.number().int(),
});
export type Project = z.infer<typeof projectSchema>;

export const projectListSchema = z.object({ projects: z.array(projectSchema) });

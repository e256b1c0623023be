/** Sites: the elevation grids uploaded to a project, with what the terrain engine read from them. */
import { bigint, index, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { organization, user } from './auth';
import { project } from './projects';

/** An uploaded elevation grid of a project, with what the terrain engine read from it. */
export const site = pgTable(
  'site',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    teamId: text('team_id')
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    projectId: uuid('project_id')
      .notNull()
      .references(() => project.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    fileName: text('file_name').notNull(),
    storageKey: text('storage_key').notNull(),
    sizeBytes: bigint('size_bytes', { mode: 'number' }).notNull(),
    sha256: text('sha256').notNull(),
    /** 'bare-earth' or 'surface', as the planner states it. */
    surfaceKind: text('surface_kind').notNull(),
    /** Vertical datum of the heights, as stated (e.g. 'EGM96', 'WGS 84 ellipsoid', a national datum). */
    verticalDatum: text('vertical_datum').notNull(),
    /** GridMetadata from the terrain engine. */
    metadata: jsonb('metadata').notNull(),
    hillshadeKey: text('hillshade_key').notNull(),
    /** Image size and georeference of the hillshade preview. */
    hillshade: jsonb('hillshade').notNull(),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('site_project_idx').on(t.projectId), uniqueIndex('site_project_sha_uq').on(t.projectId, t.sha256)],
);

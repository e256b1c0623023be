/** Projects, sites (elevation uploads), plans, immutable plan versions and their audit trail. */
import { sql } from 'drizzle-orm';
import { bigint, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { organization, user } from './auth';

/** One job for one client. */
export const project = pgTable(
  'project',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    teamId: text('team_id')
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    client: text('client').notNull().default(''),
    notes: text('notes').notNull().default(''),
    /** 'metric' or 'imperial' (feet for heights and speeds). */
    units: text('units').notNull().default('metric'),
    archivedAt: timestamp('archived_at', { withTimezone: true }),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('project_team_idx').on(t.teamId)],
);

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

/** What to fly over a site; its editable input. Runs snapshot it into plan versions. */
export const plan = pgTable(
  'plan',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    teamId: text('team_id')
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    projectId: uuid('project_id')
      .notNull()
      .references(() => project.id, { onDelete: 'cascade' }),
    siteId: uuid('site_id')
      .notNull()
      .references(() => site.id, { onDelete: 'restrict' }),
    name: text('name').notNull(),
    /** The mission input (contracts/mission.ts) as last saved. */
    input: jsonb('input').notNull(),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('plan_project_idx').on(t.projectId)],
);

/**
 * An immutable snapshot of a plan and its analysis. `reviewState`: draft -> in_review -> signed_off | returned.
 * `analysisState`: queued -> running -> done | failed.
 */
export const planVersion = pgTable(
  'plan_version',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    teamId: text('team_id')
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    planId: uuid('plan_id')
      .notNull()
      .references(() => plan.id, { onDelete: 'cascade' }),
    number: integer('number').notNull(),
    siteId: uuid('site_id')
      .notNull()
      .references(() => site.id, { onDelete: 'restrict' }),
    input: jsonb('input').notNull(),
    reviewState: text('review_state').notNull().default('draft'),
    analysisState: text('analysis_state').notNull().default('queued'),
    analysisError: text('analysis_error'),
    /** Progress of a running analysis in percent. */
    analysisProgress: integer('analysis_progress_pct').notNull().default(0),
    /**
     * Last sign of life of the attempt running this analysis (written every ANALYSIS_HEARTBEAT_SECONDS while it runs);
     * a running version whose heartbeat is older than ANALYSIS_STALE_SECONDS lost its worker and is handed back for retry.
     */
    analysisHeartbeatAt: timestamp('analysis_heartbeat_at', { withTimezone: true }),
    result: jsonb('result'),
    /** The coverage run of the analysis (contracts/coverage.ts storedCoverageSchema); its raster and images are stored files. */
    coverage: jsonb('coverage'),
    analysedAt: timestamp('analysed_at', { withTimezone: true }),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    signedOffBy: text('signed_off_by').references(() => user.id, { onDelete: 'set null' }),
    signedOffAt: timestamp('signed_off_at', { withTimezone: true }),
    /** Why the surveyor signed off although requirements were unmet: one reason per unmet requirement (check key). */
    signOffReasons: jsonb('sign_off_reasons').$type<{ key: string; reason: string }[]>(),
  },
  (t) => [uniqueIndex('plan_version_number_uq').on(t.planId, t.number), index('plan_version_team_idx').on(t.teamId, t.reviewState)],
);

/** Every change of a version's state: who, what, when, which version. Append-only. */
export const auditEvent = pgTable(
  'audit_event',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    teamId: text('team_id')
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    planId: uuid('plan_id').references(() => plan.id, { onDelete: 'cascade' }),
    planVersionId: uuid('plan_version_id').references(() => planVersion.id, { onDelete: 'cascade' }),
    actorId: text('actor_id').references(() => user.id, { onDelete: 'set null' }),
    /** e.g. 'version.created', 'review.submitted', 'review.signed_off', 'review.returned', 'analysis.done'. */
    action: text('action').notNull(),
    fromState: text('from_state'),
    toState: text('to_state'),
    comment: text('comment'),
    createdAt: timestamp('created_at', { withTimezone: true })
      .notNull()
      .default(sql`now()`),
  },
  (t) => [index('audit_plan_idx').on(t.planId, t.createdAt)],
);

/** Mail the development fake SMTP server received (read on the owner's outbox screen). */
export const devMail = pgTable(
  'dev_mail',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    /** The team the message was sent for (from the X-Loftline-Team header), so an owner reads only their team's mail. */
    teamId: text('team_id').references(() => organization.id, { onDelete: 'cascade' }),
    toAddresses: text('to_addresses').notNull(),
    fromAddress: text('from_address').notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull().default(''),
    /** [{ filename, contentType, size, sha256 }] */
    attachments: jsonb('attachments').notNull().default(sql`'[]'::jsonb`),
    receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('dev_mail_team_idx').on(t.teamId, t.receivedAt)],
);

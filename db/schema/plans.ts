/** Plans and their immutable versions (the analysis result and the review state of each run). */
import { index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { organization, user } from './auth';
import { project } from './projects';
import { site } from './sites';

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

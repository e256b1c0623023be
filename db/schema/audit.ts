/** The audit trail: every change of a version's state, append-only. */
import { sql } from 'drizzle-orm';
import { index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { organization, user } from './auth';
import { plan, planVersion } from './plans';

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

/** Projects: one job for one client. */
import { index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
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

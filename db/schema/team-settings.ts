/** Team-wide rules an owner sets (one row per team; a team without a row has every rule off). */
import { boolean, pgTable, text, timestamp } from 'drizzle-orm/pg-core';
import { organization, user } from './auth';

export const teamSetting = pgTable('team_setting', {
  teamId: text('team_id')
    .primaryKey()
    .references(() => organization.id, { onDelete: 'cascade' }),
  /** A signed-off version's work is done only once a surveyor confirms it as flown, against a check of its photos. */
  requireFlownConfirmation: boolean('require_flown_confirmation').notNull().default(false),
  updatedBy: text('updated_by').references(() => user.id, { onDelete: 'set null' }),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** Mail the development fake SMTP server received. */
import { sql } from 'drizzle-orm';
import { index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { organization } from './auth';

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

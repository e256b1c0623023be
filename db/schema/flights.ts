/** What the aircraft reported while flying a signed-off version: one row per photo (MAVLink CAMERA_FEEDBACK). */
import { doublePrecision, index, integer, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { organization, user } from './auth';
import { planVersion } from './projects';

/** A photo as flown: where and how the aircraft was when the camera fired, as the link forwarded it. */
export const flightTrigger = pgTable(
  'flight_trigger',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    teamId: text('team_id')
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    planVersionId: uuid('plan_version_id')
      .notNull()
      .references(() => planVersion.id, { onDelete: 'cascade' }),
    /** One run of the link (a flight); the same photo sent twice within it is stored once. */
    sortie: uuid('sortie').notNull(),
    /** CAMERA_FEEDBACK img_idx. */
    imageIndex: integer('image_index').notNull(),
    lat: doublePrecision('lat').notNull(),
    lon: doublePrecision('lon').notNull(),
    /** Above the home (takeoff) point, metres. */
    altitudeAboveTakeoffM: doublePrecision('altitude_above_takeoff_m').notNull(),
    /** Above mean sea level as the autopilot reports it, metres. */
    altitudeMslM: doublePrecision('altitude_msl_m').notNull(),
    rollDeg: doublePrecision('roll_deg').notNull(),
    pitchDeg: doublePrecision('pitch_deg').notNull(),
    yawDeg: doublePrecision('yaw_deg').notNull(),
    capturedAt: timestamp('captured_at', { withTimezone: true }).notNull(),
    recordedBy: text('recorded_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('flight_trigger_photo_uq').on(t.planVersionId, t.sortie, t.imageIndex), index('flight_trigger_team_idx').on(t.teamId, t.planVersionId)],
);

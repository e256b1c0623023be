/** What was flown on a version: the photos the aircraft reported (MAVLink CAMERA_FEEDBACK) and as-flown checks of photo logs. */
import { doublePrecision, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { organization, user } from './auth';
import { planVersion } from './plans';

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

/**
 * An as-flown check: a photo log (read from the photos on the device, or a CSV log) checked against the version's
 * plan. The document holds the matching, the coverage as flown next to the plan's and the re-flight; the photos'
 * metadata is kept so the check can be explained (or run again) later. Never changed once written.
 */
export const asFlownCheck = pgTable(
  'as_flown_check',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    teamId: text('team_id')
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    planVersionId: uuid('plan_version_id')
      .notNull()
      .references(() => planVersion.id, { onDelete: 'cascade' }),
    /** `photos` (EXIF/XMP read on the device) or `csv` (a photo log file). */
    source: text('source').notNull(),
    /** The CSV's file name, or a description of the photos picked ("894 photos from DCIM/100"). */
    label: text('label').notNull(),
    photoCount: integer('photo_count').notNull(),
    photos: jsonb('photos').notNull(),
    document: jsonb('document').notNull(),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('as_flown_check_version_idx').on(t.teamId, t.planVersionId, t.createdAt)],
);

/**
 * After the flight: a surveyor's confirmation of a signed-off version as flown, against one check of its photos,
 * with a reason for each spec item the flight lost. One per version (the key); kept beside the version, whose own
 * row stays locked once signed off.
 */
export const flownConfirmation = pgTable('flown_confirmation', {
  planVersionId: uuid('plan_version_id')
    .primaryKey()
    .references(() => planVersion.id, { onDelete: 'cascade' }),
  teamId: text('team_id')
    .notNull()
    .references(() => organization.id, { onDelete: 'cascade' }),
  checkId: uuid('check_id')
    .notNull()
    .references(() => asFlownCheck.id, { onDelete: 'cascade' }),
  confirmedBy: text('confirmed_by').references(() => user.id, { onDelete: 'set null' }),
  confirmedAt: timestamp('confirmed_at', { withTimezone: true }).notNull().defaultNow(),
  /** One reason per spec item the check shows lost against the plan. */
  reasons: jsonb('reasons').$type<{ key: string; reason: string }[]>(),
});

/**
 * After the flight: a surveyor confirms a signed-off version as flown, against the latest check of its photos,
 * with a reason for each spec item the flight lost against the plan. A team rule (owner's setting) makes this
 * confirmation the step that completes a version's review.
 */
import { z } from 'zod';
import { signOffReasonSchema } from './reviews';
import { userText } from './text';

const person = z.object({ id: z.string(), name: z.string() });

/** GET/PATCH /teams/:teamId/settings. */
export const teamSettingsSchema = z.object({
  /** A signed-off version's review is complete only once a surveyor confirms it as flown against a check of its photos. */
  requireFlownConfirmation: z.boolean(),
  updatedBy: person.nullable(),
  updatedAt: z.string().nullable(),
});
export type TeamSettings = z.infer<typeof teamSettingsSchema>;

export const updateTeamSettingsSchema = z.object({
  requireFlownConfirmation: z.boolean({ error: 'requireFlownConfirmation must be true or false.' }),
});

/** An item of the spec the flight lost against the plan: its share of the area as planned and as flown. */
const flownShortfallSchema = z.object({ key: z.string(), label: z.string(), planned: z.number(), flown: z.number() });
export type FlownShortfall = z.infer<typeof flownShortfallSchema>;

/** The as-flown confirmation of a version, as its review status reports it. */
export const flownConfirmationSchema = z.object({
  /** Whether the team requires it before the version's review is complete. */
  required: z.boolean(),
  confirmedBy: person.nullable(),
  confirmedAt: z.string().nullable(),
  /** The check it was confirmed against (or, before confirmation, the latest check it would be). */
  check: z.object({ id: z.string(), label: z.string(), photoCount: z.number().int(), checkedAt: z.string(), shareAllFlown: z.number(), shareAllPlanned: z.number() }).nullable(),
  /** Items the check shows lost against the plan: each needs a reason to confirm. */
  shortfalls: z.array(flownShortfallSchema),
  reasons: z.array(signOffReasonSchema.extend({ label: z.string() })),
  /** Whether the caller may confirm now, and if not, why (null when they may). */
  mayConfirm: z.boolean(),
  blockedBecause: z.string().nullable(),
});
export type FlownConfirmation = z.infer<typeof flownConfirmationSchema>;

/** POST …/versions/:versionId/confirm-flown. */
export const confirmFlownSchema = z.object({
  comment: userText().trim().max(4000, 'Keep the note under 4000 characters.').optional(),
  reasons: z.array(signOffReasonSchema).max(20).optional(),
});

/** Review states of a plan version, the transitions between them, and the audit trail: one table for server and client. */
import { z } from 'zod';
import { userText } from './text';
import { can, type Permission, type Role } from './roles';

export const reviewStates = ['draft', 'in_review', 'signed_off', 'returned'] as const;
export const reviewStateSchema = z.enum(reviewStates);
export type ReviewState = z.infer<typeof reviewStateSchema>;

/** Display names of the states, our own wording. */
export const reviewStateLabels: Record<ReviewState, string> = {
  draft: 'Draft',
  in_review: 'In review',
  signed_off: 'Signed off',
  returned: 'Returned',
};

export const reviewActions = ['submit', 'sign-off', 'return'] as const;
const reviewActionSchema = z.enum(reviewActions);
export type ReviewAction = z.infer<typeof reviewActionSchema>;

/** Each action: the states it may start from, the state it leads to, the permission it needs, its audit name. */
export const reviewTransitions = {
  submit: { from: ['draft', 'returned'], to: 'in_review', permission: 'plan:submit', audit: 'review.submitted', label: 'Send for review' },
  'sign-off': { from: ['in_review'], to: 'signed_off', permission: 'plan:review', audit: 'review.signed_off', label: 'Sign off' },
  return: { from: ['in_review'], to: 'returned', permission: 'plan:review', audit: 'review.returned', label: 'Return with comments' },
} as const satisfies Record<
  ReviewAction,
  { from: readonly ReviewState[]; to: ReviewState; permission: Permission; audit: string; label: string }
>;

/** Whether `action` may start from `state` (ignoring who asks). */
export function transitionAllowed(action: ReviewAction, state: ReviewState): boolean {
  return (reviewTransitions[action].from as readonly ReviewState[]).includes(state);
}

/** The actions possible from `state`, optionally only those `role` holds the permission for. */
export function actionsFrom(state: ReviewState, role?: Role): ReviewAction[] {
  return reviewActions.filter((a) => transitionAllowed(a, state) && (role === undefined || can(role, reviewTransitions[a].permission)));
}

/** A signed-off version is locked: no action starts from it, and nothing may change it. */
export function isLocked(state: ReviewState): boolean {
  return state === 'signed_off';
}

/** Body of POST .../submit and .../sign-off: an optional note kept in the audit trail. */
export const reviewNoteSchema = z.object({
  comment: userText().trim().max(4000, 'Keep the note under 4000 characters.').optional(),
});

/** One unmet requirement of the client's spec, as the compliance report words it (key as in the report's checks). */
const unmetRequirementSchema = z.object({ key: z.string(), label: z.string(), required: z.string(), achieved: z.string() });
export type UnmetRequirement = z.infer<typeof unmetRequirementSchema>;

/** The surveyor's reason for signing off although one requirement is unmet; printed in the report and its PDF. */
export const signOffReasonSchema = z.object({
  key: z.string().trim().min(1).max(40),
  reason: userText({ error: 'Say why this version may fly although the requirement is unmet.' })
    .trim()
    .min(10, 'Give a reason of at least 10 characters: it is printed in the report under your name.')
    .max(1000, 'Keep each reason under 1000 characters.'),
});
export type SignOffReason = z.infer<typeof signOffReasonSchema>;

/** Body of POST .../sign-off: the optional note, and a reason for each requirement the version does not meet. */
export const signOffSchema = reviewNoteSchema.extend({
  reasons: z.array(signOffReasonSchema).max(20).optional(),
});

/** Body of POST .../return: the surveyor must say what to change. */
export const returnSchema = z.object({
  comment: userText({ error: 'Say what the planner should change.' })
    .trim()
    .min(1, 'Say what the planner should change.')
    .max(4000, 'Keep the comment under 4000 characters.'),
});

const personSchema = z.object({ id: z.string(), name: z.string() });

/** What happened to the e-mail a transition sends: sending never blocks the change of state. */
const notificationSchema = z.object({
  status: z.enum(['queued', 'skipped']),
  /** Why nothing was sent (no recipient, mail switched off). */
  reason: z.string().optional(),
  recipients: z.array(z.string()),
});
export type Notification = z.infer<typeof notificationSchema>;

/** The review status of one version, as answered by every transition. */
export const versionReviewSchema = z.object({
  versionId: z.string(),
  planId: z.string(),
  number: z.number().int(),
  reviewState: reviewStateSchema,
  locked: z.boolean(),
  signedOffBy: personSchema.nullable(),
  signedOffAt: z.string().nullable(),
  /** The actions the caller's role may take next. */
  allowedActions: z.array(reviewActionSchema),
  /** While in review: the spec's requirements the version does not meet (signing off needs a reason for each). */
  unmet: z.array(unmetRequirementSchema),
  /** Once signed off: the reasons given for the unmet requirements. */
  signOffReasons: z.array(signOffReasonSchema.extend({ label: z.string() })),
  notification: notificationSchema.optional(),
});
export type VersionReview = z.infer<typeof versionReviewSchema>;

/** One entry of a plan's audit trail. */
const auditEventSchema = z.object({
  id: z.string(),
  action: z.string(),
  actor: personSchema.nullable(),
  versionId: z.string().nullable(),
  versionNumber: z.number().int().nullable(),
  fromState: z.string().nullable(),
  toState: z.string().nullable(),
  comment: z.string().nullable(),
  at: z.string(),
});
export type AuditEvent = z.infer<typeof auditEventSchema>;

export const auditTrailSchema = z.object({ planId: z.string(), events: z.array(auditEventSchema) });
export type AuditTrail = z.infer<typeof auditTrailSchema>;

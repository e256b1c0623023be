/** Review states and audit entries in words: badge tones, entry titles and the notice a state carries. */
import { reviewStateLabels, reviewStateSchema, type AuditEvent, type ReviewState } from '../../contracts/reviews';
import type { BadgeTone } from '../ui/badge';
import { analysisStateLabels } from '../../contracts/plans';

/** Badge tone per state: only a signed-off version looks "done"; a returned one asks for attention. */
export const reviewStateTones: Record<ReviewState, BadgeTone> = {
  draft: 'neutral',
  in_review: 'info',
  signed_off: 'success',
  returned: 'caution',
};

/** Under the "Locked" title of a signed-off version, after who signed it off and when. */
export const lockedNote = 'Nothing changes this version any more. Editing the plan makes a new version that needs its own review.';

/** What each state means for the people looking at it, one sentence. */
export const reviewStateNotes: Record<ReviewState, string> = {
  draft: 'Not yet sent for review. A planner sends it once the analysis looks right.',
  in_review: 'Waiting for a surveyor to sign it off or return it with comments.',
  signed_off: 'Signed off and locked: nothing changes this version. Editing the plan makes a new version that needs its own review.',
  returned: 'Returned with comments. Change the plan, run it again, or send this version again once the comments are answered.',
};

const actionTitles: Record<string, string> = {
  'review.submitted': 'Sent for review',
  'review.signed_off': 'Signed off',
  'review.returned': 'Returned with comments',
  'review.flown_confirmed': 'Confirmed as flown',
  'mail.sent': 'E-mail sent',
  'mail.failed': 'E-mail not delivered',
  'invitation.created': 'Invitation sent',
  'invitation.revoked': 'Invitation revoked',
  'invitation.accepted': 'Invitation accepted',
  'version.created': 'Version created',
  'analysis.done': 'Analysis finished',
  'analysis.failed': 'Analysis failed',
  'analysis.retried': 'Analysis tried again (its worker stopped)',
  'as-flown.checked': 'Photos checked as flown',
};

/** A title for an audit action; actions written by other domains fall back to their own name in words. */
export function auditTitle(action: string): string {
  const known = actionTitles[action];
  if (known) return known;
  const words = action.replace(/[._-]+/g, ' ').trim();
  return words ? words[0]!.toUpperCase() + words.slice(1) : 'Change';
}

/**
 * A state name from the audit trail in our words ("in_review" → "In review", the analysis's "done" → "Analysed");
 * unknown names pass through.
 */
export function stateLabel(state: string | null): string | null {
  if (state === null) return null;
  const parsed = reviewStateSchema.safeParse(state);
  if (parsed.success) return reviewStateLabels[parsed.data];
  return state in analysisStateLabels ? analysisStateLabels[state as keyof typeof analysisStateLabels] : state;
}

/** One line under an audit entry's title: version, state change, who. */
export function auditDetail(e: AuditEvent): string {
  const parts: string[] = [];
  if (e.versionNumber !== null) parts.push(`Version ${e.versionNumber}`);
  const from = stateLabel(e.fromState);
  const to = stateLabel(e.toState);
  if (from && to) parts.push(`${from} → ${to}`);
  else if (to) parts.push(`now ${to}`);
  parts.push(e.actor ? `by ${e.actor.name}` : 'by Loftline');
  return parts.join(' · ');
}

/** Newest first, whatever order the server sent (ties keep their order). */
export function newestFirst(events: readonly AuditEvent[]): AuditEvent[] {
  return events
    .map((e, i) => ({ e, i, t: Date.parse(e.at) }))
    .sort((a, b) => (b.t - a.t) || (a.i - b.i))
    .map((x) => x.e);
}

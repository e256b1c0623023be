/** Review use cases: change a version's state (with its audit entry and e-mail), read its status and the plan's audit trail. */
import {
  actionsFrom,
  isLocked,
  reviewStateLabels,
  reviewStateSchema,
  reviewTransitions,
  type AuditTrail,
  type ReviewAction,
  type ReviewState,
  type SignOffReason,
  type UnmetRequirement,
  type VersionReview,
} from '../../contracts/reviews';
import { requirementChecks } from '../reports/report.build';
import type { Role } from '../../contracts/roles';
import { errors } from '../http/errors';
import { versionErrors } from '../versions/versions.errors';
import { reviewErrors } from './reviews.errors';
import type { SessionUser } from '../http/guard';
import type { JobsDb } from '../jobs/jobs.service';
import type { Mailer } from '../mail/mailer';
import type { ReviewNotifier } from './reviews.notify';
import type { ReviewsRepository, TransitionRefusal } from './reviews.repository';
import type { VersionRecord, VersionsRepository } from '../versions/versions.repository';

const actionVerbs: Record<ReviewAction, string> = { submit: 'sent for review', 'sign-off': 'signed off', return: 'returned' };

function list(states: readonly ReviewState[]): string {
  const names = states.map((s) => reviewStateLabels[s].toLowerCase());
  return names.length > 1 ? `${names.slice(0, -1).join(', ')} or ${names[names.length - 1]}` : names[0];
}

/** The 409 message: the current state, what the action needs, and what can be done from here. */
function refusalMessage(action: ReviewAction, refusal: Exclude<TransitionRefusal, { reason: 'not_found' }>): string {
  if (refusal.reason === 'independence') {
    const did = refusal.role === 'created' ? 'ran' : 'sent for review';
    return `Version ${refusal.number} needs an independent check: you ${did} it, so another surveyor or owner of the team must sign it off.`;
  }
  if (refusal.reason === 'analysis') {
    const what = refusal.analysisState === 'failed' ? 'failed' : `is not finished (it is ${refusal.analysisState})`;
    return `Version ${refusal.number} cannot be sent for review: its analysis ${what}. Send it once the analysis is done.`;
  }
  const { state, number } = refusal;
  const needs = `A version can be ${actionVerbs[action]} only when it is ${list(reviewTransitions[action].from)}`;
  const here = isLocked(state)
    ? 'A signed-off version is locked: nothing changes it. Edit the plan and run it to make a new version for review.'
    : `From ${reviewStateLabels[state].toLowerCase()} the next step is: ${actionsFrom(state)
        .map((a) => reviewTransitions[a].label.toLowerCase())
        .join(' or ')}.`;
  return `Version ${number} is ${reviewStateLabels[state].toLowerCase()}. ${needs}. ${here}`;
}

export function createReviewsUsecases(deps: { versions: VersionsRepository; reviews: ReviewsRepository; notify: ReviewNotifier; mailer: () => Mailer }) {
  const { versions, reviews, notify } = deps;

  /** The requirements an analysed version does not meet, worded as in its report (none before analysis). */
  function unmetOf(v: VersionRecord): UnmetRequirement[] {
    if (v.analysisState !== 'done' || v.result == null) return [];
    return requirementChecks(v)
      .filter((c) => !c.pass)
      .map(({ key, label, required, achieved }) => ({ key, label, required, achieved }));
  }

  async function statusOf(v: VersionRecord, role: Role, actorId: string): Promise<VersionReview> {
    const state = reviewStateSchema.parse(v.reviewState);
    const unmet = state === 'in_review' || state === 'signed_off' ? unmetOf(v) : [];
    // Offer sign-off only to someone who neither ran the version nor sent it (the transition checks it again).
    const involved = v.createdById === actorId || (state === 'in_review' && (await reviews.lastSubmitterOf(v.id)) === actorId);
    return {
      versionId: v.id,
      planId: v.planId,
      number: v.number,
      reviewState: state,
      locked: isLocked(state),
      signedOffBy: v.signedOffById ? { id: v.signedOffById, name: v.signedOffByName ?? '(former member)' } : null,
      signedOffAt: v.signedOffAt ? v.signedOffAt.toISOString() : null,
      allowedActions: actionsFrom(state, role).filter((a) => !(a === 'sign-off' && involved)),
      unmet: state === 'in_review' ? unmet : [],
      signOffReasons: (v.signOffReasons ?? []).map((r) => ({ ...r, label: unmet.find((u) => u.key === r.key)?.label ?? r.key })),
    };
  }

  /**
   * Signing off a version that misses part of the spec is allowed only with a reason for each unmet requirement
   * (the surveyor answers for it in the report); reasons for requirements that are met are not kept.
   */
  function reasonsFor(v: VersionRecord, given: SignOffReason[]): SignOffReason[] {
    const unmet = unmetOf(v);
    const missing = unmet.filter((u) => !given.some((g) => g.key === u.key && g.reason.trim().length > 0));
    if (missing.length) {
      throw reviewErrors.reasons_required(
        `Version ${v.number} does not meet ${missing.length === 1 ? 'one requirement' : `${missing.length} requirements`} of the spec (${missing
          .map((m) => `${m.label}: required ${m.required}, achieved ${m.achieved}`)
          .join('; ')}). Give a reason for signing off despite each, or return the version to the planner.`,
        missing.map((m) => ({ path: `reasons.${m.key}`, message: `Say why the version may fly although "${m.label}" is unmet (required ${m.required}; achieved ${m.achieved}).` })),
      );
    }
    return unmet.map((u) => given.find((g) => g.key === u.key)!).map(({ key, reason }) => ({ key, reason }));
  }

  async function load(q: { teamId: string; planId: string; versionId: string; role: Role }): Promise<VersionRecord> {
    const v = await versions.find(q);
    if (!v) throw errors.not_found('Plan version');
    return v;
  }

  return {
    /** The review status of a version as the caller's role sees it. */
    async status(q: { teamId: string; planId: string; versionId: string; role: Role; actor: SessionUser }): Promise<VersionReview> {
      return statusOf(await load(q), q.role, q.actor.id);
    },

    /** Apply a review action; refused transitions are 409 with the reason. The e-mail is queued in the same transaction. */
    async transition(q: { teamId: string; planId: string; versionId: string; role: Role; actor: SessionUser; action: ReviewAction; comment: string | null; reasons?: SignOffReason[] }) {
      const before = await load(q);
      const reasons = q.action === 'sign-off' && reviewStateSchema.parse(before.reviewState) === 'in_review' ? reasonsFor(before, q.reasons ?? []) : undefined;
      const prepared = await notify({ action: q.action, version: before, actor: q.actor, comment: q.comment });
      const enqueue = prepared.job ? (db: JobsDb, at: Date) => deps.mailer().enqueue(prepared.job!(at), db) : undefined;
      const r = await reviews.transition({ teamId: q.teamId, versionId: q.versionId, action: q.action, actorId: q.actor.id, comment: q.comment, reasons, enqueue });
      if (!r.ok) {
        if (r.refusal.reason === 'not_found') throw errors.not_found('Plan version');
        const message = refusalMessage(q.action, r.refusal);
        throw r.refusal.reason === 'analysis' ? versionErrors.analysis_not_done(message) : r.refusal.reason === 'independence' ? reviewErrors.not_independent(message) : reviewErrors.invalid_transition(message);
      }
      const after = await load(q);
      return { ...(await statusOf(after, q.role, q.actor.id)), notification: prepared.notification };
    },

    /** The plan's audit trail. */
    async audit(q: { teamId: string; planId: string }): Promise<AuditTrail> {
      if (!(await versions.planExists(q.teamId, q.planId))) throw errors.not_found('Plan');
      const rows = await reviews.auditOf(q.teamId, q.planId);
      return {
        planId: q.planId,
        events: rows.map((e) => ({
          id: e.id,
          action: e.action,
          actor: e.actorId ? { id: e.actorId, name: e.actorName ?? '(former member)' } : null,
          versionId: e.versionId,
          versionNumber: e.versionNumber,
          fromState: e.fromState,
          toState: e.toState,
          comment: e.comment,
          at: e.at.toISOString(),
        })),
      };
    },
  };
}

/** Review-state changes (row-locked, with their audit entry in the same transaction) and the audit trail of a plan. */
import { and, asc, desc, eq, sql } from 'drizzle-orm';
import { reviewStateSchema, reviewTransitions, transitionAllowed, type ReviewAction, type ReviewState } from '../../contracts/reviews';
import type { Db } from '../../db/client';
import { jobsDbOf, type JobsDb } from '../jobs/jobs.service';
import { auditEvent, member, organization, planVersion, user } from '../../db/schema';

/** Why a transition was refused, as data for the use case to word. */
export type TransitionRefusal =
  | { reason: 'not_found' }
  | { reason: 'state'; state: ReviewState; number: number }
  | { reason: 'analysis'; analysisState: string; number: number }
  | { reason: 'independence'; number: number; role: 'created' | 'submitted' };

export function createReviewsRepository({ db }: { db: Db }) {
  return {
    /**
     * Apply `action` to the version if its current state allows it. The row is locked first, so two reviewers
     * acting at once cannot both pass the check; the audit entry commits with the change or not at all, and so does
     * the mail job that `enqueue` adds (it gets the transaction's connection and the change's time).
     */
    async transition(q: {
      teamId: string;
      versionId: string;
      action: ReviewAction;
      actorId: string;
      comment: string | null;
      /** Sign-off only: the reasons for unmet requirements, stored with the sign-off. */
      reasons?: { key: string; reason: string }[];
      enqueue?: (db: JobsDb, at: Date) => Promise<void>;
    }) {
      return db.transaction(async (tx) => {
        const [row] = await tx
          .select({
            state: planVersion.reviewState,
            analysisState: planVersion.analysisState,
            number: planVersion.number,
            planId: planVersion.planId,
            createdBy: planVersion.createdBy,
          })
          .from(planVersion)
          .where(and(eq(planVersion.id, q.versionId), eq(planVersion.teamId, q.teamId)))
          .for('update');
        if (!row) return { ok: false as const, refusal: { reason: 'not_found' } as TransitionRefusal };
        const state = reviewStateSchema.parse(row.state);
        if (!transitionAllowed(q.action, state)) {
          return { ok: false as const, refusal: { reason: 'state', state, number: row.number } as TransitionRefusal };
        }
        if (q.action === 'submit' && row.analysisState !== 'done') {
          return { ok: false as const, refusal: { reason: 'analysis', analysisState: row.analysisState, number: row.number } as TransitionRefusal };
        }
        if (q.action === 'sign-off') {
          // Independent check: whoever made the version or sent it for review cannot also sign it off.
          if (row.createdBy === q.actorId) {
            return { ok: false as const, refusal: { reason: 'independence', number: row.number, role: 'created' } as TransitionRefusal };
          }
          const [submitted] = await tx
            .select({ actorId: auditEvent.actorId })
            .from(auditEvent)
            .where(and(eq(auditEvent.planVersionId, q.versionId), eq(auditEvent.toState, 'in_review')))
            .orderBy(desc(auditEvent.createdAt))
            .limit(1);
          if (submitted?.actorId === q.actorId) {
            return { ok: false as const, refusal: { reason: 'independence', number: row.number, role: 'submitted' } as TransitionRefusal };
          }
        }
        const t = reviewTransitions[q.action];
        // now() is the transaction's start time: the sign-off time and its audit entry agree to the microsecond.
        await tx
          .update(planVersion)
          .set(q.action === 'sign-off' ? { reviewState: t.to, signedOffBy: q.actorId, signedOffAt: sql`now()`, signOffReasons: q.reasons?.length ? q.reasons : null } : { reviewState: t.to })
          .where(eq(planVersion.id, q.versionId));
        const [entry] = await tx.insert(auditEvent).values({
          teamId: q.teamId,
          planId: row.planId,
          planVersionId: q.versionId,
          actorId: q.actorId,
          action: t.audit,
          fromState: state,
          toState: t.to,
          comment: q.comment,
        }).returning({ at: auditEvent.createdAt });
        if (q.enqueue) await q.enqueue(jobsDbOf(tx), entry.at);
        return { ok: true as const, from: state, to: t.to as ReviewState, at: entry.at };
      });
    },

    /** Who last sent the version for review, if anyone. */
    async lastSubmitterOf(versionId: string): Promise<string | null> {
      const [row] = await db
        .select({ actorId: auditEvent.actorId })
        .from(auditEvent)
        .where(and(eq(auditEvent.planVersionId, versionId), eq(auditEvent.toState, 'in_review')))
        .orderBy(desc(auditEvent.createdAt))
        .limit(1);
      return row?.actorId ?? null;
    },

    /** Every audit entry of a plan, oldest first, with the actor's name and the version number. */
    async auditOf(teamId: string, planId: string) {
      return db
        .select({
          id: auditEvent.id,
          action: auditEvent.action,
          actorId: auditEvent.actorId,
          actorName: user.name,
          versionId: auditEvent.planVersionId,
          versionNumber: planVersion.number,
          fromState: auditEvent.fromState,
          toState: auditEvent.toState,
          comment: auditEvent.comment,
          at: auditEvent.createdAt,
        })
        .from(auditEvent)
        .leftJoin(user, eq(user.id, auditEvent.actorId))
        .leftJoin(planVersion, eq(planVersion.id, auditEvent.planVersionId))
        .where(and(eq(auditEvent.teamId, teamId), eq(auditEvent.planId, planId)))
        .orderBy(asc(auditEvent.createdAt), asc(auditEvent.id));
    },

    /** Members of the team holding `role`, with their addresses (e.g. the surveyors to ask for a review). */
    async membersWithRole(teamId: string, role: string) {
      return db
        .select({ id: user.id, name: user.name, email: user.email })
        .from(member)
        .innerJoin(user, eq(user.id, member.userId))
        .where(and(eq(member.organizationId, teamId), eq(member.role, role)))
        .orderBy(asc(user.email));
    },

    async teamName(teamId: string): Promise<string> {
      const [row] = await db.select({ name: organization.name }).from(organization).where(eq(organization.id, teamId));
      return row?.name ?? 'your team';
    },
  };
}

export type ReviewsRepository = ReturnType<typeof createReviewsRepository>;

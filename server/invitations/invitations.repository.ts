/**
 * Invitations in better-auth's organization `invitation` table (its statuses: pending, accepted, canceled), plus the
 * audit entries of each change. The row id is the link's token: 24 random bytes, base64url.
 */
import crypto from 'node:crypto';
import { and, desc, eq, gt, sql } from 'drizzle-orm';
import type { Role } from '../../contracts/roles';
import type { Db } from '../../db/client';
import { auditEvent, invitation, member, organization, user } from '../../db/schema';
import { changingMembers } from '../http/membership-cache';
import { jobsDbOf, type JobsDb } from '../jobs/jobs.service';

/** A new unguessable token (192 bits). */
function newInvitationToken(): string {
  return crypto.randomBytes(24).toString('base64url');
}

export type AcceptOutcome =
  | { ok: true; teamId: string; teamName: string; role: Role }
  | { ok: false; reason: 'not_found' | 'other_address' | 'used' | 'revoked' | 'expired' | 'already_member'; role?: string };

export function createInvitationsRepository({ db }: { db: Db }) {
  return {
    /** The team's invitations, newest first, with the inviter's name. */
    async list(teamId: string) {
      return db
        .select({ id: invitation.id, email: invitation.email, role: invitation.role, status: invitation.status, expiresAt: invitation.expiresAt, createdAt: invitation.createdAt, invitedBy: user.name })
        .from(invitation)
        .leftJoin(user, eq(user.id, invitation.inviterId))
        .where(eq(invitation.organizationId, teamId))
        .orderBy(desc(invitation.createdAt));
    },

    /** Whether `email` already belongs to a member of the team (their role if so). */
    async memberRole(teamId: string, email: string): Promise<string | null> {
      const rows = await db
        .select({ role: member.role })
        .from(member)
        .innerJoin(user, eq(user.id, member.userId))
        .where(and(eq(member.organizationId, teamId), sql`lower(${user.email}) = ${email.toLowerCase()}`))
        .limit(1);
      return rows[0]?.role ?? null;
    },

    /** A pending, unexpired invitation of `email` to the team, if any. */
    async openInvitation(teamId: string, email: string, now: Date) {
      const rows = await db
        .select({ id: invitation.id, expiresAt: invitation.expiresAt })
        .from(invitation)
        .where(and(eq(invitation.organizationId, teamId), sql`lower(${invitation.email}) = ${email.toLowerCase()}`, eq(invitation.status, 'pending'), gt(invitation.expiresAt, now)))
        .limit(1);
      return rows[0] ?? null;
    },

    /**
     * Store an invitation with its audit entry and, through `enqueue` (given the transaction's connection and the
     * stored row), its mail job: all three commit together, so a crash can neither lose the mail of a stored
     * invitation nor mail a link that was never stored.
     */
    async create(q: { teamId: string; email: string; role: Role; inviterId: string; expiresAt: Date }, enqueue?: (db: JobsDb, row: typeof invitation.$inferSelect) => Promise<void>) {
      const id = newInvitationToken();
      return db.transaction(async (tx) => {
        const [row] = await tx
          .insert(invitation)
          .values({ id, organizationId: q.teamId, email: q.email, role: q.role, status: 'pending', expiresAt: q.expiresAt, inviterId: q.inviterId })
          .returning();
        await tx.insert(auditEvent).values({ teamId: q.teamId, actorId: q.inviterId, action: 'invitation.created', toState: 'pending', comment: `${q.email} as ${q.role}` });
        if (enqueue) await enqueue(jobsDbOf(tx), row);
        return row;
      });
    },

    /** Revoke a pending invitation; answers the row as it was, or null when it is not the team's. */
    async revoke(q: { teamId: string; id: string; actorId: string }) {
      return db.transaction(async (tx) => {
        const [row] = await tx.select().from(invitation).where(and(eq(invitation.id, q.id), eq(invitation.organizationId, q.teamId))).for('update');
        if (!row) return null;
        if (row.status === 'pending') {
          await tx.update(invitation).set({ status: 'canceled' }).where(eq(invitation.id, q.id));
          await tx.insert(auditEvent).values({ teamId: q.teamId, actorId: q.actorId, action: 'invitation.revoked', fromState: 'pending', toState: 'revoked', comment: `${row.email} as ${row.role}` });
        }
        return row;
      });
    },

    /** The invitation behind a token, with its team's name and the inviter's name. */
    async byToken(token: string) {
      const rows = await db
        .select({ id: invitation.id, teamId: invitation.organizationId, teamName: organization.name, email: invitation.email, role: invitation.role, status: invitation.status, expiresAt: invitation.expiresAt, invitedBy: user.name })
        .from(invitation)
        .innerJoin(organization, eq(organization.id, invitation.organizationId))
        .leftJoin(user, eq(user.id, invitation.inviterId))
        .where(eq(invitation.id, token))
        .limit(1);
      return rows[0] ?? null;
    },

    /**
     * Accept: the row is locked, then every rule is checked (address, not used, not revoked, not expired, not a member
     * already); the membership and the used mark commit together, so a link can never be used twice.
     */
    async accept(q: { token: string; userId: string; email: string; now: Date }): Promise<AcceptOutcome> {
      return changingMembers(db, () => db.transaction(async (tx) => {
        const [row] = await tx.select().from(invitation).where(eq(invitation.id, q.token)).for('update');
        if (!row) return { ok: false, reason: 'not_found' };
        if (row.email.toLowerCase() !== q.email.toLowerCase()) return { ok: false, reason: 'other_address' };
        if (row.status === 'accepted') return { ok: false, reason: 'used' };
        if (row.status !== 'pending') return { ok: false, reason: 'revoked' };
        if (row.expiresAt.getTime() <= q.now.getTime()) return { ok: false, reason: 'expired' };
        const [existing] = await tx
          .select({ role: member.role })
          .from(member)
          .where(and(eq(member.organizationId, row.organizationId), eq(member.userId, q.userId)));
        if (existing) return { ok: false, reason: 'already_member', role: existing.role };
        const role = (row.role ?? 'pilot') as Role;
        await tx.insert(member).values({ id: crypto.randomUUID(), organizationId: row.organizationId, userId: q.userId, role });
        await tx.update(invitation).set({ status: 'accepted' }).where(eq(invitation.id, row.id));
        await tx.insert(auditEvent).values({ teamId: row.organizationId, actorId: q.userId, action: 'invitation.accepted', fromState: 'pending', toState: 'accepted', comment: `${row.email} as ${role}` });
        const [team] = await tx.select({ name: organization.name }).from(organization).where(eq(organization.id, row.organizationId));
        return { ok: true, teamId: row.organizationId, teamName: team.name, role };
      }));
    },
  };
}

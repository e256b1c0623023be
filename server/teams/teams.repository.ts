/** Team and membership queries. */
import crypto from 'node:crypto';
import { and, asc, eq, sql } from 'drizzle-orm';
import type { Role } from '../../contracts/roles';
import type { Db } from '../../db/client';
import { member, organization, user } from '../../db/schema';
import { changingMembers } from '../http/membership-cache';

export function createTeamsRepository({ db }: { db: Db }) {
  return {
    /** Teams the user belongs to, with the user's role in each. */
    async teamsOf(userId: string) {
      return db
        .select({ id: organization.id, name: organization.name, slug: organization.slug, role: member.role })
        .from(member)
        .innerJoin(organization, eq(member.organizationId, organization.id))
        .where(eq(member.userId, userId))
        .orderBy(asc(organization.name));
    },

    /** Create a team with `userId` as its first owner. */
    async createTeam(name: string, userId: string) {
      const id = crypto.randomUUID();
      const slug = `${name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'team'}-${id.slice(0, 6)}`;
      await changingMembers(db, () => db.transaction(async (tx) => {
        await tx.insert(organization).values({ id, name, slug });
        await tx.insert(member).values({ id: crypto.randomUUID(), organizationId: id, userId, role: 'owner' });
      }));
      return { id, name, slug, role: 'owner' as Role };
    },

    async members(teamId: string) {
      return db
        .select({ id: member.id, userId: member.userId, name: user.name, email: user.email, role: member.role, joinedAt: member.createdAt })
        .from(member)
        .innerJoin(user, eq(member.userId, user.id))
        .where(eq(member.organizationId, teamId))
        .orderBy(asc(user.name));
    },

    /**
     * Change a member's role or remove them, refusing to leave the team without an owner.
     * Owners are locked for the transaction so two concurrent demotions cannot both pass the check.
     */
    async changeMember(teamId: string, memberId: string, change: { role: Role } | { remove: true }) {
      return changingMembers(db, () => db.transaction(async (tx) => {
        const owners = await tx.execute<{ id: string }>(
          sql`select id from ${member} where organization_id = ${teamId} and role = 'owner' for update`,
        );
        const [target] = await tx
          .select()
          .from(member)
          .where(and(eq(member.id, memberId), eq(member.organizationId, teamId)))
          .for('update');
        if (!target) return { ok: false as const, reason: 'not_found' as const };
        const losesOwner = target.role === 'owner' && ('remove' in change || change.role !== 'owner');
        if (losesOwner && owners.rows.length <= 1) return { ok: false as const, reason: 'last_owner' as const };
        if ('remove' in change) await tx.delete(member).where(eq(member.id, memberId));
        else await tx.update(member).set({ role: change.role }).where(eq(member.id, memberId));
        return { ok: true as const };
      }));
    },
  };
}

export type TeamsRepository = ReturnType<typeof createTeamsRepository>;

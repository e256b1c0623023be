/** Seed the demo team on an empty database (idempotent: does nothing once the demo owner exists). */
import crypto from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { member, organization, user } from '../../db/schema';
import type { Auth } from '../auth/auth';
import { demoTeam, demoUsers } from '../../contracts/demo-team';
import { demoPassword } from './demo-password';
import { changingMembers } from '../http/membership-cache';

export type SeedStep = (ctx: { db: Db; auth: Auth; teamId: string; userIds: Record<string, string> }) => Promise<void>;

/** Create the demo users and team; later steps (projects, sites, plans) run after the team exists. */
export async function seedDemo(deps: { db: Db; auth: Auth; steps?: SeedStep[] }): Promise<{ created: boolean }> {
  const { db, auth } = deps;
  const owner = await db.select({ id: user.id }).from(user).where(eq(user.email, demoUsers[0].email)).limit(1);
  if (owner.length > 0) return { created: false };
  const userIds: Record<string, string> = {};
  for (const u of demoUsers) {
    await auth.api.signUpEmail({ body: { name: u.name, email: u.email, password: demoPassword } });
    const [row] = await db.select({ id: user.id }).from(user).where(eq(user.email, u.email));
    userIds[u.role] = row.id;
  }
  const teamId = crypto.randomUUID();
  await changingMembers(db, () => db.transaction(async (tx) => {
    await tx.insert(organization).values({ id: teamId, name: demoTeam.name, slug: demoTeam.slug });
    for (const u of demoUsers) {
      await tx.insert(member).values({ id: crypto.randomUUID(), organizationId: teamId, userId: userIds[u.role], role: u.role });
    }
  }));
  for (const step of deps.steps ?? []) await step({ db, auth, teamId, userIds });
  return { created: true };
}

/** Signed-in clients for the seeded demo users, and the demo team id. */
import { and, eq } from 'drizzle-orm';
import { organization, plan, planVersion, project, user } from '../../db/schema';
import { demoProject } from '../../server/seed/demo-project';
import type { ReviewState } from '../../contracts/reviews';
import { createVersion, type VersionFixture } from './fixtures';
import type { Role } from '../../contracts/roles';
import { demoTeam, demoUsers } from '../../contracts/demo-team';
import { demoPassword } from '../../server/seed/demo-password';
import { ApiClient } from './http-client';
import type { TestServer } from './test-server';

export async function demoTeamId(srv: TestServer): Promise<string> {
  const [row] = await srv.db.select({ id: organization.id }).from(organization).where(eq(organization.slug, demoTeam.slug));
  if (!row) throw new Error('The demo team is missing: `npm test` seeds it before the suites run.');
  return row.id;
}

export async function demoClients(srv: TestServer): Promise<Record<Role, ApiClient>> {
  const out = {} as Record<Role, ApiClient>;
  for (const u of demoUsers) {
    const c = new ApiClient(srv.url);
    const r = await c.signIn(u.email, demoPassword);
    if (r.status !== 200) throw new Error(`Demo ${u.role} could not sign in: ${r.status}`);
    out[u.role] = c;
  }
  return out;
}

/** Fixture versions in the demo team made by the demo planner (for browser tests that sign in as demo users). */
export async function demoTeamVersions(srv: TestServer, wanted: { reviewState: ReviewState; planName: string }[]): Promise<VersionFixture[]> {
  const teamId = await demoTeamId(srv);
  const [planner] = await srv.db.select({ id: user.id }).from(user).where(eq(user.email, demoUsers.find((u) => u.role === 'planner')!.email));
  const out: VersionFixture[] = [];
  for (const w of wanted) out.push(await createVersion(srv, { teamId, createdBy: planner!.id, ...w }));
  return out;
}

/** Version 1 of the seeded demo plan (analysed at seed time): its ids, its screen's address and its API path; null when the seed made none. */
export async function seededDemoVersion(srv: TestServer): Promise<{ teamId: string; projectId: string; planId: string; versionId: string; siteId: string; pagePath: string; apiPath: string } | null> {
  const teamId = await demoTeamId(srv);
  const [row] = await srv.db
    .select({ projectId: project.id, planId: plan.id, versionId: planVersion.id, siteId: plan.siteId })
    .from(planVersion)
    .innerJoin(plan, eq(plan.id, planVersion.planId))
    .innerJoin(project, eq(project.id, plan.projectId))
    .where(and(eq(project.teamId, teamId), eq(project.name, demoProject.name), eq(plan.name, demoProject.planName), eq(planVersion.number, 1)));
  if (!row) return null;
  return {
    teamId, ...row,
    pagePath: `/projects/${row.projectId}/plans/${row.planId}/versions/${row.versionId}`,
    apiPath: `/api/teams/${teamId}/plans/${row.planId}/versions/${row.versionId}`,
  };
}

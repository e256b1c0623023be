import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';
import { changingMembers } from '../../server/http/membership-cache';

let srv: TestServer;
beforeAll(async () => {
  srv = await startTestServer({ web: false });
});
afterAll(async () => srv?.stop());

async function person(tag: string) {
  const c = new ApiClient(srv.url);
  const email = uniqueEmail(tag);
  await c.signUp(email, 'team tests password', tag);
  await c.signIn(email, 'team tests password');
  return { c, email };
}

/** Put `email` into `teamId` with `role` (invitations come later; the table is the source of truth). */
async function addMember(teamId: string, email: string, role: string) {
  await changingMembers(srv.db, () =>
    srv.db.$client.query(
      `insert into member (id, organization_id, user_id, role) select gen_random_uuid()::text, $1, id, $3 from "user" where email = $2`,
      [teamId, email, role],
    ),
  );
}

describe('teams and members', () => {
  it('makes the creator of a team its owner', async () => {
    const { c } = await person('creator');
    const t = await c.post('/api/teams', { name: 'Fenwater Mapping' });
    expect(t.status).toBe(201);
    expect(t.body.role).toBe('owner');
    const me = await c.get('/api/me');
    expect(me.body.teams.map((x: { id: string }) => x.id)).toContain(t.body.id);
  });

  it('never shows one team the members of another', async () => {
    const a = await person('team-a');
    const b = await person('team-b');
    const ta = (await a.c.post('/api/teams', { name: 'Team A' })).body;
    const tb = (await b.c.post('/api/teams', { name: 'Team B' })).body;
    expect((await a.c.get(`/api/teams/${tb.id}/members`)).status).toBe(404);
    const own = await a.c.get(`/api/teams/${ta.id}/members`);
    expect(own.body.members.map((m: { email: string }) => m.email)).toEqual([a.email]);
  });

  it('lets the owner change a role and remove a member', async () => {
    const owner = await person('owner');
    const other = await person('other');
    const team = (await owner.c.post('/api/teams', { name: 'Rookery Survey' })).body;
    await addMember(team.id, other.email, 'pilot');
    const list = (await owner.c.get(`/api/teams/${team.id}/members`)).body.members;
    const m = list.find((x: { email: string }) => x.email === other.email);
    const changed = await owner.c.patch(`/api/teams/${team.id}/members/${m.id}`, { role: 'planner' });
    expect(changed.status).toBe(200);
    expect(changed.body.role).toBe('planner');
    expect((await other.c.get(`/api/teams/${team.id}/members`)).status).toBe(200); // planners may read members
    expect((await owner.c.delete(`/api/teams/${team.id}/members/${m.id}`)).status).toBe(204);
    expect((await other.c.get(`/api/teams/${team.id}/members`)).status).toBe(404);
  });

  it('applies a role change or a removal on the very next request, though the role was just read and remembered', async () => {
    const owner = await person('cache-owner');
    const other = await person('cache-other');
    const team = (await owner.c.post('/api/teams', { name: 'Gannet Lines' })).body;
    // Not a member yet: refused, and that answer is remembered too.
    expect((await other.c.get(`/api/teams/${team.id}/members`)).status).toBe(404);
    await addMember(team.id, other.email, 'planner');
    expect((await other.c.get(`/api/teams/${team.id}/members`)).status).toBe(200);
    const m = (await owner.c.get(`/api/teams/${team.id}/members`)).body.members.find((x: { email: string }) => x.email === other.email);
    // Read again as planner (the role is now remembered), then demoted to pilot: pilots may not list members.
    expect((await other.c.get(`/api/teams/${team.id}/members`)).status).toBe(200);
    expect((await owner.c.patch(`/api/teams/${team.id}/members/${m.id}`, { role: 'pilot' })).status).toBe(200);
    expect((await other.c.get(`/api/teams/${team.id}/members`)).status).toBe(403);
    expect((await other.c.get(`/api/teams/${team.id}/flights`)).status).toBe(200);
    // Promoted back: allowed at once.
    expect((await owner.c.patch(`/api/teams/${team.id}/members/${m.id}`, { role: 'surveyor' })).status).toBe(200);
    expect((await other.c.get(`/api/teams/${team.id}/members`)).status).toBe(200);
    // Removed: the team is gone for them at once, on every route.
    expect((await owner.c.delete(`/api/teams/${team.id}/members/${m.id}`)).status).toBe(204);
    expect((await other.c.get(`/api/teams/${team.id}/members`)).status).toBe(404);
    expect((await other.c.get(`/api/teams/${team.id}/flights`)).status).toBe(404);
    expect((await other.c.get(`/api/teams/${team.id}/projects`)).status).toBe(404);
  });

  it('refuses to leave a team without an owner', async () => {
    const owner = await person('sole-owner');
    const team = (await owner.c.post('/api/teams', { name: 'Lone Owner Ltd' })).body;
    const [me] = (await owner.c.get(`/api/teams/${team.id}/members`)).body.members;
    const demote = await owner.c.patch(`/api/teams/${team.id}/members/${me.id}`, { role: 'planner' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('last_owner');
    expect((await owner.c.delete(`/api/teams/${team.id}/members/${me.id}`)).status).toBe(409);
    expect((await owner.c.get(`/api/teams/${team.id}/members`)).body.members[0].role).toBe('owner');
  });

  it('refuses an unknown role field by field', async () => {
    const owner = await person('role-check');
    const team = (await owner.c.post('/api/teams', { name: 'Role Check' })).body;
    const [me] = (await owner.c.get(`/api/teams/${team.id}/members`)).body.members;
    const r = await owner.c.patch(`/api/teams/${team.id}/members/${me.id}`, { role: 'admiral' });
    expect(r.status).toBe(422);
    expect(r.body.error.fields[0].path).toBe('role');
  });
});

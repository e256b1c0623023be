import crypto from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { invitation, member } from '../../db/schema';
import type { Mailer } from '../../server/mail/mailer';
import { fixturePassword, freshTeam, type FreshTeam } from '../support/fixtures';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

let srv: TestServer;
let team: FreshTeam;
const mailer = () => srv.services.mail as Mailer;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  team = await freshTeam(srv, 'invites');
});
afterAll(async () => srv?.stop());

async function person(email = uniqueEmail('invitee')) {
  const c = new ApiClient(srv.url);
  await c.signUp(email, fixturePassword, 'Ossian Brae');
  expect((await c.signIn(email, fixturePassword)).status).toBe(200);
  return { c, email };
}

async function invite(email: string, role = 'planner') {
  const res = await team.clients.owner.post(`/api/teams/${team.teamId}/invitations`, { email, role });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: string; link: string; status: string; expiresAt: string; email: string };
}

const tokenOf = (link: string) => decodeURIComponent(link.split('/invite/')[1]);

describe('inviting someone to a team', () => {
  it('mails a link with the role, and the invited address can join once through it', async () => {
    const { c, email } = await person();
    const inv = await invite(email, 'surveyor');
    expect(inv.status).toBe('pending');
    expect(inv.link).toBe(`${srv.url}/invite/${encodeURIComponent(inv.id)}`);
    const days = (Date.parse(inv.expiresAt) - Date.now()) / 86_400_000;
    expect(days).toBeGreaterThan(6.99);
    expect(days).toBeLessThanOrEqual(7);

    await mailer().idle();
    const mail = mailer().fake!.messages.find((m) => m.to.includes(email));
    expect(mail?.subject).toBe(`${team.users.owner.name} invites you to Fixture team invites on Loftline`);
    expect(mail?.text).toContain('as Surveyor');
    expect(mail?.text).toContain(inv.link);

    const token = tokenOf(inv.link);
    const preview = await c.get(`/api/invitations/${encodeURIComponent(token)}`);
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({ teamId: team.teamId, teamName: 'Fixture team invites', role: 'surveyor', status: 'pending', invitedBy: team.users.owner.name });

    const accepted = await c.post(`/api/invitations/${encodeURIComponent(token)}/accept`, {});
    expect(accepted.status).toBe(200);
    expect(accepted.body).toEqual({ teamId: team.teamId, teamName: 'Fixture team invites', role: 'surveyor' });
    const me = await c.get('/api/me');
    expect(me.body.teams).toContainEqual(expect.objectContaining({ id: team.teamId, role: 'surveyor' }));

    const again = await c.post(`/api/invitations/${encodeURIComponent(token)}/accept`, {});
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('invitation_used');
    const list = await team.clients.owner.get(`/api/teams/${team.teamId}/invitations`);
    expect(list.body.invitations.find((i: { id: string }) => i.id === inv.id)).toMatchObject({ status: 'accepted', link: null });
  });

  it('cannot be seen or used by another address, and stays usable for the right one', async () => {
    const invited = await person();
    const stranger = await person();
    const inv = await invite(invited.email);
    const token = encodeURIComponent(tokenOf(inv.link));
    const peek = await stranger.c.get(`/api/invitations/${token}`);
    expect(peek.status).toBe(403);
    expect(JSON.stringify(peek.body)).not.toContain('Fixture team');
    const steal = await stranger.c.post(`/api/invitations/${token}/accept`, {});
    expect(steal.status).toBe(403);
    expect(steal.body.error.code).toBe('invitation_other_address');
    expect((await stranger.c.get('/api/me')).body.teams.map((t: { id: string }) => t.id)).not.toContain(team.teamId);
    expect((await invited.c.post(`/api/invitations/${token}/accept`, {})).status).toBe(200);
  });

  it('matches the address without regard to letter case', async () => {
    const email = uniqueEmail('mixedcase');
    const inv = await invite(email.replace(/^./, (ch) => ch.toUpperCase()).replace('@tests.example', '@Tests.Example'));
    expect(inv.email).toBe(email);
    const { c } = await person(email);
    expect((await c.post(`/api/invitations/${encodeURIComponent(tokenOf(inv.link))}/accept`, {})).status).toBe(200);
  });

  it('is refused after it expires', async () => {
    const { c, email } = await person();
    const inv = await invite(email);
    await srv.db.update(invitation).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitation.id, inv.id));
    const res = await c.post(`/api/invitations/${encodeURIComponent(tokenOf(inv.link))}/accept`, {});
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('invitation_expired');
    expect((await c.get(`/api/invitations/${encodeURIComponent(tokenOf(inv.link))}`)).body.status).toBe('expired');
    const list = await team.clients.owner.get(`/api/teams/${team.teamId}/invitations`);
    expect(list.body.invitations.find((i: { id: string }) => i.id === inv.id).status).toBe('expired');
    // An expired invitation no longer blocks a new one to the same address.
    expect((await team.clients.owner.post(`/api/teams/${team.teamId}/invitations`, { email, role: 'pilot' })).status).toBe(201);
  });

  it('is refused after the owner revokes it; a revoked invitation cannot be revoked again', async () => {
    const { c, email } = await person();
    const inv = await invite(email);
    const revoked = await team.clients.owner.delete(`/api/teams/${team.teamId}/invitations/${encodeURIComponent(inv.id)}`);
    expect(revoked.status).toBe(200);
    expect(revoked.body.status).toBe('revoked');
    const res = await c.post(`/api/invitations/${encodeURIComponent(tokenOf(inv.link))}/accept`, {});
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('invitation_revoked');
    expect((await team.clients.owner.delete(`/api/teams/${team.teamId}/invitations/${encodeURIComponent(inv.id)}`)).status).toBe(409);
  });

  it('lets only one of two simultaneous accepts through', async () => {
    const { c, email } = await person();
    const inv = await invite(email);
    const path = `/api/invitations/${encodeURIComponent(tokenOf(inv.link))}/accept`;
    const statuses = (await Promise.all([c.post(path, {}), c.post(path, {})])).map((r) => r.status).sort();
    expect(statuses).toEqual([200, 409]);
    const rows = await srv.db.select().from(member).where(eq(member.organizationId, team.teamId));
    expect(rows.filter((r) => r.role === 'planner')).toHaveLength(new Set(rows.filter((r) => r.role === 'planner').map((r) => r.userId)).size);
  });

  it('refuses a second pending invitation, a current member, and a member accepting again', async () => {
    const { c, email } = await person();
    const inv = await invite(email);
    const dup = await team.clients.owner.post(`/api/teams/${team.teamId}/invitations`, { email, role: 'pilot' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.code).toBe('already_invited');
    const current = await team.clients.owner.post(`/api/teams/${team.teamId}/invitations`, { email: team.users.pilot.email, role: 'planner' });
    expect(current.status).toBe(409);
    expect(current.body.error.code).toBe('already_member');
    // Joined by other means meanwhile: the link is refused and says so.
    const [row] = await srv.db.select().from(invitation).where(eq(invitation.id, inv.id));
    const me = (await c.get('/api/me')).body.user.id;
    await srv.db.insert(member).values({ id: crypto.randomUUID(), organizationId: row.organizationId, userId: me, role: 'pilot' });
    const res = await c.post(`/api/invitations/${encodeURIComponent(tokenOf(inv.link))}/accept`, {});
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/already a member of this team \(as Pilot\)/);
  });

  it('checks the request: a valid address and a known role', async () => {
    const bad = await team.clients.owner.post(`/api/teams/${team.teamId}/invitations`, { email: 'not-an-address', role: 'admiral' });
    expect(bad.status).toBe(422);
    expect(bad.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(['email', 'role']);
  });

  it('is for owners only, and needs a signed-in person to accept', async () => {
    expect((await team.clients.planner.post(`/api/teams/${team.teamId}/invitations`, { email: uniqueEmail('x'), role: 'pilot' })).status).toBe(403);
    expect((await team.clients.surveyor.get(`/api/teams/${team.teamId}/invitations`)).status).toBe(403);
    const inv = await invite(uniqueEmail('anon'));
    const anon = new ApiClient(srv.url);
    expect((await anon.post(`/api/invitations/${encodeURIComponent(tokenOf(inv.link))}/accept`, {})).status).toBe(401);
    expect((await anon.get(`/api/invitations/${encodeURIComponent(tokenOf(inv.link))}`)).status).toBe(401);
  });

  it('answers 404 for a token that names nothing', async () => {
    const { c } = await person();
    expect((await c.post(`/api/invitations/${'x'.repeat(32)}/accept`, {})).status).toBe(404);
  });
});

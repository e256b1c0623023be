import crypto from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { invitation, member } from '../../db/schema';
import type { Mailer } from '../../server/mail/mailer';
import { fixturePassword, freshTeam, type FreshTeam } from '../support/fixtures';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';
import { changingMembers } from '../../server/http/membership-cache';

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
    await changingMembers(srv.db, () => srv.db.insert(member).values({ id: crypto.randomUUID(), organizationId: row.organizationId, userId: me, role: 'pilot' }));
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

  it('stores an invitation and queues its mail in one transaction: both or neither', async () => {
    const queue = srv.services.config.env.MAIL_QUEUE;
    // both: the audit entry and the mail job carry the same transaction time (now() is the transaction's start)
    const email = uniqueEmail('one-tx');
    await invite(email);
    const audit = await srv.db.$client.query<{ at: string }>(
      "select created_at::text as at from audit_event where team_id = $1 and action = 'invitation.created' and comment = $2",
      [team.teamId, `${email} as planner`],
    );
    const job = await srv.db.$client.query<{ at: string }>(
      "select created_on::text as at from pgboss.job where name = $1 and data->'mail'->'to' ? $2 union all select created_on::text from pgboss.archive where name = $1 and data->'mail'->'to' ? $2",
      [queue, email],
    );
    expect(audit.rows).toHaveLength(1);
    expect(job.rows).toEqual([{ at: audit.rows[0].at }]);

    // neither: a queue that refuses the mail job leaves no invitation, no audit entry and no job, and says so
    const refused = uniqueEmail('queue-refuses');
    await srv.db.$client.query(`create or replace function pg_temp_refuse_mail() returns trigger language plpgsql as $$
      begin
        if new.data->'mail'->'to' ? '${refused}' then raise exception 'mail queue refuses this job (test)'; end if;
        return new;
      end $$`);
    await srv.db.$client.query('create trigger refuse_mail_test before insert on pgboss.job for each row execute function pg_temp_refuse_mail()');
    try {
      const res = await team.clients.owner.post(`/api/teams/${team.teamId}/invitations`, { email: refused, role: 'pilot' });
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('mail_queue_unavailable');
      expect(res.body.error.message).toMatch(/Nothing was saved: try again/);
    } finally {
      await srv.db.$client.query('drop trigger refuse_mail_test on pgboss.job');
      await srv.db.$client.query('drop function pg_temp_refuse_mail()');
    }
    expect(await srv.db.select().from(invitation).where(eq(invitation.email, refused))).toEqual([]);
    const trail = await srv.db.$client.query("select 1 from audit_event where team_id = $1 and comment like $2", [team.teamId, `${refused}%`]);
    expect(trail.rows).toEqual([]);
    // and the same address can be invited at once afterwards
    await invite(refused, 'pilot');
  });
});

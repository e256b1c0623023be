import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoUsers } from '../../contracts/demo-team';
import { demoPassword } from '../../server/seed/demo-password';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

let srv: TestServer;
beforeAll(async () => {
  srv = await startTestServer({ web: false });
});
afterAll(async () => srv?.stop());

describe('sign-up, sign-in and sign-out', () => {
  it('looks a session up once for many requests that arrive together with the same cookie, and not past a sign-out', async () => {
    const c = new ApiClient(srv.url);
    const email = uniqueEmail('one-lookup');
    await c.signUp(email, 'correct horse battery');
    await c.signIn(email, 'correct horse battery');
    // Count (and slow down) the guards' session lookups: the guard calls auth.api.getSession on each lookup.
    const api = srv.auth.api as { getSession: (...a: unknown[]) => Promise<unknown> };
    const real = api.getSession;
    let lookups = 0;
    api.getSession = async (...a: unknown[]) => {
      lookups++;
      await new Promise((r) => setTimeout(r, 150));
      return real.apply(srv.auth.api, a);
    };
    try {
      const answers = await Promise.all(Array.from({ length: 20 }, () => c.get('/api/me')));
      expect(answers.map((r) => r.status)).toEqual(Array(20).fill(200));
      expect(lookups).toBe(1);
      // A lookup under way when the reader signs out is not shared with, nor remembered for, later requests.
      const before = c.get('/api/me');
      await new Promise((r) => setTimeout(r, 20));
      expect((await c.signOut()).status).toBe(200);
      expect((await c.get('/api/me')).status).toBe(401);
      await before;
      expect((await c.get('/api/me')).status).toBe(401);
    } finally {
      api.getSession = real;
    }
  });

  it('signs a new user up, in and out with a cookie session', async () => {
    const c = new ApiClient(srv.url);
    const email = uniqueEmail('signup');
    const up = await c.signUp(email, 'correct horse battery');
    expect(up.status).toBe(200);
    expect((await c.get('/api/me')).status).toBe(401);
    const inn = await c.signIn(email, 'correct horse battery');
    expect(inn.status).toBe(200);
    expect(c.signedIn).toBe(true);
    const me = await c.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(email);
    expect(me.body.teams).toEqual([]);
    expect((await c.signOut()).status).toBe(200);
    expect((await c.get('/api/me')).status).toBe(401);
  });

  it('refuses a password shorter than 10 characters', async () => {
    const c = new ApiClient(srv.url);
    const r = await c.signUp(uniqueEmail('short'), 'short');
    expect(r.status).toBe(400);
    expect(JSON.stringify(r.body)).toMatch(/short/i);
  });

  it('answers sign-up for a taken address exactly like a fresh one, and never signs the caller in', async () => {
    const taken = await new ApiClient(srv.url).signUp(demoUsers[1].email, 'some other password');
    const fresh = await new ApiClient(srv.url).signUp(uniqueEmail('fresh'), 'some other password');
    expect(taken.status).toBe(fresh.status);
    expect(Object.keys(taken.body).sort()).toEqual(Object.keys(fresh.body).sort());
    expect('token' in taken.body).toBe(false);
  });

  it('gives the same answer for a wrong password and an unknown address', async () => {
    const wrong = await new ApiClient(srv.url).signIn(demoUsers[1].email, 'not the password');
    const unknown = await new ApiClient(srv.url).signIn(uniqueEmail('nobody'), 'not the password');
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
  });

  it('signs every demo user in with the documented password', async () => {
    for (const u of demoUsers) {
      const c = new ApiClient(srv.url);
      expect((await c.signIn(u.email, demoPassword)).status).toBe(200);
      const me = await c.get('/api/me');
      expect(me.body.teams[0].role).toBe(u.role);
    }
  });
});

describe('sign-in rate limit', () => {
  it('answers 429 once a client has used up its sign-in attempts for the minute', async () => {
    const limited = await startTestServer({ web: false, env: { AUTH_SIGNIN_PER_MINUTE: '3' } });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 5; i++) statuses.push((await new ApiClient(limited.url).signIn(demoUsers[0].email, 'wrong password!')).status);
      expect(statuses.slice(0, 3)).toEqual([401, 401, 401]);
      expect(statuses.slice(3)).toEqual([429, 429]);
    } finally {
      await limited.stop();
    }
  });
});

describe('sign-in limit per account', () => {
  it('refuses an account after its failed sign-ins, from any client, while other accounts still sign in', async () => {
    const limited = await startTestServer({ web: false, env: { AUTH_SIGNIN_FAILURES_PER_ACCOUNT: '3' } });
    try {
      const email = uniqueEmail('locked');
      await new ApiClient(limited.url).signUp(email, 'the right password');
      const statuses: number[] = [];
      // Different clients and spellings of the address: the count follows the account, not the socket.
      for (const spelling of [email, email.toUpperCase(), email]) statuses.push((await new ApiClient(limited.url).signIn(spelling, 'a wrong password')).status);
      expect(statuses).toEqual([401, 401, 401]);
      const blocked = await new ApiClient(limited.url).signIn(email, 'the right password');
      expect(blocked.status).toBe(429);
      expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0);
      expect(blocked.body.message).toMatch(/Too many failed sign-ins for this account/);
      expect((await new ApiClient(limited.url).signIn(demoUsers[2].email, demoPassword)).status).toBe(200);
    } finally {
      await limited.stop();
    }
  });
});

describe('the session token stays in its HttpOnly cookie', () => {
  it('is in no JSON body of sign-in, get-session or list-sessions, and the cookie still works', async () => {
    const c = new ApiClient(srv.url);
    const inn = await c.signIn(demoUsers[3].email, demoPassword);
    expect(inn.status).toBe(200);
    expect(inn.body.user.email).toBe(demoUsers[3].email);
    const session = await c.get('/api/auth/get-session');
    expect(session.status).toBe(200);
    expect(session.body.user.email).toBe(demoUsers[3].email);
    const sessions = await c.get('/api/auth/list-sessions');
    expect(sessions.status).toBe(200);
    expect(sessions.body.length).toBeGreaterThan(0);
    const cookieToken = decodeURIComponent((inn.headers.getSetCookie().find((h) => h.includes('session_token')) ?? '').split(';')[0].split('=')[1]).split('.')[0];
    expect(cookieToken.length).toBeGreaterThan(10);
    for (const body of [inn.body, session.body, sessions.body]) {
      expect(JSON.stringify(body)).not.toMatch(/"token"/);
      expect(JSON.stringify(body)).not.toContain(cookieToken);
    }
    expect((await c.get('/api/me')).status).toBe(200);
  });
});

describe("the auth library's organization endpoints", () => {
  it('are closed to every role (a pilot cannot read members or their e-mail addresses there)', async () => {
    const { demoClients, demoTeamId } = await import('../support/demo');
    const clients = await demoClients(srv);
    const teamId = await demoTeamId(srv);
    const reads = [
      `/api/auth/organization/list-members?organizationId=${teamId}`,
      `/api/auth/organization/get-full-organization?organizationId=${teamId}`,
      `/api/auth/organization/list-invitations?organizationId=${teamId}`,
      `/api/auth/organization/get-active-member`,
      `/api/auth/organization/list`,
    ];
    for (const role of ['pilot', 'owner'] as const) {
      for (const path of reads) {
        const res = await clients[role].get(path);
        expect(res.status, `${role} ${path}`).toBe(404);
        expect(JSON.stringify(res.body)).not.toMatch(/@brackenmoor\.example/);
      }
      const set = await clients[role].post('/api/auth/organization/set-active', { organizationId: teamId });
      expect(set.status).toBe(404);
      const invite = await clients[role].post('/api/auth/organization/invite-member', { organizationId: teamId, email: uniqueEmail('sneak'), role: 'owner' });
      expect(invite.status).toBe(404);
    }
    // Loftline's own member list still refuses the pilot, and serves the owner.
    expect((await clients.pilot.get(`/api/teams/${teamId}/members`)).status).toBe(403);
    expect((await clients.owner.get(`/api/teams/${teamId}/members`)).status).toBe(200);
  });
});

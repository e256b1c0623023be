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
    expect(taken.body.token).toBeNull();
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

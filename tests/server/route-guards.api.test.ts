import crypto from 'node:crypto';
import type { Router } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { rolesWithout, type Role } from '../../contracts/roles';
import { guardMetaOf, type GuardMeta } from '../../server/http/guard';
import { demoClients, demoTeamId } from '../support/demo';
import { ApiClient } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

interface RouteEntry {
  method: string;
  path: string;
  guard: GuardMeta | undefined;
}

/** Every route registered on the API router, with the guard its first handler declares. */
function registeredRoutes(api: Router): RouteEntry[] {
  const out: RouteEntry[] = [];
  for (const layer of (api as unknown as { stack: any[] }).stack) {
    if (!layer.route) continue;
    const route = layer.route;
    for (const method of Object.keys(route.methods).filter((m) => route.methods[m])) {
      out.push({ method: method.toUpperCase(), path: route.path, guard: guardMetaOf(route.stack[0]?.handle) });
    }
  }
  return out;
}

let srv: TestServer;
let teamId: string;
let clients: Record<Role, ApiClient>;
let routes: RouteEntry[];

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  teamId = await demoTeamId(srv);
  clients = await demoClients(srv);
  routes = registeredRoutes(srv.api);
});
afterAll(async () => srv?.stop());

function concrete(path: string): string {
  return '/api' + path.replace(/:teamId/g, teamId).replace(/:(\w+)/g, () => crypto.randomUUID());
}

describe('every API route is guarded on the server', () => {
  it('finds the routes on the Express app', () => {
    expect(routes.length).toBeGreaterThan(4);
    expect(routes.map((r) => `${r.method} ${r.path}`)).toContain('GET /me');
  });

  it('declares a guard as the first handler of every route', () => {
    const unguarded = routes.filter((r) => !r.guard).map((r) => `${r.method} ${r.path}`);
    expect(unguarded).toEqual([]);
  });

  it('answers 401 to every non-public route without a session', async () => {
    const failures: string[] = [];
    for (const r of routes.filter((x) => x.guard && x.guard.kind !== 'public')) {
      const res = await new ApiClient(srv.url).request(r.method, concrete(r.path), { body: r.method === 'GET' ? undefined : {} });
      if (res.status !== 401 || res.body?.error?.code !== 'unauthenticated') failures.push(`${r.method} ${r.path} -> ${res.status}`);
    }
    expect(failures).toEqual([]);
  });

  it('answers 403 to every role that lacks the route permission', async () => {
    const failures: string[] = [];
    let checked = 0;
    for (const r of routes) {
      if (r.guard?.kind !== 'permission') continue;
      for (const role of rolesWithout(r.guard.permission)) {
        checked++;
        const res = await clients[role].request(r.method, concrete(r.path), { body: r.method === 'GET' ? undefined : {} });
        if (res.status !== 403 || res.body?.error?.code !== 'forbidden') failures.push(`${role} ${r.method} ${r.path} -> ${res.status}`);
      }
    }
    expect(checked).toBeGreaterThan(0);
    expect(failures).toEqual([]);
  });

  it('answers 404 for a team the caller does not belong to, whatever the role', async () => {
    const outsider = new ApiClient(srv.url);
    const other = `outsider-${crypto.randomUUID()}@tests.example`;
    await outsider.signUp(other, 'outsider password');
    await outsider.signIn(other, 'outsider password');
    for (const r of routes.filter((x) => x.guard?.kind === 'permission' && x.method === 'GET')) {
      const res = await outsider.get(concrete(r.path));
      expect(res.status, `${r.method} ${r.path}`).toBe(404);
    }
  });
});

describe('every state-changing API route refuses requests from another site', () => {
  const stateChanging = () => routes.filter((r) => ['POST', 'PUT', 'PATCH', 'DELETE'].includes(r.method));
  const foreign = 'https://evil.example';
  /** The bodies a cross-site page can send: JSON through fetch, and a form's url-encoded or multipart body (no preflight). */
  const bodies = (): Array<{ kind: string; body: unknown; headers?: Record<string, string> }> => {
    const form = new FormData();
    form.append('comment', 'signed off from elsewhere');
    form.append('file', new Blob([new Uint8Array([73, 73, 42, 0])]), 'x.tif');
    return [
      { kind: 'json', body: {} },
      { kind: 'form', body: 'comment=signed+off', headers: { 'Content-Type': 'application/x-www-form-urlencoded' } },
      { kind: 'multipart', body: form },
    ];
  };

  it('answers 403 cross_origin to a foreign Origin with a valid session cookie, whatever the body', async () => {
    expect(stateChanging().length).toBeGreaterThan(5);
    expect(clients.owner.signedIn).toBe(true);
    const failures: string[] = [];
    for (const r of stateChanging()) {
      for (const b of bodies()) {
        const res = await clients.owner.request(r.method, concrete(r.path), { body: b.body, headers: { ...b.headers, Origin: foreign } });
        if (res.status !== 403 || res.body?.error?.code !== 'cross_origin') failures.push(`${b.kind} ${r.method} ${r.path} -> ${res.status}`);
      }
    }
    expect(failures).toEqual([]);
  });

  it('falls back to the Referer, and refuses a cookie-bearing request that names neither', async () => {
    const failures: string[] = [];
    for (const r of stateChanging()) {
      const viaReferer = await clients.owner.request(r.method, concrete(r.path), { body: {}, noOrigin: true, headers: { Referer: `${foreign}/page` } });
      if (viaReferer.status !== 403 || viaReferer.body?.error?.code !== 'cross_origin') failures.push(`referer ${r.method} ${r.path} -> ${viaReferer.status}`);
      const neither = await clients.owner.request(r.method, concrete(r.path), { body: {}, noOrigin: true });
      if (neither.status !== 403 || neither.body?.error?.code !== 'cross_origin') failures.push(`none ${r.method} ${r.path} -> ${neither.status}`);
    }
    expect(failures).toEqual([]);
  });

  it('says why in the message, and lets the same request through from its own origin or its own Referer', async () => {
    const refused = await clients.owner.request('POST', '/api/teams', { body: { name: '' }, headers: { Origin: foreign } });
    expect(refused.body.error.message).toMatch(/another site \(https:\/\/evil\.example\)/);
    const own = await clients.owner.request('POST', '/api/teams', { body: { name: '' } });
    expect(own.status).toBe(422); // reached the route: the empty name is what is wrong
    const ownReferer = await clients.owner.request('POST', '/api/teams', { body: { name: '' }, noOrigin: true, headers: { Referer: `${srv.url}/projects` } });
    expect(ownReferer.status).toBe(422);
  });

  it('leaves clients without cookies alone (they have no session to misuse): 401, not 403', async () => {
    const res = await new ApiClient(srv.url).request('POST', `/api/teams/${teamId}/projects`, { body: {}, noOrigin: true });
    expect(res.status).toBe(401);
  });
});

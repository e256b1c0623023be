import net from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NUL_MESSAGE } from '../../contracts/text';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { freePort, startTestServer, type TestServer } from '../support/test-server';
import { ownProject } from '../support/upload-helpers';

let srv: TestServer;
let c: ApiClient;
let teamId: string;
let projectId: string;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  const p = await ownProject(srv, 'refusals');
  ({ c, teamId, projectId } = p);
});
afterAll(async () => srv?.stop());

describe('NUL characters in text', () => {
  it('refuses a NUL in any JSON text field with a 422 naming the field, on every kind of route', async () => {
    const cases: Array<[string, string, unknown, string]> = [
      ['POST', '/api/teams', { name: 'Quarry\u0000team' }, 'name'],
      ['POST', `/api/teams/${teamId}/projects`, { name: 'North pit', client: 'Smith\u0000Sons' }, 'client'],
      ['PATCH', `/api/teams/${teamId}/projects/${projectId}`, { notes: 'a\u0000b' }, 'notes'],
      ['POST', `/api/teams/${teamId}/projects/${projectId}/plans`, { name: 'x', siteId: '00000000-0000-4000-8000-000000000000', input: { area: { type: 'Poly\u0000gon' } } }, 'input.area.type'],
      ['POST', `/api/teams/${teamId}/invitations`, { email: 'pilot\u0000@b.example', role: 'pilot' }, 'email'],
      ['POST', `/api/teams/${teamId}/projects/${projectId}/plans`, { name: 'x', input: { area: { coordinates: [[[0, 0], 'a\u0000']] } } }, 'input.area.coordinates.0.1'],
    ];
    for (const [method, path, body, field] of cases) {
      const r = await c.request(method, path, { body });
      expect(r.status, `${method} ${path}`).toBe(422);
      expect(r.body.error.fields, `${method} ${path}`).toEqual([{ path: field, message: NUL_MESSAGE }]);
    }
  });

  it('refuses a NUL in an upload form field before the file is looked at', async () => {
    const f = new FormData();
    f.append('surfaceKind', 'bare-earth');
    f.append('name', 'Fell\u0000top');
    f.append('file', new Blob([new Uint8Array(64)]), 'dem.tif');
    const r = await c.request('POST', `/api/teams/${teamId}/projects/${projectId}/sites`, { body: f });
    expect(r.status).toBe(422);
    expect(r.body.error.fields).toEqual([{ path: 'name', message: NUL_MESSAGE }]);
  });

  it('refuses a NUL in a sign-up name without a server error', async () => {
    const r = await new ApiClient(srv.url).signUp(uniqueEmail('nul'), 'a long password', 'Ada\u0000Pennick');
    expect(r.status).toBeGreaterThanOrEqual(400);
    expect(r.status).toBeLessThan(500);
  });
});

describe('%00 in URL ids', () => {
  it('answers 404 to %00 in place of a team, project, site or plan id', async () => {
    for (const path of [
      `/api/teams/%00/projects`,
      `/api/teams/${teamId}/projects/%00`,
      `/api/teams/${teamId}/projects/${projectId}/sites/%00`,
      `/api/teams/${teamId}/plans/%00/versions`,
      `/api/teams/${teamId}/projects/ab%00cd/plans`,
    ]) {
      const r = await c.get(path);
      expect(r.status, path).toBe(404);
      expect(r.body.error.code, path).toBe('not_found');
    }
    expect((await c.request('DELETE', `/api/teams/${teamId}/projects/%00`)).status).toBe(404);
  });
});

/** A TCP proxy to PostgreSQL that can be cut (every connection dropped, new ones refused) and restored. */
async function pgProxy(target: URL) {
  const port = await freePort();
  const sockets = new Set<net.Socket>();
  let server: net.Server | null = null;
  const open = () =>
    new Promise<void>((resolve) => {
      server = net.createServer((client) => {
        const upstream = net.connect(Number(target.port || 5432), target.hostname);
        for (const s of [client, upstream]) {
          sockets.add(s);
          s.on('close', () => sockets.delete(s));
          s.on('error', () => s.destroy());
        }
        client.pipe(upstream).pipe(client);
      });
      server.listen(port, '127.0.0.1', () => resolve());
    });
  await open();
  return {
    url: (() => {
      const u = new URL(target.href);
      u.hostname = '127.0.0.1';
      u.port = String(port);
      return u.href;
    })(),
    async cut() {
      const s = server!;
      await new Promise<void>((resolve) => {
        s.close(() => resolve());
        for (const sock of sockets) sock.destroy();
      });
    },
    restore: open,
  };
}

describe('a PostgreSQL outage', () => {
  it('answers 503 with Retry-After while the database is away, and recovers without a restart', async () => {
    const direct = new URL(process.env.LOFTLINE_TEST_DATABASE_URL!);
    const proxy = await pgProxy(direct);
    const viaProxy = await startTestServer({ web: false, databaseUrl: proxy.url, env: { WORKERS: '0' } });
    try {
      const p = await ownProject(viaProxy, 'outage');
      expect((await p.c.get(`/api/teams/${p.teamId}/projects`)).status).toBe(200);

      await proxy.cut();
      const read = await p.c.get(`/api/teams/${p.teamId}/projects`);
      expect(read.status).toBe(503);
      expect(read.headers.get('retry-after')).toBe('5');
      expect(read.body.error.code).toBe('db_unavailable');
      const write = await p.c.post(`/api/teams/${p.teamId}/projects`, { name: 'During the outage' });
      expect(write.status).toBe(503);
      const health = await p.c.get('/api/health');
      expect(health.status).toBe(503);
      expect(health.headers.get('retry-after')).toBe('5');

      await proxy.restore();
      const after = await p.c.get(`/api/teams/${p.teamId}/projects`);
      expect(after.status).toBe(200);
      // the refused write left nothing behind
      expect(after.body.projects.map((x: { name: string }) => x.name)).not.toContain('During the outage');
      expect((await p.c.post(`/api/teams/${p.teamId}/projects`, { name: 'After the outage' })).status).toBe(201);
    } finally {
      await viaProxy.stop().catch(() => undefined);
      await proxy.cut().catch(() => undefined);
    }
  });
});

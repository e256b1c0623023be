import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

const demBytes = fs.readFileSync('datasets/harrow-fell-dem.tif');
const mission = () => ({
  area: { type: 'Polygon', coordinates: [[[4.48, 46.766], [4.488, 46.766], [4.488, 46.771], [4.48, 46.771], [4.48, 46.766]]] },
  camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 },
  targetGsdCm: 2.5,
  headingDeg: 90,
  takeoff: { lon: 4.478, lat: 46.768 },
});

/** A raw GET (no automatic decompression), so the test sees exactly what went over the wire. */
function rawGet(url: string, headers: Record<string, string>): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }> {
  return new Promise((resolve, reject) => {
    http.get(url, { headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }));
    }).on('error', reject);
  });
}

let srv: TestServer;
beforeAll(async () => {
  srv = await startTestServer({ env: { WORKERS: '1', JOBS_POLL_SECONDS: '0.5' } });
});
afterAll(async () => srv?.stop());

describe('reads under load: cached bodies, compression, cache headers', () => {
  it('answers a settled version gzip-compressed with a strong ETag, 304 when unchanged, and a new ETag when its review state changes', async () => {
    const c = new ApiClient(srv.url);
    const email = uniqueEmail('etag');
    await c.signUp(email, 'etag password 1', 'Etag Person');
    await c.signIn(email, 'etag password 1');
    const teamId = (await c.post('/api/teams', { name: 'Team etag' })).body.id as string;
    const projectId = (await c.post(`/api/teams/${teamId}/projects`, { name: 'Project etag' })).body.id as string;
    const f = new FormData();
    f.append('surfaceKind', 'bare-earth');
    f.append('file', new Blob([new Uint8Array(demBytes)]), 'harrow-fell-dem.tif');
    const site = (await c.request('POST', `/api/teams/${teamId}/projects/${projectId}/sites`, { body: f })).body;
    const p = await c.post(`/api/teams/${teamId}/projects/${projectId}/plans`, { name: 'Plan etag', siteId: site.id, input: mission() });
    const plan = `/api/teams/${teamId}/plans/${p.body.id}`;
    const v = await c.post(`${plan}/runs`);
    expect(v.status).toBe(202);
    const t0 = Date.now();
    for (;;) {
      const s = await c.get(`${plan}/versions/${v.body.id}/status`);
      if (s.body.analysisState === 'done') break;
      expect(s.body.analysisState).not.toBe('failed');
      if (Date.now() - t0 > 90_000) throw new Error('analysis did not finish');
      await new Promise((r) => setTimeout(r, 250));
    }
    const cookie = c.cookieHeader();
    const url = `${srv.url}${plan}/versions/${v.body.id}`;

    const plain = await rawGet(url, { Cookie: cookie });
    expect(plain.status).toBe(200);
    expect(plain.headers['content-encoding']).toBeUndefined();
    const body = JSON.parse(plain.body.toString());
    expect(body.reviewState).toBe('draft');
    expect(body.result.lines.length).toBeGreaterThan(0);

    const zipped = await rawGet(url, { Cookie: cookie, 'Accept-Encoding': 'gzip' });
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.body.byteLength).toBeLessThan(plain.body.byteLength / 3);
    expect(JSON.parse(zlib.gunzipSync(zipped.body).toString())).toEqual(body);
    const etag = zipped.headers.etag!;
    expect(etag).toBe(plain.headers.etag);

    const again = await rawGet(url, { Cookie: cookie, 'If-None-Match': etag });
    expect(again.status).toBe(304);
    expect(again.body.byteLength).toBe(0);

    // another member's view must not come from someone else's access: a stranger gets 404, cached body or not
    const stranger = new ApiClient(srv.url);
    const se = uniqueEmail('stranger');
    await stranger.signUp(se, 'etag password 2', 'Stranger');
    await stranger.signIn(se, 'etag password 2');
    expect((await stranger.get(`${plan}/versions/${v.body.id}`)).status).toBe(404);

    expect((await c.post(`${plan}/versions/${v.body.id}/submit`)).status).toBe(200);
    const after = await rawGet(url, { Cookie: cookie, 'If-None-Match': etag });
    expect(after.status).toBe(200);
    expect(after.headers.etag).not.toBe(etag);
    expect(JSON.parse(after.body.toString()).reviewState).toBe('in_review');
  }, 150_000);

  it('refuses a signed-out session at once, although sessions are briefly cached', async () => {
    const c = new ApiClient(srv.url);
    const email = uniqueEmail('signout');
    await c.signUp(email, 'signout password', 'Out Person');
    await c.signIn(email, 'signout password');
    expect((await c.get('/api/me')).status).toBe(200); // now cached
    const saved = c.cookieHeader();
    expect((await c.signOut()).status).toBe(200);
    const replay = await rawGet(`${srv.url}/api/me`, { Cookie: saved });
    expect(replay.status).toBe(401);
  });

  it('serves the app shell for revalidation and hashed bundles as immutable for a year, compressed', async () => {
    const dist = process.env.LOFTLINE_WEB_DIST;
    if (process.env.LOFTLINE_SKIP_WEB === '1') return; // quick server-only runs have no web build
    expect(dist && fs.existsSync(path.join(dist, 'index.html'))).toBeTruthy();
    const shell = await rawGet(`${srv.url}/`, { 'Accept-Encoding': 'gzip' });
    expect(shell.status).toBe(200);
    expect(shell.headers['cache-control']).toBe('no-cache');
    const html = zlib.gunzipSync(shell.body).toString();
    const script = /<script[^>]+src="([^"]+\.js)"/.exec(html)?.[1];
    expect(script).toMatch(/-[0-9a-f]{16,}\.js$/);
    const js = await rawGet(`${srv.url}${script}`, { 'Accept-Encoding': 'gzip' });
    expect(js.status).toBe(200);
    expect(js.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(js.headers['content-encoding']).toBe('gzip');
  });
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

let srv: TestServer;
let client: ApiClient;
beforeAll(async () => {
  srv = await startTestServer({ web: false, env: { JSON_LIMIT: '2kb' } });
  client = new ApiClient(srv.url);
  const email = uniqueEmail('errors');
  await client.signUp(email, 'errors password');
  await client.signIn(email, 'errors password');
});
afterAll(async () => srv?.stop());

describe('API errors are JSON with the right status', () => {
  it('answers 400 malformed_json to a broken JSON body', async () => {
    const r = await client.request('POST', '/api/teams', { body: '{"name": "Half', headers: { 'Content-Type': 'application/json' } });
    expect(r.status).toBe(400);
    expect(r.body.error.code).toBe('malformed_json');
  });

  it('answers 415 to a body that is not JSON', async () => {
    const r = await client.request('POST', '/api/teams', { body: 'name=Team', headers: { 'Content-Type': 'text/plain' } });
    expect(r.status).toBe(415);
    expect(r.body.error.code).toBe('unsupported_media_type');
  });

  it('answers 413 to an oversized body', async () => {
    const r = await client.post('/api/teams', { name: 'x'.repeat(5000) });
    expect(r.status).toBe(413);
    expect(r.body.error.code).toBe('too_large');
  });

  it('answers 422 with field paths to an invalid body', async () => {
    const r = await client.post('/api/teams', { name: 'x' });
    expect(r.status).toBe(422);
    expect(r.body.error.fields).toEqual([{ path: 'name', message: expect.stringMatching(/at least 2/) }]);
  });

  it('answers 404 to an unknown API route', async () => {
    const r = await client.get('/api/no-such-thing');
    expect(r.status).toBe(404);
    expect(r.body.error.code).toBe('not_found');
  });

  it('reports the database as up on the health route', async () => {
    const r = await new ApiClient(srv.url).get('/api/health');
    expect(r).toMatchObject({ status: 200, body: { ok: true, db: 'up' } });
  });

  it('answers 500 without a stack trace when a handler throws', async () => {
    const { createApp } = await import('../../server/app');
    const express = (await import('express')).default;
    const logged: unknown[] = [];
    const { app } = createApp({
      db: srv.db,
      auth: srv.auth,
      config: { jsonLimit: '1kb', webDist: null, publicUrl: 'http://127.0.0.1' } as never,
      log: (e) => logged.push(e),
      routes: [(api, { guards }) => api.get('/boom', guards.public(), () => { throw new Error('secret detail at /srv/x.ts:12'); })],
    });
    const server = app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    const port = (server.address() as { port: number }).port;
    const r = await new ApiClient(`http://127.0.0.1:${port}`).get('/api/boom');
    server.close();
    expect(r.status).toBe(500);
    expect(r.body.error.code).toBe('internal');
    expect(JSON.stringify(r.body)).not.toMatch(/secret detail|\.ts:/);
    expect(logged).toHaveLength(1);
    void express;
  });
});

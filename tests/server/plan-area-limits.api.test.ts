import { spawn } from 'node:child_process';
import fs from 'node:fs';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MAX_AREA_CORNERS } from '../../contracts/mission';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';
import { wavyRing, withSwappedCorners } from '../support/area-rings';

const demBytes = fs.readFileSync('datasets/harrow-fell-dem.tif');

let srv: TestServer;
let c: ApiClient;
let plansPath: string;
let siteId: string;
let teamId: string;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  c = new ApiClient(srv.url);
  const email = uniqueEmail('area-limits');
  await c.signUp(email, 'area limits password', 'Area Limits');
  await c.signIn(email, 'area limits password');
  teamId = (await c.post('/api/teams', { name: 'Team area limits' })).body.id;
  const projectId = (await c.post(`/api/teams/${teamId}/projects`, { name: 'Area limits' })).body.id;
  const f = new FormData();
  f.append('surfaceKind', 'bare-earth');
  f.append('file', new Blob([new Uint8Array(demBytes)]), 'harrow-fell-dem.tif');
  const site = await c.request('POST', `/api/teams/${teamId}/projects/${projectId}/sites`, { body: f });
  expect(site.status).toBe(201);
  siteId = site.body.id;
  plansPath = `/api/teams/${teamId}/projects/${projectId}/plans`;
});
afterAll(async () => srv?.stop());

/** Ask /api/health every 25 ms for `ms`: how long the answers took, and the longest event-loop stall meanwhile. */
async function probeHealth(ms: number) {
  const loopDelay = monitorEventLoopDelay({ resolution: 10 });
  loopDelay.enable();
  const latencies: number[] = [];
  const until = Date.now() + ms;
  while (Date.now() < until) {
    const t0 = performance.now();
    const h = await fetch(`${srv.url}/api/health`);
    await h.text();
    latencies.push(performance.now() - t0);
    expect(h.status).toBe(200);
    await new Promise((r) => setTimeout(r, 25));
  }
  loopDelay.disable();
  latencies.sort((a, b) => a - b);
  return { count: latencies.length, medianMs: latencies[Math.floor(latencies.length / 2)], p90Ms: latencies[Math.floor(latencies.length * 0.9)], worstMs: latencies[latencies.length - 1], loopMaxMs: loopDelay.max / 1e6 };
}

/** A child process that posts the JSON body from stdin, SENDERS requests at a time, for SECONDS and prints the status counts. */
const SENDER = `
let body = '';
for await (const chunk of process.stdin) body += chunk;
const counts = {};
const until = Date.now() + Number(process.env.SECONDS) * 1000;
await Promise.all(Array.from({ length: Number(process.env.SENDERS) }, async () => {
  while (Date.now() < until) {
    const r = await fetch(process.env.TARGET, { method: 'POST', body, headers: { 'Content-Type': 'application/json', Cookie: process.env.COOKIE, Origin: process.env.ORIGIN } });
    await r.text();
    counts[r.status] = (counts[r.status] ?? 0) + 1;
  }
}));
process.stdout.write(JSON.stringify(counts));
`;

/** A plan body over the demo grid (extent lon 4.4668-4.4960, lat 46.7638-46.7803, datasets/README.md). */
const planBody = (ring: number[][], name = 'Traced boundary') => ({
  name,
  siteId,
  input: {
    area: { type: 'Polygon', coordinates: [ring] },
    camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 },
    targetGsdCm: 2.5,
    takeoff: { lon: 4.478, lat: 46.768 },
  },
});

describe('survey area size and crossings', () => {
  it('refuses a 10,000-corner area with a 422 that states the limit', async () => {
    const r = await c.post(plansPath, planBody(wavyRing(10_000)));
    expect(r.status).toBe(422);
    expect(r.body.error.fields.map((f: { path: string }) => f.path)).toContain('input.area');
    expect(r.body.error.message).toContain(`the limit is ${MAX_AREA_CORNERS.toLocaleString('en')}`);
    expect(r.body.error.message).toContain('10,000 corners');
  });

  it('keeps /api/health answering within 200 ms while 10,000-corner areas are being sent', async () => {
    // The bound is the one the hardening issue asks for. The server runs inside this test process, so the senders
    // run in a child process: their own work (serialising, sending) must not count against the server. On a
    // shared 2-core machine single answers also stall for reasons no handler controls (the scheduler, garbage
    // collection, PostgreSQL), so the probe runs first without senders and the worst stall seen then is allowed
    // on top of the 200 ms; 9 answers in 10 must come within 200 ms flat. (The old quadratic check held the
    // loop for 30 s.)
    const quiet = await probeHealth(1500);
    const body = JSON.stringify(planBody(wavyRing(10_000)));
    const sender = spawn(process.execPath, ['--input-type=module', '-e', SENDER], {
      env: { ...process.env, TARGET: srv.url + plansPath, COOKIE: c.cookieHeader(), ORIGIN: srv.url, SENDERS: '1', SECONDS: '3' },
      stdio: ['pipe', 'pipe', 'inherit'],
    });
    sender.stdin.end(body);
    let out = '';
    sender.stdout.on('data', (d) => (out += d));
    const done = new Promise<void>((resolve) => sender.on('exit', () => resolve()));
    await new Promise((r) => setTimeout(r, 300)); // let the first requests arrive
    const loaded = await probeHealth(2500);
    await done;
    const statuses = JSON.parse(out) as Record<string, number>;
    console.info(`health without senders: worst ${quiet.worstMs.toFixed(1)} ms (event loop held ${quiet.loopMaxMs.toFixed(1)} ms); ` +
      `while 10,000-corner areas were sent (${JSON.stringify(statuses)}): ${loaded.count} answers, median ${loaded.medianMs.toFixed(1)} ms, 90th percentile ${loaded.p90Ms.toFixed(1)} ms, ` +
      `worst ${loaded.worstMs.toFixed(1)} ms, event loop held at most ${loaded.loopMaxMs.toFixed(1)} ms`);
    expect(Object.keys(statuses)).toEqual(['422']);
    expect(statuses['422']).toBeGreaterThan(4);
    expect(loaded.p90Ms).toBeLessThan(200);
    expect(loaded.worstMs).toBeLessThan(200 + quiet.worstMs);
  });

  it('refuses a 1,999-corner area that crosses itself, saying where', async () => {
    const r = await c.post(plansPath, planBody(withSwappedCorners(wavyRing(MAX_AREA_CORNERS - 1), 1200)));
    expect(r.status).toBe(422);
    expect(r.body.error.message).toMatch(/crosses itself \(edges 1199 and 1201, near lon 4\.\d{5}, lat 46\.\d{5}\)/);
  });

  it('saves a 1,999-corner area and lists it without checking its geometry again', async () => {
    const t0 = performance.now();
    const created = await c.post(plansPath, planBody(wavyRing(MAX_AREA_CORNERS - 1), 'Large outline'));
    const saveMs = performance.now() - t0;
    expect(created.status).toBe(201);
    expect(created.body.input.area.coordinates[0]).toHaveLength(MAX_AREA_CORNERS);
    const t1 = performance.now();
    const list = await c.get(plansPath);
    const listMs = performance.now() - t1;
    expect(list.status).toBe(200);
    expect(list.body.plans.map((p: { id: string }) => p.id)).toContain(created.body.id);
    console.info(`1,999-corner plan: saved in ${saveMs.toFixed(0)} ms, listed in ${listMs.toFixed(0)} ms`);
  });
});

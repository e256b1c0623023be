/**
 * No request stalls the server for others: /api/health keeps answering while 10,000-corner survey areas (five
 * times the limit) are being posted. Timed, so it runs in the quiet pass after the parallel suites.
 */
import { spawn } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/test-server';
import { wavyRing } from '../support/area-rings';
import { areaLimitsFixture, probeHealth, type AreaLimitsFixture } from '../support/area-limits-fixture';

let srv: TestServer;
let fx: AreaLimitsFixture;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  fx = await areaLimitsFixture(srv, 'area-stall');
});
afterAll(async () => srv?.stop());

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

describe('survey area size under load', () => {
  it('keeps /api/health answering within 200 ms while 10,000-corner areas are being sent', async () => {
    // The bound is the one the hardening issue asks for. The server runs inside this test process, so the senders
    // run in a child process: their own work (serialising, sending) must not count against the server. On a
    // shared 2-core machine single answers also stall for reasons no handler controls (the scheduler, garbage
    // collection, PostgreSQL), so the probe runs first without senders and the worst stall seen then is allowed
    // on top of the 200 ms; 9 answers in 10 must come within 200 ms flat. (The old quadratic check held the
    // loop for 30 s.)
    const quiet = await probeHealth(srv.url, 1500);
    const body = JSON.stringify(fx.planBody(wavyRing(10_000)));
    const sender = spawn(process.execPath, ['--input-type=module', '-e', SENDER], {
      env: { ...process.env, TARGET: srv.url + fx.plansPath, COOKIE: fx.c.cookieHeader(), ORIGIN: srv.url, SENDERS: '1', SECONDS: '3' },
      stdio: ['pipe', 'pipe', 'inherit'],
    });
    sender.stdin.end(body);
    let out = '';
    sender.stdout.on('data', (d) => (out += d));
    const done = new Promise<void>((resolve) => sender.on('exit', () => resolve()));
    await new Promise((r) => setTimeout(r, 300)); // let the first requests arrive
    const loaded = await probeHealth(srv.url, 2500);
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
});

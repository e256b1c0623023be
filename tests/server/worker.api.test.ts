import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

const demBytes = fs.readFileSync('datasets/harrow-fell-dem.tif');
// A queue of this suite's own, so workers of other suites in the same run never take its job.
const queueEnv = {
  ANALYSIS_QUEUE: 'plan-analysis-worker-test',
  ANALYSIS_EXPIRE_SECONDS: '20', // a killed worker's job counts as lost after 20 s (above this run's few seconds)...
  JOBS_MAINTENANCE_SECONDS: '1', // ...and is found within a second
  ANALYSIS_RETRY_LIMIT: '3',
  JOBS_POLL_SECONDS: '0.5',
};
/** Most of the demo grid (north of its corner without data) at 1 cm GSD: a run of a few seconds, long enough to kill the worker in the middle. */
const heavyMission = {
  area: { type: 'Polygon', coordinates: [[[4.469, 46.768], [4.494, 46.768], [4.494, 46.7785], [4.469, 46.7785], [4.469, 46.768]]] },
  camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 },
  targetGsdCm: 1,
  clearanceM: 20,
  takeoff: { lon: 4.478, lat: 46.770 },
};

let srv: TestServer;
const children: ChildProcess[] = [];

beforeAll(async () => {
  srv = await startTestServer({ web: false, env: { ...queueEnv, WORKERS: '0' } });
});
afterAll(async () => {
  for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
  await srv?.stop();
});

/** Start `scripts/worker.ts` as its own process (node with the tsx loader: one process, so a kill hits the worker itself). */
async function startWorker(name: string): Promise<{ child: ChildProcess; output: () => string }> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], {
    env: { ...process.env, ...queueEnv, DATABASE_URL: process.env.LOFTLINE_TEST_DATABASE_URL, WORKERS: '1', NODE_ENV: 'test' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.push(child);
  let out = '';
  child.stdout!.on('data', (d) => (out += d));
  child.stderr!.on('data', (d) => (out += d));
  const t0 = Date.now();
  while (!/ready: 1 worker on queue plan-analysis-worker-test/.test(out)) {
    if (child.exitCode !== null) throw new Error(`worker ${name} exited early:\n${out}`);
    if (Date.now() - t0 > 60_000) throw new Error(`worker ${name} not ready after 60 s:\n${out}`);
    await new Promise((r) => setTimeout(r, 100));
  }
  return { child, output: () => out };
}

async function versionRow(id: string) {
  const r = await srv.db.$client.query<{ analysis_state: string; has_result: boolean }>('select analysis_state, result is not null as has_result from plan_version where id = $1', [id]);
  return r.rows[0];
}

async function until<T>(what: string, fn: () => Promise<T | undefined | false>, timeoutMs: number, stepMs = 50): Promise<T> {
  const t0 = Date.now();
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() - t0 > timeoutMs) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, stepMs));
  }
}

describe('analysis workers', () => {
  it('finishes a run exactly once after its worker process is killed mid-run and another takes over', { timeout: 180_000 }, async () => {
    const c = new ApiClient(srv.url);
    const email = uniqueEmail('worker');
    await c.signUp(email, 'worker password', 'Worker Test');
    await c.signIn(email, 'worker password');
    const teamId = (await c.post('/api/teams', { name: 'Worker test team' })).body.id;
    const projectId = (await c.post(`/api/teams/${teamId}/projects`, { name: 'Worker test' })).body.id;
    const f = new FormData();
    f.append('surfaceKind', 'bare-earth');
    f.append('file', new Blob([new Uint8Array(demBytes)]), 'harrow-fell-dem.tif');
    const site = (await c.request('POST', `/api/teams/${teamId}/projects/${projectId}/sites`, { body: f })).body;
    const plan = (await c.post(`/api/teams/${teamId}/projects/${projectId}/plans`, { name: 'Whole fell', siteId: site.id, input: heavyMission })).body;

    const first = await startWorker('A');
    const run = (await c.post(`/api/teams/${teamId}/plans/${plan.id}/runs`, {})).body;
    // worker A claims the version; kill it without warning while it analyses
    await until('worker A to start the run', async () => (await versionRow(run.id)).analysis_state === 'running', 30_000, 20);
    await new Promise((r) => setTimeout(r, 300));
    first.child.kill('SIGKILL');
    await until('worker A to die', async () => first.child.exitCode !== null || first.child.signalCode !== null, 10_000);
    expect(first.child.signalCode).toBe('SIGKILL');
    expect(await versionRow(run.id)).toEqual({ analysis_state: 'running', has_result: false }); // it really died mid-run

    const second = await startWorker('B');
    const status = await until(
      'the run to settle',
      async () => {
        const s = (await c.get(`/api/teams/${teamId}/plans/${plan.id}/versions/${run.id}/status`)).body;
        return s.analysisState === 'done' || s.analysisState === 'failed' ? s : undefined;
      },
      120_000,
      250,
    );
    expect(status, second.output()).toMatchObject({ analysisState: 'done', analysisProgressPct: 100 });

    // the queue retried the one job rather than creating another
    const job = await until(
      'the job to complete',
      async () => {
        const r = await srv.db.$client.query<{ state: string; retry_count: number }>('select state, retry_count from pgboss.job where id = $1', [run.id]);
        expect(r.rows).toHaveLength(1);
        return r.rows[0].state === 'completed' ? r.rows[0] : undefined;
      },
      60_000,
      250,
    );
    expect(job.retry_count).toBeGreaterThanOrEqual(1);
    // exactly one result and one "done" record, counted once the job has settled so a late attempt would show
    const audits = await srv.db.$client.query<{ action: string; n: number }>(
      'select action, count(*)::int as n from audit_event where plan_version_id = $1 group by action order by action',
      [run.id],
    );
    expect(audits.rows).toEqual([{ action: 'analysis.done', n: 1 }, { action: 'version.created', n: 1 }]);
    const v = (await c.get(`/api/teams/${teamId}/plans/${plan.id}/versions/${run.id}`)).body;
    expect(v.result.summary.photoCount).toBeGreaterThan(1000);

    second.child.kill('SIGTERM');
    await until('worker B to stop', async () => second.child.exitCode !== null, 20_000);
    expect(second.child.exitCode).toBe(0);
  });
});

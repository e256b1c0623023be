import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';
import { handBackLostAnalyses } from '../../server/analysis/analysis-supervisor';
import type { Jobs } from '../../server/jobs/jobs.service';

const demBytes = fs.readFileSync('datasets/harrow-fell-dem.tif');
// A queue of this suite's own, so workers of other suites in the same run never take its job.
// The heartbeat settings stay at their defaults (5 s beats, lost after 30 s) and the queue's own expiry at its
// default 900 s, so the retry this test waits for can only come from the heartbeat supervisor.
const queueEnv = {
  ANALYSIS_QUEUE: 'plan-analysis-worker-test',
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
  it('hands a killed worker\'s run back within a minute, says so, and finishes it exactly once on another worker', { timeout: 240_000 }, async () => {
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
    const killedAt = Date.now();
    expect(first.child.signalCode).toBe('SIGKILL');
    expect(await versionRow(run.id)).toEqual({ analysis_state: 'running', has_result: false }); // it really died mid-run

    const second = await startWorker('B');
    // the supervisors (this server's and worker B's) see the stopped heartbeat and hand the job back: the status
    // no longer claims a live run but says the last attempt lost its worker and that it is tried again
    const handedBack = await until(
      'the lost run to be handed back',
      async () => {
        const s = (await c.get(`/api/teams/${teamId}/plans/${plan.id}/versions/${run.id}/status`)).body;
        return s.analysisState !== 'running' || s.analysisError ? s : undefined;
      },
      60_000,
      100,
    );
    const handedBackAfterMs = Date.now() - killedAt;
    expect(handedBack).toMatchObject({ analysisProgressPct: 0 });
    expect(['queued', 'running']).toContain(handedBack.analysisState);
    expect(handedBack.analysisError).toMatch(/^Attempt 1 lost its worker \(no sign of life for 30 s/);
    expect(handedBackAfterMs).toBeLessThan(60_000);
    // picked up again by worker B within a minute of the kill
    await until('worker B to take the run', async () => (await versionRow(run.id)).analysis_state !== 'queued', 60_000 - handedBackAfterMs, 50);
    expect(Date.now() - killedAt).toBeLessThan(60_000);
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
    expect(job.retry_count).toBe(1); // handed back once, by one supervisor
    // exactly one result and one "done" record, counted once the job has settled so a late attempt would show
    const audits = await srv.db.$client.query<{ action: string; n: number }>(
      'select action, count(*)::int as n from audit_event where plan_version_id = $1 group by action order by action',
      [run.id],
    );
    expect(audits.rows).toEqual([
      { action: 'analysis.done', n: 1 },
      { action: 'analysis.retried', n: 1 },
      { action: 'version.created', n: 1 },
    ]);
    const v = (await c.get(`/api/teams/${teamId}/plans/${plan.id}/versions/${run.id}`)).body;
    expect(v.result.summary.photoCount).toBeGreaterThan(1000);

    second.child.kill('SIGTERM');
    await until('worker B to stop', async () => second.child.exitCode !== null, 20_000);
    expect(second.child.exitCode).toBe(0);
  });

  it('hands a lost job back exactly once when several supervisors look at the same moment', { timeout: 60_000 }, async () => {
    const jobs = srv.services.jobs as Jobs;
    const c = new ApiClient(srv.url);
    const email = uniqueEmail('supervisor');
    await c.signUp(email, 'supervisor password', 'Supervisor Test');
    await c.signIn(email, 'supervisor password');
    const teamId = (await c.post('/api/teams', { name: 'Supervisor test team' })).body.id;
    const projectId = (await c.post(`/api/teams/${teamId}/projects`, { name: 'Supervisor test' })).body.id;
    const f = new FormData();
    f.append('surfaceKind', 'bare-earth');
    f.append('file', new Blob([new Uint8Array(demBytes)]), 'harrow-fell-dem.tif');
    const site = (await c.request('POST', `/api/teams/${teamId}/projects/${projectId}/sites`, { body: f })).body;
    const plan = (await c.post(`/api/teams/${teamId}/projects/${projectId}/plans`, { name: 'Lost run', siteId: site.id, input: heavyMission })).body;
    const run = (await c.post(`/api/teams/${teamId}/plans/${plan.id}/runs`, {})).body;
    // take the job as a worker would (no worker runs in this test's processes), then "die": the version says
    // running, its heartbeat and the job's start are 20 s old; the looks below count 10 s as lost (the server's own
    // supervisor, at the default 30 s, stays out of the way)
    const [fetched] = await jobs.boss.fetch(jobs.queues.analysis, { batchSize: 1 });
    expect(fetched?.id).toBe(run.id);
    await srv.db.$client.query("update plan_version set analysis_state = 'running', analysis_progress_pct = 95, analysis_heartbeat_at = now() - interval '20 seconds' where id = $1", [run.id]);
    await srv.db.$client.query("update pgboss.job set started_on = now() - interval '20 seconds' where id = $1", [run.id]);
    // a live run (heartbeat 1 s old) is left alone
    await srv.db.$client.query("update plan_version set analysis_heartbeat_at = now() - interval '1 second' where id = $1", [run.id]);
    expect(await handBackLostAnalyses(srv.db, jobs, 10)).not.toContain(run.id);
    await srv.db.$client.query("update plan_version set analysis_heartbeat_at = now() - interval '20 seconds' where id = $1", [run.id]);

    const looks = await Promise.all([1, 2, 3, 4].map(() => handBackLostAnalyses(srv.db, jobs, 10)));
    expect(looks.flat().filter((id) => id === run.id)).toHaveLength(1);
    const job = await srv.db.$client.query<{ state: string; retry_count: number }>('select state, retry_count from pgboss.job where id = $1', [run.id]);
    // waiting for its retry (pg-boss counts the retry when a worker fetches it again)
    expect(job.rows).toEqual([{ state: 'retry', retry_count: 0 }]);
    expect(await versionRow(run.id)).toEqual({ analysis_state: 'queued', has_result: false });
    const retried = await srv.db.$client.query<{ n: number }>("select count(*)::int as n from audit_event where plan_version_id = $1 and action = 'analysis.retried'", [run.id]);
    expect(retried.rows[0].n).toBe(1);
    // a later look finds nothing more to do
    expect(await handBackLostAnalyses(srv.db, jobs, 10)).not.toContain(run.id);
    await jobs.boss.cancel(jobs.queues.analysis, run.id);
  });
});

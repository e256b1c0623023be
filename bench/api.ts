/**
 * `npm run bench:api`: the read mix that every role makes (projects list, a plan version with its result's
 * overview and one line with its stations, as the results screen reads them, the pilot's leg sheet) under load from
 * autocannon, against a real server in its own process on a fresh bench database, alone and while analyses run
 * beside it. Prints p50/p95/p99, throughput, errors and the server's
 * resident memory, and `ratio`-style lines against the targets. Not part of `npm test`.
 *
 * Knobs: BENCH_SECONDS (default 30), BENCH_RATE (requests/s overall, default 200), BENCH_CONNECTIONS (200).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import { createDb } from '../db/client';
import { migrateDb } from '../db/migrate';
import { demoUsers } from '../contracts/demo-team';
import { demoProject } from '../server/seed/demo-project';
import { demoPassword } from '../server/seed/demo-password';
import { createAuth } from '../server/auth/auth';
import { buildConfig, parseEnv } from '../server/config';
import { demoProjectStep } from '../server/seed/demo-project';
import { seedDemo } from '../server/seed/seed';
import { createStorageFromConfig } from '../server/storage/storage.service';
import { projectRoot } from '../scripts/lib/paths';
import { createRunDatabase, startCluster } from '../scripts/lib/postgres';

const seconds = Number(process.env.BENCH_SECONDS ?? 30);
const rate = Number(process.env.BENCH_RATE ?? 200);
const connections = Number(process.env.BENCH_CONNECTIONS ?? 200);
const pgPort = Number(process.env.LOFTLINE_PG_PORT ?? 54329);

const cluster = await startCluster({ port: pgPort, databases: [], fast: true });
const runDb = await createRunDatabase(cluster, 'loftline_bench');
const databaseUrl = cluster.url(runDb.name);
const storageDir = fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-bench-'));
{
  const db = createDb(databaseUrl);
  await migrateDb(db);
  const config = buildConfig(parseEnv({ ...process.env, STORAGE_DIR: storageDir }), { databaseUrl, authSecret: 'bench-secret-0123456789-abcdefghijklmnopqrstuvwxyz', webDist: null });
  await seedDemo({ db, auth: createAuth({ db, config }), steps: [demoProjectStep({ storage: createStorageFromConfig(config) })] });
  await db.$client.end();
}

let child: ChildProcess | null = null;
async function cleanUp() {
  if (child && child.exitCode === null) {
    child.kill('SIGTERM');
    await new Promise((r) => child!.once('exit', r));
  }
  await runDb.drop().catch(() => undefined);
  fs.rmSync(storageDir, { recursive: true, force: true });
  cluster.stop();
}

const port = await new Promise<number>((resolve) => {
  const s = net.createServer().listen(0, '127.0.0.1', () => {
    const p = (s.address() as net.AddressInfo).port;
    s.close(() => resolve(p));
  });
});

try {
  child = spawn(process.execPath, [...(process.env.BENCH_PROFILE ? ['--cpu-prof', '--cpu-prof-dir', process.env.BENCH_PROFILE] : []), '--import', 'tsx', path.join(projectRoot, 'bench/api-server.ts')], {
    cwd: projectRoot,
    env: { ...process.env, DATABASE_URL: databaseUrl, STORAGE_DIR: storageDir, PORT: String(port), HOST: '127.0.0.1', PUBLIC_URL: `http://127.0.0.1:${port}`, WORKERS: '1', AUTH_SIGNIN_PER_MINUTE: '1000', NODE_ENV: 'production' },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const url = await new Promise<string>((resolve, reject) => {
    let buf = '';
    child!.stdout!.on('data', (d: Buffer) => {
      buf += d.toString();
      const m = /LISTENING (\S+)/.exec(buf);
      if (m) resolve(m[1]);
    });
    child!.once('exit', (code) => reject(new Error(`bench server exited (${code}) before listening`)));
  });
  const pid = child.pid!;
  const rssMiB = () => Number(/VmRSS:\s+(\d+)/.exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1] ?? 0) / 1024;
  // The server's CPU time so far (user + system, all its threads) in ms, from /proc/PID/stat fields 14 and 15 (proc(5)).
  const cpuMs = () => {
    const f = fs.readFileSync(`/proc/${pid}/stat`, 'utf8').replace(/^.*\) /, '').split(' ');
    return ((Number(f[11]) + Number(f[12])) * 1000) / 100; // clock ticks of 1/100 s (USER_HZ)
  };

  async function signIn(email: string): Promise<string> {
    const res = await fetch(`${url}/api/auth/sign-in/email`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', Origin: url },
      body: JSON.stringify({ email, password: demoPassword }),
    });
    if (!res.ok) throw new Error(`sign-in of ${email}: ${res.status}`);
    return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  }
  const byRole = (role: string) => demoUsers.find((u) => u.role === role)!.email;
  const cookies = { planner: await signIn(byRole('planner')), surveyor: await signIn(byRole('surveyor')), pilot: await signIn(byRole('pilot')) };
  const get = async (cookie: string, p: string) => {
    const r = await fetch(url + p, { headers: { Cookie: cookie, Origin: url } });
    if (!r.ok) throw new Error(`GET ${p}: ${r.status}`);
    return r.json();
  };
  const post = async (cookie: string, p: string, body: unknown = {}) => {
    const r = await fetch(url + p, { method: 'POST', headers: { Cookie: cookie, Origin: url, 'Content-Type': 'application/json' }, body: JSON.stringify(body) });
    if (!r.ok) throw new Error(`POST ${p}: ${r.status} ${await r.text()}`);
    return r.json();
  };

  const me = await get(cookies.planner, '/api/me');
  const teamId: string = me.teams[0].id;
  const projects = await get(cookies.planner, `/api/teams/${teamId}/projects`);
  const projectId: string = projects.projects[0].id;
  const plans = await get(cookies.planner, `/api/teams/${teamId}/projects/${projectId}/plans`);
  // The demo holds a draft plan and a signed-off one; the pilot reads signed-off versions only, so the draft (the
  // larger, the reads the issue measured) is sent through review first, with the reasons its unmet requirements need.
  const planId: string = plans.plans.find((p: { name: string }) => p.name === demoProject.planName)?.id ?? plans.plans[0].id;
  const versions = await get(cookies.planner, `/api/teams/${teamId}/plans/${planId}/versions`);
  const versionId: string = versions.versions[0].id;
  const versionPath = `/api/teams/${teamId}/plans/${planId}/versions/${versionId}`;
  const review = await get(cookies.surveyor, `${versionPath}/review`);
  if (review.reviewState !== 'signed_off') {
    if (review.reviewState !== 'in_review') await post(cookies.planner, `${versionPath}/submit`);
    const unmet = (await get(cookies.surveyor, `${versionPath}/review`)).unmet as Array<{ key: string }>;
    await post(cookies.surveyor, `${versionPath}/sign-off`, { reasons: unmet.map((u) => ({ key: u.key, reason: 'Benchmark run: signed off to measure the pilot\'s reads.' })) });
  }

  const mix = [
    { cookie: cookies.planner, path: `/api/teams/${teamId}/projects` },
    // the results screen's reads: the version with its result's overview, then the chosen line with its stations
    { cookie: cookies.surveyor, path: `/api/teams/${teamId}/plans/${planId}/versions/${versionId}?part=overview` },
    { cookie: cookies.surveyor, path: `/api/teams/${teamId}/plans/${planId}/versions/${versionId}/lines/0` },
    { cookie: cookies.pilot, path: `/api/teams/${teamId}/flights/${versionId}/leg-sheet` },
  ];
  /** The mix starting at read `i mod 4`, so that the connections' first reads are spread over the four. */
  const rotated = (i: number) => mix.map((_, k) => mix[(i + k) % mix.length]);
  // Bytes on the wire (compressed, as a browser receives them) and the unloaded latency of each read, one at a time.
  const sizes: number[] = [];
  const single: number[] = [];
  for (const m of mix) {
    const wire = await new Promise<number>((resolve, reject) =>
      http.get(url + m.path, { headers: { Cookie: m.cookie, 'Accept-Encoding': 'gzip, br' } }, (res) => {
        let n = 0;
        res.on('data', (c: Buffer) => (n += c.byteLength));
        res.on('end', () => resolve(n));
      }).on('error', reject),
    );
    sizes.push(wire);
    const times: number[] = [];
    for (let i = 0; i < 30; i++) {
      const t = performance.now();
      await (await fetch(url + m.path, { headers: { Cookie: m.cookie } })).arrayBuffer();
      times.push(performance.now() - t);
    }
    times.sort((a, b) => a - b);
    single.push(times[15]);
  }

  async function measure(label: string): Promise<{ p50: number; p95: number; p99: number; rps: number; errors: number; rssMiB: number }> {
    const rssBefore = rssMiB();
    const cpuBefore = cpuMs();
    const loadBefore = os.loadavg()[0];
    let rssPeak = rssBefore;
    const probe = setInterval(() => (rssPeak = Math.max(rssPeak, rssMiB())), 250);
    // An open arrival model at `rate` requests/s spread evenly over each second. autocannon limits a rate per
    // connection with a one-second timer per connection; the timers of one run start in the same millisecond, so
    // with 200 connections at 1 request/s each, all 200 requests leave together once a second (a 200-request burst,
    // not 200 requests/s). One autocannon run per connection, started 1000/connections ms apart, spreads them.
    // Latencies are recorded raw, each answer once: autocannon's coordinated-omission correction takes
    // ceil(1 / rate) = 1 ms as the expected interval of a 1-request/s connection and would record a 198 ms answer as
    // 198 answers of 198, 197 … 1 ms; no answer here comes near the true interval of 1 s, so there is nothing to correct.
    const conns = Math.min(connections, rate);
    const perConn = Math.floor(rate / conns);
    const extra = rate - perConn * conns;
    const latencies: number[] = [];
    let errors = 0;
    const runs: Array<Promise<unknown>> = [];
    for (let i = 0; i < conns; i++) {
      if (i > 0) await new Promise((r) => setTimeout(r, 1000 / conns));
      const opts = {
        url,
        connections: 1,
        connectionRate: perConn + (i < extra ? 1 : 0),
        ignoreCoordinatedOmission: true,
        duration: seconds,
        requests: rotated(i).map((m) => ({ method: 'GET' as const, path: m.path, headers: { Cookie: m.cookie, 'Accept-Encoding': 'gzip, br' } })),
      };
      runs.push(new Promise<void>((resolve, reject) => {
        const instance = autocannon(opts, (err, r) => {
          if (err) return reject(err);
          errors += r.errors + r.timeouts;
          resolve();
        });
        instance.on('response', (_client, statusCode, _bytes, ms) => {
          if (statusCode >= 200 && statusCode < 300) latencies.push(ms);
          else errors++;
        });
      }));
    }
    await Promise.all(runs);
    clearInterval(probe);
    latencies.sort((a, b) => a - b);
    const pct = (q: number) => Math.round(latencies[Math.min(latencies.length - 1, Math.floor(q * latencies.length))] ?? NaN);
    const out = { p50: pct(0.5), p95: pct(0.95), p99: pct(0.99), rps: latencies.length / seconds, // each connection's window is `seconds` long (the windows start up to 1 s apart)
      errors, rssMiB: rssPeak };
    console.log(`${label}: ${out.rps.toFixed(0)} req/s, p50 ${out.p50} ms, p95 ${out.p95} ms, p99 ${out.p99} ms, errors ${errors}, RSS ${rssBefore.toFixed(0)} → peak ${rssPeak.toFixed(0)} MiB`);
    // What the server spent per answered request, and how busy the machine was besides (other processes share it).
    const served = latencies.length + errors || 1;
    console.log(`  server CPU ${((cpuMs() - cpuBefore) / served).toFixed(2)} ms per request (all threads); machine load average ${loadBefore.toFixed(1)} → ${os.loadavg()[0].toFixed(1)} on ${os.cpus().length} cores`);
    return out;
  }

  console.log(`bench:api on ${os.cpus().length} cores (${os.cpus()[0]?.model ?? 'unknown cpu'}), Node ${process.version}`);
  console.log(`read mix: ${mix.map((m, i) => `${m.path.replace(/[0-9a-f-]{36}/g, ':id')} (${(sizes[i] / 1024).toFixed(1)} KiB on the wire)`).join(', ')}`);
  console.log(`one at a time (median of 30): ${mix.map((m, i) => `${single[i].toFixed(1)} ms`).join(', ')}`);
  console.log(`load: ${connections} connections, ${rate} requests/s overall, ${seconds} s per phase`);
  await measure('warm-up');
  const alone = await measure('reads alone');

  // Analyses beside the reads: keep one run queued or running for the whole phase.
  let analysing = true;
  let runs = 0;
  const keepAnalysing = (async () => {
    while (analysing) {
      const v = await post(cookies.planner, `/api/teams/${teamId}/plans/${planId}/runs`);
      runs++;
      for (;;) {
        const s = await get(cookies.planner, `/api/teams/${teamId}/plans/${planId}/versions/${v.id}/status`);
        if (s.analysisState === 'done' || s.analysisState === 'failed' || !analysing) break;
        await new Promise((r) => setTimeout(r, 200));
      }
    }
  })();
  await new Promise((r) => setTimeout(r, 500));
  const busy = await measure('reads during analyses');
  analysing = false;
  await keepAnalysing;
  console.log(`analyses run during the phase: ${runs}`);

  console.log(`ratio p95-alone-vs-target = ${(alone.p95 / 50).toFixed(2)} (target ≤ 1.0: p95 ${alone.p95} ms vs 50 ms at ${rate} req/s)`);
  console.log(`ratio p95-busy-vs-target = ${(busy.p95 / 100).toFixed(2)} (target ≤ 1.0: p95 ${busy.p95} ms vs 100 ms during analyses)`);
  console.log(`ratio rss-busy-vs-alone = ${(busy.rssMiB / alone.rssMiB).toFixed(2)} (memory flat: ≤ 1.25)`);
} finally {
  await cleanUp();
}
process.exit(0);

/**
 * `npm test`: the same set-up as start (a fresh test database per run, migrated and seeded; web build when stale),
 * then every vitest suite: unit, API over real HTTP against the real database, and browser tests.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { createDb } from '../db/client';
import { migrateDb } from '../db/migrate';
import { createAuth } from '../server/auth/auth';
import { buildConfig, parseEnv } from '../server/config';
import { demoProjectStep } from '../server/seed/demo-project';
import { seedDemo } from '../server/seed/seed';
import { createStorageFromConfig } from '../server/storage/storage.service';
import { artifactsDir, projectRoot } from './lib/paths';
import { createRunDatabase, startCluster } from './lib/postgres';
import { ensureWebBuild } from './lib/web-build';

function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return pid !== process.pid;
  } catch {
    return false;
  }
}

// The suites of one run share a storage folder of their own (so any worker can read any suite's grid), removed
// with the run's database; folders of runs that died are cleared. Test servers queue analyses but do not work
// them unless a suite asks for workers (WORKERS=1 in its server env).
const testDataDir = path.join(projectRoot, '.test-data');
for (const d of fs.existsSync(testDataDir) ? fs.readdirSync(testDataDir) : []) {
  const pid = Number(/^storage-(\d+)$/.exec(d)?.[1]);
  if (pid && !processAlive(pid)) fs.rmSync(path.join(testDataDir, d), { recursive: true, force: true });
}
const storageDir = path.join(testDataDir, `storage-${process.pid}`);
process.env.STORAGE_DIR ??= storageDir;
process.env.WORKERS ??= '0';
// Suites run side by side and beside other work on the machine: their analyses keep normal priority, so a busy
// machine cannot starve them past their time limits (the priority is about sharing with API reads: bench:api).
process.env.ANALYSIS_NICE ??= '0';
// The whole tree type-checks first (strict TypeScript): a type error fails the run before any suite starts.
if (process.env.LOFTLINE_SKIP_TYPECHECK !== '1') {
  const tc = spawnSync('npx', ['tsc', '--noEmit', '-p', '.'], { cwd: projectRoot, stdio: 'inherit' });
  if (tc.status !== 0) {
    console.error('loftline: type check failed (npx tsc --noEmit)');
    process.exit(1);
  }
  console.log('loftline: type check passed');
}

const env = parseEnv(process.env);
const pgPort = Number(process.env.LOFTLINE_PG_PORT ?? 54329);
const t0 = Date.now();

let databaseUrl = process.env.LOFTLINE_TEST_DATABASE_URL;
const cluster = databaseUrl ? null : await startCluster({ port: pgPort, databases: [], fast: true });
// Each run gets its own database, so parallel runs (and a running `npm start`) never disturb each other.
const runDb = cluster ? await createRunDatabase(cluster, 'loftline_test') : null;
if (cluster && runDb) databaseUrl = cluster.url(runDb.name);
const db = createDb(databaseUrl!);
await migrateDb(db);
const config = buildConfig(env, { databaseUrl: databaseUrl!, authSecret: 'Xq7v2LmPz9RtY4wKc8NbF3hJd6SgA1eU0oIyTnMrWqE', webDist: null });
await seedDemo({ db, auth: createAuth({ db, config }), steps: [demoProjectStep({ storage: createStorageFromConfig(config) })] });
await db.$client.end();

// LOFTLINE_SKIP_WEB=1 runs the suites without (re)building the web app, for quick server-only iterations.
const webDist = process.env.LOFTLINE_SKIP_WEB === '1' ? '' : await ensureWebBuild();
console.log(`loftline: test set-up done in ${((Date.now() - t0) / 1000).toFixed(1)} s`);

fs.mkdirSync(artifactsDir, { recursive: true });
const report = path.join(artifactsDir, 'vitest.json');
fs.rmSync(report, { force: true });
const timedReport = path.join(artifactsDir, 'vitest-timed.json');
fs.rmSync(timedReport, { force: true });
const extra = process.argv.slice(2);
const isTimed = (a: string) => /\.timed\.test\.ts$/.test(a);
const runVitest = (out: string, args: string[], env: Record<string, string>) =>
  spawnSync('npx', ['vitest', 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${out}`, ...args], {
    cwd: projectRoot,
    stdio: 'inherit',
    env: { ...process.env, LOFTLINE_TEST_DATABASE_URL: databaseUrl, LOFTLINE_WEB_DIST: webDist, NODE_ENV: 'test', ...env },
  });
// Every suite in parallel, then the timed suites alone on a quiet machine (see vitest.config.mts).
const mainArgs = extra.filter((a) => !isTimed(a));
const r = extra.length > 0 && mainArgs.length === 0 ? { status: 0 } : runVitest(report, mainArgs, {});
const timedArgs = extra.filter(isTimed);
const rt = extra.length === 0 || timedArgs.length > 0 ? runVitest(timedReport, timedArgs, { LOFTLINE_TIMED: '1' }) : { status: 0 };
await runDb?.drop().catch(() => undefined);
fs.rmSync(storageDir, { recursive: true, force: true });
cluster?.stop();

const totals = { passed: 0, failed: 0, pending: 0, total: 0 };
for (const file of [report, timedReport].filter((f) => fs.existsSync(f))) {
  const j = JSON.parse(fs.readFileSync(file, 'utf8'));
  totals.passed += j.numPassedTests;
  totals.failed += j.numFailedTests;
  totals.pending += j.numPendingTests;
  totals.total += j.numTotalTests;
}
// A plain closing line that any CI reader understands.
console.log(`${totals.passed} passed, ${totals.failed} failed${totals.pending ? `, ${totals.pending} skipped` : ''}`);
if (totals.total === 0) {
  console.error('loftline: no test ran');
  process.exit(1);
}
process.exit(r.status !== 0 ? (r.status ?? 1) : (rt.status ?? 1));

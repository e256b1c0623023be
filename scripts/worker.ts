/**
 * `npm run worker`: an analysis worker process without the web server. Run as many as the machine (or several
 * machines on one database and storage) allows; each takes queued analyses one at a time (WORKERS per process,
 * at least 1). Without DATABASE_URL it uses the same project-local PostgreSQL as `npm start`.
 */
import { createDb } from '../db/client';
import { migrateDb } from '../db/migrate';
import { createAuth } from '../server/auth/auth';
import { buildConfig, parseEnv } from '../server/config';
import { createServices } from '../server/services';
import { localAuthSecret } from './lib/secrets';

const env = parseEnv(process.env);
const pgPort = Number(process.env.LOFTLINE_PG_PORT ?? 54329);
const log = (m: string) => console.log(`loftline worker ${process.pid}: ${m}`);

let stopCluster = () => {};
let databaseUrl = env.DATABASE_URL;
if (!databaseUrl) {
  const { startCluster } = await import('./lib/postgres');
  const cluster = await startCluster({ port: pgPort, databases: ['loftline'] });
  databaseUrl = cluster.url('loftline');
  stopCluster = () => cluster.stop();
}
const config = buildConfig(env, { databaseUrl, authSecret: env.AUTH_SECRET ?? localAuthSecret(), webDist: null });
const db = createDb(databaseUrl, { max: 4 });
await migrateDb(db);
const count = Math.max(1, env.WORKERS);
// the same services as the server's, less mail and the orphan sweep (the server does those)
const { services, close: closeServices } = await createServices(
  { db, auth: createAuth({ db, config }), config },
  { workers: count, log, queueError: (err) => log(`queue error: ${(err as Error)?.message ?? err}`) },
);
const { jobs } = services;
log(`ready: ${count} worker${count > 1 ? 's' : ''} on queue ${jobs.queues.analysis}`);

let stopping = false;
async function stop() {
  if (stopping) return;
  stopping = true;
  log('stopping');
  await closeServices();
  await db.$client.end().catch(() => undefined);
  stopCluster();
  process.exit(0);
}
process.on('SIGINT', stop);
process.on('SIGTERM', stop);

/** `npm start`: database, migrations, demo seed, web build, then the app and API on one port. */
import { bootServer } from '../server/boot';
import { buildConfig, parseEnv } from '../server/config';
import { demoUsers } from '../contracts/demo-team';
import { demoPassword } from '../server/seed/demo-password';
import { demoProjectStep } from '../server/seed/demo-project';
import { seedDemo } from '../server/seed/seed';
import { startCluster } from './lib/postgres';
import { localAuthSecret } from './lib/secrets';
import { ensureWebBuild } from './lib/web-build';

const env = parseEnv(process.env);
const pgPort = Number(process.env.LOFTLINE_PG_PORT ?? 54329);

const cluster = env.DATABASE_URL ? null : await startCluster({ port: pgPort, databases: ['loftline'] });
const databaseUrl = env.DATABASE_URL ?? cluster!.url('loftline');
const webDist = await ensureWebBuild();
const config = buildConfig(env, { databaseUrl, authSecret: localAuthSecret(), webDist });
const srv = await bootServer(config);
const seeded = await seedDemo({ db: srv.db, auth: srv.auth, steps: [demoProjectStep({ storage: srv.services.storage })] });

console.log(`\nLoftline is running at ${config.publicUrl}`);
console.log(seeded.created ? 'Demo team seeded. Demo accounts:' : 'Demo accounts:');
for (const u of demoUsers) console.log(`  ${u.role.padEnd(9)} ${u.email}  password: ${demoPassword}`);
console.log('Press Ctrl+C to stop.\n');

let stopping = false;
async function stop() {
  if (stopping) return;
  stopping = true;
  await srv.close().catch(() => undefined);
  cluster?.stop();
  process.exit(0);
}
process.on('SIGINT', stop);
process.on('SIGTERM', stop);

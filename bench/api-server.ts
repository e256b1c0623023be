/**
 * The server under load for `npm run bench:api`: a real Loftline server in its own process (so the load generator
 * never shares its event loop), on the bench database that bench/api.ts prepared. Prints its URL when listening.
 */
import { bootServer } from '../server/boot';
import { buildConfig, parseEnv } from '../server/config';

const env = parseEnv(process.env);
const config = buildConfig(env, {
  databaseUrl: process.env.DATABASE_URL!,
  authSecret: 'bench-secret-0123456789-abcdefghijklmnopqrstuvwxyz',
  webDist: process.env.LOFTLINE_WEB_DIST || null,
});
const srv = await bootServer(config, { migrate: false });
process.stdout.write(`LISTENING ${srv.url}\n`);
const stop = async () => {
  await srv.close().catch(() => undefined);
  process.exit(0);
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);

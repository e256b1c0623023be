/**
 * A Loftline server as its own process, for tests that kill one with SIGKILL: run with node --import tsx and the
 * test database in LOFTLINE_TEST_DATABASE_URL; it prints "ready <url>" once it listens. PORT must be set.
 */
import { bootServer } from '../../server/boot';
import { buildConfig, parseEnv } from '../../server/config';
import { testAuthSecret } from './test-server';

const port = Number(process.env.PORT);
const env = parseEnv({ ...process.env, HOST: '127.0.0.1', PUBLIC_URL: `http://127.0.0.1:${port}` });
const config = buildConfig(env, { databaseUrl: process.env.LOFTLINE_TEST_DATABASE_URL!, authSecret: testAuthSecret, webDist: null, port });
const srv = await bootServer(config, { migrate: false });
console.log(`ready ${srv.url}`);

/** A real Loftline server for one test file: the test database that `npm test` prepared, a free loopback port. */
import net from 'node:net';
import { bootServer, type RunningServer } from '../../server/boot';
import { buildConfig, parseEnv } from '../../server/config';

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

/** The auth secret of every test server, so a session made through one is valid on another (child processes too). */
export const testAuthSecret = 'Xq7v2LmPz9RtY4wKc8NbF3hJd6SgA1eU0oIyTnMrWqE';

export interface TestServer extends RunningServer {
  stop: () => Promise<void>;
}

/** Boot a server on the test database (or `databaseUrl`, e.g. through a proxy); `env` overrides variables (e.g. a low sign-in limit). */
export async function startTestServer(opts: { env?: Record<string, string>; web?: boolean; databaseUrl?: string } = {}): Promise<TestServer> {
  const databaseUrl = opts.databaseUrl ?? process.env.LOFTLINE_TEST_DATABASE_URL;
  if (!databaseUrl) throw new Error('LOFTLINE_TEST_DATABASE_URL is not set: run the suites through `npm test`.');
  // freePort() closes the port it found before the server listens on it; a suite running beside this one can take
  // it in between, so a taken port is tried again with another
  for (let attempt = 1; ; attempt++) {
    const port = await freePort();
    // A mail queue of its own unless told otherwise, so each server's fake SMTP receives the mail it queued.
    const env = parseEnv({ AUTH_SIGNIN_PER_MINUTE: '1000', MAIL_QUEUE: `mail-test-${process.pid}-${port}`, ...process.env, ...opts.env, PORT: String(port), HOST: '127.0.0.1', PUBLIC_URL: `http://127.0.0.1:${port}` });
    const webDist = opts.web === false ? null : (process.env.LOFTLINE_WEB_DIST ?? null);
    const config = buildConfig(env, { databaseUrl, authSecret: testAuthSecret, webDist, port });
    try {
      const srv = await bootServer(config, { migrate: false });
      return { ...srv, stop: srv.close };
    } catch (err) {
      if (attempt < 5 && (err as NodeJS.ErrnoException).code === 'EADDRINUSE') continue;
      throw err;
    }
  }
}

/** Start one API server: open the database, migrate, build auth and the app, listen. */
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { createDb, type Db } from '../db/client';
import { migrateDb } from '../db/migrate';
import { createApp, type AppDeps } from './app';
import { createAuth, type Auth } from './auth/auth';
import type { Config } from './config';
import { routeGroups } from './routes';
import { serviceFactories, type Services } from './services';
import { endOpenStreams } from './http/open-streams';

export interface RunningServer {
  url: string;
  db: Db;
  auth: Auth;
  server: Server;
  services: Services;
  api: ReturnType<typeof createApp>['api'];
  close: () => Promise<void>;
}

/** `services: false` skips the service factories (pure auth/team tests); `extraRoutes` adds test-only groups. */
export async function bootServer(
  config: Config,
  opts: { migrate?: boolean; extraRoutes?: AppDeps['routes']; factories?: typeof serviceFactories } = {},
): Promise<RunningServer> {
  const db = createDb(config.databaseUrl);
  if (opts.migrate !== false) await migrateDb(db);
  const auth = createAuth({ db, config });
  const services: Services = { db, auth, config };
  const cleanups: Array<() => Promise<void>> = [];
  for (const factory of opts.factories ?? serviceFactories) {
    const cleanup = await factory(services);
    if (cleanup) cleanups.push(cleanup);
  }
  const { app, api } = createApp({ db, auth, config, services, routes: [...routeGroups, ...(opts.extraRoutes ?? [])] });
  let server: Server;
  try {
    server = await new Promise<Server>((resolve, reject) => {
      const s = app.listen(config.port, config.host, (err?: Error) => (err ? reject(err) : resolve(s)));
    });
  } catch (err) {
    // the port was taken: stop what started, so a caller may try another port without leaks
    for (const cleanup of cleanups.reverse()) await cleanup().catch(() => undefined);
    await db.$client.end().catch(() => undefined);
    throw err;
  }
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://${config.host}:${port}`,
    db,
    auth,
    server,
    services,
    api,
    close: async () => {
      endOpenStreams(services);
      await new Promise<void>((r) => server.close(() => r()));
      server.closeAllConnections?.();
      for (const cleanup of cleanups.reverse()) await cleanup().catch(() => undefined);
      await db.$client.end();
    },
  };
}

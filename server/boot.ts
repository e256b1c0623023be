/** Start one API server: open the database, migrate, build auth and the app, listen. */
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { createDb, type Db } from '../db/client';
import { migrateDb } from '../db/migrate';
import { createApp, type AppDeps } from './app';
import { createAuth, type Auth } from './auth/auth';
import type { Config } from './config';
import { routeGroups } from './routes';
import { createServices, type Services } from './services';
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

/** `extraRoutes` adds test-only groups. */
export async function bootServer(config: Config, opts: { migrate?: boolean; extraRoutes?: AppDeps['routes'] } = {}): Promise<RunningServer> {
  const db = createDb(config.databaseUrl);
  if (opts.migrate !== false) await migrateDb(db);
  const auth = createAuth({ db, config });
  const quiet = config.env.NODE_ENV === 'test';
  const { services, close: closeServices } = await createServices(
    { db, auth, config },
    { workers: config.env.WORKERS, mail: true, orphanSweep: true, log: quiet ? undefined : (m: string) => console.log(`loftline worker: ${m}`) },
  );
  const { app, api } = createApp({ db, auth, config, services, routes: [...routeGroups, ...(opts.extraRoutes ?? [])] });
  let server: Server;
  try {
    server = await new Promise<Server>((resolve, reject) => {
      const s = app.listen(config.port, config.host, (err?: Error) => (err ? reject(err) : resolve(s)));
    });
  } catch (err) {
    // the port was taken: stop what started, so a caller may try another port without leaks
    await closeServices();
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
      endOpenStreams(services.openStreams);
      await new Promise<void>((r) => server.close(() => r()));
      server.closeAllConnections?.();
      await closeServices();
      await db.$client.end();
    },
  };
}

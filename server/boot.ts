/** Start one API server: open the database, migrate, build auth and the app, listen. */
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { createDb, type Db } from '../db/client';
import { migrateDb } from '../db/migrate';
import { createApp, type AppDeps } from './app';
import { createAuth, type Auth } from './auth/auth';
import type { Config } from './config';

export interface RunningServer {
  url: string;
  db: Db;
  auth: Auth;
  server: Server;
  api: ReturnType<typeof createApp>['api'];
  close: () => Promise<void>;
}

export async function bootServer(config: Config, opts: { migrate?: boolean; routes?: AppDeps['routes'] } = {}): Promise<RunningServer> {
  const db = createDb(config.databaseUrl);
  if (opts.migrate !== false) await migrateDb(db);
  const auth = createAuth({ db, config });
  const { app, api } = createApp({ db, auth, config, routes: opts.routes });
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.port, config.host, (err?: Error) => (err ? reject(err) : resolve(s)));
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://${config.host}:${port}`,
    db,
    auth,
    server,
    api,
    close: async () => {
      await new Promise<void>((r) => server.close(() => r()));
      server.closeAllConnections?.();
      await db.$client.end();
    },
  };
}

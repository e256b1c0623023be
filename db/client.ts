/** The one database handle: a node-postgres pool wrapped by Drizzle with the full schema. */
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema';

export type Db = NodePgDatabase<typeof schema> & { $client: pg.Pool };

/** Open a pool on `url`; close it with `db.$client.end()`. */
export function createDb(url: string, opts: { max?: number } = {}): Db {
  const pool = new pg.Pool({ connectionString: url, max: opts.max ?? 10 });
  // An idle client losing its connection (database restarted) must not crash the process; the next query reconnects.
  pool.on('error', (err) => console.error(`database connection lost: ${err.message}`));
  return drizzle(pool, { schema }) as Db;
}

export { schema };

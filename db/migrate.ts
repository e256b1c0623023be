/** Apply the committed drizzle-kit migrations. */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import type { Db } from './client';

const migrationsFolder = path.join(path.dirname(fileURLToPath(import.meta.url)), 'migrations');

/** Bring the database schema up to date; safe to call on every start. */
export async function migrateDb(db: Db): Promise<void> {
  await migrate(db, { migrationsFolder });
}

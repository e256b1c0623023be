import { defineConfig } from 'drizzle-kit';

// Migrations are generated offline from the schema and applied at start-up by db/migrate.ts.
export default defineConfig({
  dialect: 'postgresql',
  schema: './db/schema/index.ts',
  out: './db/migrations',
});

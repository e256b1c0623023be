/** GET /api/health: ok only when the database answers. */
import { sql } from 'drizzle-orm';
import type { Router } from 'express';
import { healthSchema } from '../../contracts/teams';
import type { Db } from '../../db/client';
import { DATABASE_RETRY_AFTER_S } from '../http/errors';
import { healthErrors } from './health.errors';
import type { Guards } from '../http/guard';
import { sendJson } from '../http/validate';

export function registerHealthRoutes(api: Router, deps: { guards: Guards; db: Db }) {
  api.get('/health', deps.guards.public(), async (_req, res) => {
    try {
      await deps.db.execute(sql`select 1`);
    } catch {
      res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_S));
      throw healthErrors.db_down();
    }
    sendJson(res, healthSchema, { ok: true, db: 'up' });
  });
}

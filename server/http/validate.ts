/** zod at the boundary: parse what comes in, check what goes out. */
import type { Response } from 'express';
import type { z } from 'zod';
import { fromZod } from './errors';

/** Parse `data` with `schema` or throw a 422 listing each field. */
export function parseInput<S extends z.ZodType>(schema: S, data: unknown): z.infer<S> {
  const r = schema.safeParse(data);
  if (!r.success) throw fromZod(r.error);
  return r.data;
}

/** Send `data` after checking it against its response schema (a mismatch is a server bug: 500). */
export function sendJson<S extends z.ZodType>(res: Response, schema: S, data: z.input<S>, status = 200): void {
  const r = schema.safeParse(data);
  if (!r.success) throw new Error(`Response does not match its schema: ${r.error.message}`);
  res.status(status).json(r.data);
}

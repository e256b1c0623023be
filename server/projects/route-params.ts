/** Ids from the URL: anything that is not a UUID cannot name a row, so it is a 404 rather than a database error. */
import type { Request } from 'express';
import { z } from 'zod';
import { errors } from '../http/errors';

const uuid = z.string().uuid();

/** The UUID in `req.params[name]`, or a 404 naming `what`. */
export function idParam(req: Request, name: string, what: string): string {
  const v = req.params[name];
  if (!uuid.safeParse(v).success) throw errors.notFound(what);
  return v as string;
}

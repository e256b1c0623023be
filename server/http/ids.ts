/** Ids from the URL: anything that is not a UUID cannot name a row, so it is a 404 rather than a database cast error. */
import type { Request } from 'express';
import { errors } from './errors';

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Whether `s` is a UUID (the form of every row id in a URL). */
export function isUuid(s: unknown): s is string {
  return typeof s === 'string' && uuidPattern.test(s);
}

/** The UUID in `req.params[name]`, or a 404 naming `what`. */
export function idParam(req: Request, name: string, what: string): string {
  const v = req.params[name];
  if (!isUuid(v)) throw errors.not_found(what);
  return v;
}

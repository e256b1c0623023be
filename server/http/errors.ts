/** API errors as data, and the one middleware that turns any failure into the JSON error body. */
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import type { ApiErrorBody } from '../../contracts/errors';

/** An error the client is meant to see: status, stable code, message for a person. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: { path: string; message: string }[],
  ) {
    super(message);
  }
}

export const errors = {
  unauthenticated: () => new AppError(401, 'unauthenticated', 'Sign in to continue.'),
  forbidden: (what = 'do this') => new AppError(403, 'forbidden', `Your role in this team does not allow you to ${what}.`),
  notFound: (what = 'That item') => new AppError(404, 'not_found', `${what} was not found.`),
  conflict: (message: string) => new AppError(409, 'conflict', message),
  invalid: (message: string, fields?: { path: string; message: string }[]) => new AppError(422, 'invalid', message, fields),
};

/** Field-by-field 422 from a zod failure. */
export function fromZod(err: ZodError): AppError {
  const fields = err.issues.map((i) => ({ path: i.path.join('.') || '(body)', message: i.message }));
  const first = fields[0];
  return new AppError(422, 'invalid', first ? `${first.path}: ${first.message}` : 'The request is not valid.', fields);
}

/** 404 for any /api path no route answered. */
export const apiNotFound: RequestHandler = (req) => {
  throw new AppError(404, 'not_found', `No API route ${req.method} ${req.path}.`);
};

/** node-postgres errors, wherever Drizzle wrapped them (DrizzleQueryError keeps the driver's error as `cause`). */
function pgErrorOf(err: unknown): { code?: string; message?: string } | null {
  for (let e = err as { code?: unknown; message?: unknown; cause?: unknown } | undefined, depth = 0; e && depth < 4; e = e.cause as typeof e, depth++) {
    if (typeof e.code === 'string' || /Connection terminated|connect ECONNREFUSED|timeout exceeded when trying to connect|Client has encountered a connection error/i.test(String(e.message ?? ''))) {
      return { code: typeof e.code === 'string' ? e.code : undefined, message: String(e.message ?? '') };
    }
  }
  return null;
}

/**
 * Whether `err` means the database cannot be reached right now (down, restarting, refusing connections):
 * SQLSTATE classes 08 (connection exception) and 57P (operator intervention), and the socket errors of a
 * server that is not listening.
 */
export function isDatabaseUnavailable(err: unknown): boolean {
  const pgErr = pgErrorOf(err);
  if (!pgErr) return false;
  const { code = '', message = '' } = pgErr;
  return /^08/.test(code) || /^57P0[1-3]$/.test(code) || ['ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', 'ENOTFOUND'].includes(code) ||
    /Connection terminated|connect ECONNREFUSED|timeout exceeded when trying to connect|Client has encountered a connection error/i.test(message);
}

/** Seconds a client should wait before trying again while the database is unavailable. */
export const DATABASE_RETRY_AFTER_S = 5;

/** Last middleware: JSON error body; unexpected errors are logged and answered with no detail. */
export function errorMiddleware(log: (err: unknown) => void = console.error): ErrorRequestHandler {
  return (err, _req, res, _next) => {
    let e: AppError;
    if (err instanceof AppError) e = err;
    else if (err instanceof ZodError) e = fromZod(err);
    else if (err?.type === 'entity.parse.failed') e = new AppError(400, 'malformed_json', 'The request body is not valid JSON.');
    else if (err?.type === 'entity.too.large') e = new AppError(413, 'too_large', 'The request body is too large.');
    else if (err?.code === 'LIMIT_FILE_SIZE') e = new AppError(413, 'too_large', err.message ?? 'The file is too large.');
    else if (typeof err?.status === 'number' && err.status >= 400 && err.status < 500 && err.expose) {
      e = new AppError(err.status, 'bad_request', String(err.message));
    } else if (isDatabaseUnavailable(err)) {
      // nothing to fix in the request: the pool reconnects on its own once the database is back
      res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_S));
      e = new AppError(503, 'db_unavailable', `The database is not answering; nothing was changed. Try again in ${DATABASE_RETRY_AFTER_S} seconds.`);
    } else if (['22021', '22P05'].includes(pgErrorOf(err)?.code ?? '')) {
      // a NUL or an invalid byte sequence that got past the text checks: the text is at fault, not the server
      e = new AppError(422, 'invalid', 'The request holds a character the database cannot store (such as NUL, U+0000); remove it and send again.');
    } else {
      log(err);
      e = new AppError(500, 'internal', 'Something went wrong on the server. Nothing you saved was lost; try again.');
    }
    const body: ApiErrorBody = { error: { code: e.code, message: e.message, ...(e.fields ? { fields: e.fields } : {}) } };
    if (res.headersSent) return;
    res.status(e.status).json(body);
  };
}

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
    } else {
      log(err);
      e = new AppError(500, 'internal', 'Something went wrong on the server. Nothing you saved was lost; try again.');
    }
    const body: ApiErrorBody = { error: { code: e.code, message: e.message, ...(e.fields ? { fields: e.fields } : {}) } };
    if (res.headersSent) return;
    res.status(e.status).json(body);
  };
}

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

/** Field problems of a 422: dotted path -> message. */
export type FieldProblem = { path: string; message: string };

/**
 * One declared error: its HTTP status and the template of its message (the template's parameters are what a
 * thrower passes); `fields` gives a 422's field problems from the same parameters.
 */
export interface ErrorDeclaration<A extends unknown[] = never[]> {
  status: number;
  message: (...args: A) => string;
  fields?: (...args: A) => FieldProblem[] | undefined;
}

// `any[]`, not `unknown[]`: a declaration's own parameter list must fit where the table is typed
type AnyDeclaration = ErrorDeclaration<any[]>;

/** One factory per declared code: call it with the template's parameters to get the AppError to throw. */
type ErrorFactories<T extends Record<string, AnyDeclaration>> = {
  readonly [K in keyof T]: (...args: Parameters<T[K]['message']>) => AppError;
};

/**
 * A domain's error codes as data: code -> status and message template. Each code is declared once in server/
 * (tests/architecture/error-codes.test.ts checks it, and that every declared code is used), so the same code
 * always answers with the same status.
 */
export function defineErrors<T extends Record<string, AnyDeclaration>>(_domain: string, table: T): ErrorFactories<T> {
  const out: Record<string, (...args: unknown[]) => AppError> = {};
  for (const [code, d] of Object.entries(table)) out[code] = (...args) => new AppError(d.status, code, d.message(...args), d.fields?.(...args));
  return out as ErrorFactories<T>;
}

/** The codes any route may answer with: sign-in, roles, missing things, bad requests and server trouble. */
export const errors = defineErrors('http', {
  unauthenticated: { status: 401, message: () => 'Sign in to continue.' },
  forbidden: { status: 403, message: (what = 'do this') => `Your role in this team does not allow you to ${what}.` },
  cross_origin: { status: 403, message: (why: string) => `${why} Loftline accepts changes only from its own pages; open Loftline at its own address and try again.` },
  /** `what` was not found; `sentence` replaces the whole message where a bare "not found" would not say why. */
  not_found: { status: 404, message: (what = 'That item', sentence?: string) => sentence ?? `${what} was not found.` },
  invalid: { status: 422, message: (message: string, _fields?: FieldProblem[]) => message, fields: (_message: string, fields?: FieldProblem[]) => fields },
  malformed_json: { status: 400, message: () => 'The request body is not valid JSON.' },
  /** Any other client error express reports (see the middleware: it keeps the library's 4xx status). */
  bad_request: { status: 400, message: (message: string) => message },
  too_large: { status: 413, message: (message = 'The request body is too large.') => message },
  unsupported_media_type: { status: 415, message: (message = 'Send the request body as JSON (Content-Type: application/json).') => message },
  db_unavailable: { status: 503, message: (retryAfterS: number) => `The database is not answering; nothing was changed. Try again in ${retryAfterS} seconds.` },
  internal: { status: 500, message: () => 'Something went wrong on the server. Nothing you saved was lost; try again.' },
});

/** Field-by-field 422 from a zod failure. */
export function fromZod(err: ZodError): AppError {
  const fields = err.issues.map((i) => ({ path: i.path.join('.') || '(body)', message: i.message }));
  const first = fields[0];
  return errors.invalid(first ? `${first.path}: ${first.message}` : 'The request is not valid.', fields);
}

/** 404 for any /api path no route answered. */
export const apiNotFound: RequestHandler = (req) => {
  throw errors.not_found(undefined, `No API route ${req.method} ${req.path}.`);
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
function isDatabaseUnavailable(err: unknown): boolean {
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
    else if (err?.type === 'entity.parse.failed') e = errors.malformed_json();
    else if (err?.type === 'entity.too.large') e = errors.too_large();
    else if (err?.code === 'LIMIT_FILE_SIZE') e = errors.too_large(err.message ?? 'The file is too large.');
    else if (typeof err?.status === 'number' && err.status >= 400 && err.status < 500 && err.expose) {
      // express's other client errors: declared as 400, but one the library answers with another 4xx (415 for
      // an unknown charset, say) keeps that status, as it always has
      const declared = errors.bad_request(String(err.message));
      e = err.status === declared.status ? declared : new AppError(err.status, declared.code, declared.message);
    } else if (isDatabaseUnavailable(err)) {
      // nothing to fix in the request: the pool reconnects on its own once the database is back
      res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_S));
      e = errors.db_unavailable(DATABASE_RETRY_AFTER_S);
    } else if (['22021', '22P05'].includes(pgErrorOf(err)?.code ?? '')) {
      // a NUL or an invalid byte sequence that got past the text checks: the text is at fault, not the server
      e = errors.invalid('The request holds a character the database cannot store (such as NUL, U+0000); remove it and send again.');
    } else {
      log(err);
      e = errors.internal();
    }
    const body: ApiErrorBody = { error: { code: e.code, message: e.message, ...(e.fields ? { fields: e.fields } : {}) } };
    if (res.headersSent) return;
    res.status(e.status).json(body);
  };
}

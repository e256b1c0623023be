/** The client-side error for a failed API call, built from the server's JSON error body. */
import { apiErrorSchema } from '../../contracts/errors';

type FieldProblem = { path: string; message: string };

/** An API failure with the HTTP status, the server's code and message, and field problems for validation errors. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: FieldProblem[];

  constructor(status: number, code: string, message: string, fields: FieldProblem[] = []) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.fields = fields;
  }

  /** True when the server said there is no session (the user must sign in again). */
  get isUnauthenticated(): boolean {
    return this.status === 401;
  }
}

/** Status 0 stands for "no HTTP answer at all" (offline, server down, blocked). */
export const networkErrorStatus = 0;

/**
 * Turns a failed response's status and parsed body into an ApiError. A body in the shared error shape keeps the
 * server's message word for word; anything else (a proxy's HTML page, an empty body) gets a plain message.
 */
export function apiErrorFrom(status: number, body: unknown): ApiError {
  const parsed = apiErrorSchema.safeParse(body);
  if (parsed.success) {
    const { code, message, fields } = parsed.data.error;
    return new ApiError(status, code, message, fields ?? []);
  }
  return new ApiError(status, 'unexpected_response', `The server answered with status ${status} and no readable error.`);
}

/** Whether an error is worth retrying automatically: network failures and 5xx, never a 4xx refusal. */
export function isRetryable(error: unknown): boolean {
  if (!(error instanceof ApiError)) return false;
  return error.status === networkErrorStatus || error.status >= 500;
}

/** The message to show for any thrown value, preferring the server's own words. */
export function errorMessage(error: unknown): string {
  if (error instanceof Error && error.message) return error.message;
  return 'Something went wrong. Try again.';
}

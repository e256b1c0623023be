/** The one fetch wrapper: same-origin JSON requests with the session cookie, answers checked by a zod schema. */
import type { z } from 'zod';
import { ApiError, apiErrorFrom, networkErrorStatus } from './api-error';

type ApiRequest<S extends z.ZodType | undefined> = {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  body?: unknown;
  /** Schema the JSON answer must satisfy; without one the answer is ignored (e.g. 204 No Content). */
  schema?: S;
  signal?: AbortSignal;
};

type Result<S> = S extends z.ZodType ? z.infer<S> : void;

/** Calls `path` (starting with /api) and returns the parsed answer, or throws an ApiError. */
export async function apiFetch<S extends z.ZodType | undefined = undefined>(path: string, request: ApiRequest<S> = {}): Promise<Result<S>> {
  const { method = 'GET', body, schema, signal } = request;
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';

  let response: Response;
  try {
    response = await fetch(path, {
      method,
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
      credentials: 'include',
      signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(networkErrorStatus, 'network', 'Could not reach the Loftline server. Check the connection and try again.');
  }

  const text = await response.text();
  let json: unknown = undefined;
  if (text) {
    try {
      json = JSON.parse(text);
    } catch {
      json = undefined;
    }
  }
  if (!response.ok) throw apiErrorFrom(response.status, json);
  if (!schema) return undefined as Result<S>;

  const parsed = schema.safeParse(json);
  if (!parsed.success) {
    // A shape mismatch means client and server disagree about a contract: say so rather than render garbage.
    throw new ApiError(response.status, 'contract_mismatch', `The server's answer to ${method} ${path} did not match the expected shape.`);
  }
  return parsed.data as Result<S>;
}

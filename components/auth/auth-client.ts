/** The better-auth client for the same-origin server (auth is mounted at /api/auth). */
import { createAuthClient } from 'better-auth/react';

/** The page's own origin: the app is always served by the server that hosts the API. */
function sameOrigin(): string {
  if (typeof window !== 'undefined' && window.location?.origin) return window.location.origin;
  // Only reached while bundling or pre-rendering, where no request is ever made.
  return 'http://127.0.0.1:8080';
}

export const authClient = createAuthClient({ baseURL: sameOrigin(), basePath: '/api/auth' });

/** What a failed better-auth call gives back, reduced to what the forms show. */
export type AuthFailure = { message: string; status: number };

/** Turns a better-auth `{ error }` into a message shown word for word (the server never hints whether an e-mail exists). */
export function authFailureFrom(error: { message?: string; status?: number; statusText?: string } | null | undefined): AuthFailure | null {
  if (!error) return null;
  const status = error.status ?? 0;
  if (status === 429) return { status, message: error.message || 'Too many attempts. Wait a minute and try again.' };
  if (status === 0) return { status, message: 'Could not reach the Loftline server. Check the connection and try again.' };
  return { status, message: error.message || error.statusText || 'The server refused the request.' };
}

/**
 * Sign-in, sign-up and sign-out against the server's better-auth endpoints (mounted at /api/auth), called with plain
 * same-origin fetches. better-auth's own browser client brings about 18 KB gzipped of code (its fetch wrapper, store
 * and plugin plumbing) for the three calls the sign-in screen makes, and the first screen has a size budget
 * (tests/support/web-budget.ts); the session itself is the cookie better-auth sets, read back through /api/me.
 * Endpoint paths and bodies as better-auth 1.x documents them: POST /sign-in/email {email, password},
 * POST /sign-up/email {name, email, password}, POST /sign-out; errors answer {code, message} with a 4xx status.
 */

/** What a call gives back: nothing, or better-auth's refusal with its status (0 when the server was not reached). */
type AuthResult = { error: { message?: string; status: number; statusText?: string } | null };

async function authPost(path: string, body: Record<string, string> = {}): Promise<AuthResult> {
  let response: Response;
  try {
    response = await fetch(`/api/auth${path}`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', Accept: 'application/json' },
      body: JSON.stringify(body),
      credentials: 'include',
    });
  } catch {
    return { error: { status: 0 } };
  }
  if (response.ok) return { error: null };
  let message: string | undefined;
  try {
    const json = (await response.json()) as { message?: unknown };
    if (typeof json?.message === 'string') message = json.message;
  } catch {
    message = undefined;
  }
  return { error: { message, status: response.status, statusText: response.statusText } };
}

export const authClient = {
  signIn: { email: (v: { email: string; password: string }) => authPost('/sign-in/email', v) },
  signUp: { email: (v: { name: string; email: string; password: string }) => authPost('/sign-up/email', v) },
  signOut: () => authPost('/sign-out'),
};

/** What a failed call gives back, reduced to what the forms show. */
type AuthFailure = { message: string; status: number };

/** Turns a refusal into a message shown word for word (the server never hints whether an e-mail exists). */
export function authFailureFrom(error: AuthResult['error'] | undefined): AuthFailure | null {
  if (!error) return null;
  const status = error.status ?? 0;
  if (status === 429) return { status, message: error.message || 'Too many attempts. Wait a minute and try again.' };
  if (status === 0) return { status, message: 'Could not reach the Loftline server. Check the connection and try again.' };
  return { status, message: error.message || error.statusText || 'The server refused the request.' };
}

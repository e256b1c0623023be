/**
 * better-auth over HTTP, behind three rules of Loftline's own:
 * - its organization endpoints are closed: teams, members and invitations are served by /api/teams, which applies
 *   Loftline's roles (a pilot may not list members or their e-mail addresses) and keeps the audit trail;
 * - a session token never appears in a JSON body (sign-in answers `token`, get-session `session.token`): the
 *   HttpOnly cookie is the only carrier, so script on a page cannot read it;
 * - failed sign-ins are also counted per account (e-mail address), so spreading guesses over many addresses
 *   or sockets cannot try one account's password without bound.
 */
import { toNodeHandler } from 'better-auth/node';
import type { AppError } from '../http/errors';
import type { Auth } from './auth';
import { authErrors } from './auth.errors';

const closedPrefix = '/api/auth/organization';

/** Fixed-window counter of failed sign-ins per lower-cased e-mail. */
function failureCounter(limit: number, windowMs: number) {
  const windows = new Map<string, { startMs: number; count: number }>();
  const live = (key: string, now: number) => {
    const w = windows.get(key);
    if (w && now - w.startMs < windowMs) return w;
    windows.delete(key);
    return null;
  };
  return {
    /** Seconds until the account may try again, or null if it may try now. */
    blockedFor(key: string, now = Date.now()): number | null {
      const w = live(key, now);
      return w && w.count >= limit ? Math.ceil((w.startMs + windowMs - now) / 1000) : null;
    },
    fail(key: string, now = Date.now()) {
      const w = live(key, now);
      if (w) w.count++;
      else windows.set(key, { startMs: now, count: 1 });
      // Bound the memory an address-spraying client can take: drop expired windows now and then.
      if (windows.size > 10_000) for (const [k, v] of windows) if (now - v.startMs >= windowMs) windows.delete(k);
    },
  };
}

/** Remove every `token` member from a JSON value (sessions listed by list-sessions carry one each). */
function withoutTokens(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(withoutTokens);
  if (value && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value as Record<string, unknown>).filter(([k]) => k !== 'token').map(([k, v]) => [k, withoutTokens(v)]));
  }
  return value;
}

async function stripTokens(res: Response): Promise<Response> {
  if (!(res.headers.get('content-type') ?? '').includes('application/json')) return res;
  const text = await res.text();
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    return new Response(text, { status: res.status, statusText: res.statusText, headers: res.headers });
  }
  const headers = new Headers(res.headers);
  headers.delete('content-length');
  return new Response(JSON.stringify(withoutTokens(body)), { status: res.status, statusText: res.statusText, headers });
}

const jsonError = (e: AppError, extra: Record<string, string> = {}) =>
  new Response(JSON.stringify({ code: e.code, message: e.message }), { status: e.status, headers: { 'content-type': 'application/json', ...extra } });

/** The Node handler to mount on /api/auth/{*any}. */
export function authHttpHandler(auth: Auth, opts: { failuresPerAccount: number; windowS: number }) {
  const failures = failureCounter(opts.failuresPerAccount, opts.windowS * 1000);
  return toNodeHandler(async (request: Request) => {
    const url = new URL(request.url);
    if (url.pathname === closedPrefix || url.pathname.startsWith(`${closedPrefix}/`)) {
      return jsonError(authErrors.NOT_FOUND());
    }
    let account: string | null = null;
    if (request.method === 'POST' && url.pathname === '/api/auth/sign-in/email') {
      const body = (await request
        .clone()
        .json()
        .catch(() => null)) as { email?: unknown } | null;
      if (typeof body?.email === 'string') account = body.email.trim().toLowerCase();
      const wait = account ? failures.blockedFor(account) : null;
      if (wait !== null) {
        return jsonError(authErrors.TOO_MANY_REQUESTS(wait), { 'retry-after': String(wait) });
      }
    }
    const res = await auth.handler(request);
    if (account && res.status === 401) failures.fail(account);
    return stripTokens(res);
  });
}

/**
 * Sessions looked up in the last few seconds, keyed by the request's cookie header. Every guarded read used to ask
 * the database for the session and its user; under load that lookup was the largest cost of a small read. A
 * session is reused for at most `ttlMs` (and never past its own expiry); signing out empties the cache for that
 * cookie at once, so only a session revoked some other way (e.g. expired in the database) can outlive its end,
 * by at most `ttlMs`. Team membership and role are still read on every request.
 */
import type { RequestAuth } from './request-auth';

export interface SessionCache {
  get(cookie: string | undefined): RequestAuth | undefined;
  /** Call before looking a session up; pass it to `set` so a lookup that overlapped a sign-out is not kept. */
  ticket(): number;
  set(cookie: string | undefined, value: RequestAuth, sessionExpiresAtMs: number, ticket?: number): void;
  /** Forget the session of this cookie header (sign-out) or, without one, every session. */
  forget(cookie?: string): void;
}

/** The session token cookie's value in a Cookie header. Sign-out sends only that cookie, while reads may carry others: key by it. */
export function sessionTokenOf(cookie: string | undefined): string | undefined {
  return /(?:^|;\s*)((?:__Secure-)?better-auth\.session_token)=([^;]+)/.exec(cookie ?? '')?.[2];
}

export function createSessionCache(opts: { ttlMs?: number; maxEntries?: number; now?: () => number } = {}): SessionCache {
  const ttlMs = opts.ttlMs ?? 10_000;
  const maxEntries = opts.maxEntries ?? 10_000;
  const now = opts.now ?? Date.now;
  const entries = new Map<string, { value: RequestAuth; untilMs: number }>();
  let generation = 0;
  const keyOf = sessionTokenOf;
  return {
    get(cookie) {
      const key = keyOf(cookie);
      if (!key) return undefined;
      const e = entries.get(key);
      if (!e) return undefined;
      if (e.untilMs <= now()) {
        entries.delete(key);
        return undefined;
      }
      return e.value;
    },
    ticket: () => generation,
    set(cookie, value, sessionExpiresAtMs, ticket) {
      const key = keyOf(cookie);
      if (!key || (ticket !== undefined && ticket !== generation)) return;
      if (entries.size >= maxEntries) entries.delete(entries.keys().next().value!);
      entries.set(key, { value, untilMs: Math.min(now() + ttlMs, sessionExpiresAtMs) });
    },
    forget(cookie) {
      generation++;
      if (cookie === undefined) entries.clear();
      else {
        const key = keyOf(cookie);
        if (key) entries.delete(key);
      }
    },
  };
}

/**
 * Sessions looked up in the last few seconds, keyed by the request's cookie header. Every guarded read used to ask
 * the database for the session and its user; under load that lookup was the largest cost of a small read. A
 * session is reused for at most `ttlMs` (and never past its own expiry); signing out empties the cache for that
 * cookie at once, so only a session revoked some other way (e.g. expired in the database) can outlive its end,
 * by at most `ttlMs`. Team membership and role are still read on every request.
 */
import type { RequestAuth } from './guard';

export interface SessionCache {
  get(cookie: string | undefined): RequestAuth | undefined;
  set(cookie: string | undefined, value: RequestAuth, sessionExpiresAtMs: number): void;
  /** Forget the session of this cookie header (sign-out) or, without one, every session. */
  forget(cookie?: string): void;
}

export function createSessionCache(opts: { ttlMs?: number; maxEntries?: number; now?: () => number } = {}): SessionCache {
  const ttlMs = opts.ttlMs ?? 10_000;
  const maxEntries = opts.maxEntries ?? 10_000;
  const now = opts.now ?? Date.now;
  const entries = new Map<string, { value: RequestAuth; untilMs: number }>();
  // Sign-out sends only the session token cookie, while reads may carry other cookies too: key by the token.
  const keyOf = (cookie: string | undefined) => /(?:^|;\s*)((?:__Secure-)?better-auth\.session_token)=([^;]+)/.exec(cookie ?? '')?.[2];
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
    set(cookie, value, sessionExpiresAtMs) {
      const key = keyOf(cookie);
      if (!key) return;
      if (entries.size >= maxEntries) entries.delete(entries.keys().next().value!);
      entries.set(key, { value, untilMs: Math.min(now() + ttlMs, sessionExpiresAtMs) });
    },
    forget(cookie) {
      if (cookie === undefined) entries.clear();
      else {
        const key = keyOf(cookie);
        if (key) entries.delete(key);
      }
    },
  };
}

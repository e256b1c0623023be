/**
 * Cross-site request refusal for state-changing API calls. A browser attaches the session cookie to a form or fetch
 * sent from any site, and form-encoded or multipart bodies need no CORS preflight, so the server itself checks where
 * the request comes from: the Origin header (Fetch standard; sent by browsers on every POST/PUT/PATCH/DELETE), else
 * the Referer's origin, else — for a request that carries a cookie — refusal. This is the "verifying origin with
 * standard headers" defence of the OWASP Cross-Site Request Forgery Prevention Cheat Sheet.
 */
import type { RequestHandler } from 'express';
import { errors } from './errors';

const stateChanging = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/** The public origin plus its loopback twin (127.0.0.1 <-> localhost), so either spelling is accepted. */
export function trustedOriginsOf(publicUrl: string): string[] {
  const u = new URL(publicUrl);
  const out = [u.origin];
  if (u.hostname === '127.0.0.1') out.push(u.origin.replace('127.0.0.1', 'localhost'));
  if (u.hostname === 'localhost') out.push(u.origin.replace('localhost', '127.0.0.1'));
  return out;
}

function originOfUrl(url: string): string | null {
  try {
    return new URL(url).origin;
  } catch {
    return null;
  }
}

const refused = (why: string) => errors.cross_origin(why);

/** Middleware: 403 for a state-changing request from another site (or of unknown origin while carrying a cookie). */
export function requireSameOrigin(trusted: string[]): RequestHandler {
  const allowed = new Set(trusted);
  return (req, _res, next) => {
    if (!stateChanging.has(req.method)) return next();
    const origin = req.headers.origin;
    if (origin !== undefined) {
      // "null" is what sandboxed frames, file: pages and some redirects send: never one of ours.
      if (!allowed.has(origin)) return next(refused(`This request came from another site (${origin.slice(0, 100)}).`));
      return next();
    }
    const referer = req.headers.referer;
    if (referer !== undefined) {
      const from = originOfUrl(referer);
      if (!from || !allowed.has(from)) return next(refused('This request came from another site (by its Referer).'));
      return next();
    }
    // Neither header: a command-line client without cookies is fine (it has no session to misuse); a cookie-bearing
    // request without them is not what a browser on our pages sends.
    if (req.headers.cookie) return next(refused('This request does not say which site sent it (no Origin or Referer header).'));
    next();
  };
}

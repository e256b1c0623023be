/**
 * Security headers on every answer, through helmet: a Content-Security-Policy the Expo web build runs under, no
 * framing (frame-ancestors 'none', X-Frame-Options), X-Content-Type-Options nosniff, Referrer-Policy same-origin, and
 * Strict-Transport-Security only when the public address is https (on plain http it would only confuse browsers).
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { RequestHandler } from 'express';
import helmet from 'helmet';

/**
 * sha256 sources of the inline <script> blocks in the web build's HTML files (the static export writes a small
 * hydration flag inline), so script-src can allow exactly those and no other inline script (CSP level 3 hashes).
 */
export function inlineScriptHashes(webDist: string | null): string[] {
  if (!webDist || !fs.existsSync(webDist)) return [];
  const hashes = new Set<string>();
  const html = fs.readdirSync(webDist, { recursive: true, withFileTypes: true }).filter((e) => e.isFile() && e.name.endsWith('.html'));
  for (const f of html) {
    const text = fs.readFileSync(path.join(f.parentPath, f.name), 'utf8');
    for (const m of text.matchAll(/<script(?![^>]*\bsrc=)[^>]*>([\s\S]*?)<\/script>/gi)) {
      if (m[1].length > 0) hashes.add(`'sha256-${crypto.createHash('sha256').update(m[1], 'utf8').digest('base64')}'`);
    }
  }
  return [...hashes];
}

export function securityHeaders(opts: { publicUrl: string; webDist: string | null }): RequestHandler {
  const https = new URL(opts.publicUrl).protocol === 'https:';
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        // 'wasm-unsafe-eval': the charts' Skia (CanvasKit) is WebAssembly; it allows compiling wasm, not eval().
        scriptSrc: ["'self'", "'wasm-unsafe-eval'", ...inlineScriptHashes(opts.webDist)],
        // react-native-web writes its styles as inline style attributes and a generated <style> element.
        styleSrc: ["'self'", "'unsafe-inline'"],
        imgSrc: ["'self'", 'data:', 'blob:'],
        fontSrc: ["'self'", 'data:'],
        connectSrc: ["'self'"],
        workerSrc: ["'self'", 'blob:'],
        objectSrc: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
        ...(https ? { upgradeInsecureRequests: [] } : {}),
      },
    },
    strictTransportSecurity: https ? { maxAge: 180 * 24 * 60 * 60, includeSubDomains: true } : false,
    referrerPolicy: { policy: 'same-origin' },
    xFrameOptions: { action: 'deny' },
    crossOriginEmbedderPolicy: false,
  });
}

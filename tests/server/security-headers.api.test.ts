import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import express from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inlineScriptHashes, securityHeaders } from '../../server/http/security-headers';
import { startTestServer, type TestServer } from '../support/test-server';

let srv: TestServer;
beforeAll(async () => {
  srv = await startTestServer({ web: false });
});
afterAll(async () => srv?.stop());

/** The CSP directives as a map from name to sources. */
function csp(header: string | null): Record<string, string[]> {
  return Object.fromEntries((header ?? '').split(';').map((d) => d.trim().split(/\s+/)).filter((d) => d[0]).map(([k, ...v]) => [k, v]));
}

describe('security headers', () => {
  it('are on API answers and errors: CSP with no framing, nosniff, same-origin referrer, no HSTS over http', async () => {
    for (const p of ['/api/health', '/api/no-such-route']) {
      const res = await fetch(srv.url + p);
      const policy = csp(res.headers.get('content-security-policy'));
      expect(policy['default-src']).toEqual(["'self'"]);
      expect(policy['frame-ancestors']).toEqual(["'none'"]);
      expect(policy['object-src']).toEqual(["'none'"]);
      expect(policy['script-src']).not.toContain("'unsafe-inline'");
      expect(policy['upgrade-insecure-requests']).toBeUndefined();
      expect(res.headers.get('x-content-type-options')).toBe('nosniff');
      expect(res.headers.get('x-frame-options')).toBe('DENY');
      expect(res.headers.get('referrer-policy')).toBe('same-origin');
      expect(res.headers.get('strict-transport-security')).toBeNull();
      expect(res.headers.get('x-powered-by')).toBeNull();
    }
  });

  it('add HSTS (and upgrade-insecure-requests) only when the public address is https', async () => {
    const app = express();
    app.use(securityHeaders({ publicUrl: 'https://loftline.example', webDist: null }));
    app.get('/', (_req, res) => res.send('ok'));
    const server = app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    try {
      const res = await fetch(`http://127.0.0.1:${(server.address() as { port: number }).port}/`);
      expect(res.headers.get('strict-transport-security')).toMatch(/^max-age=\d{7,}; includeSubDomains$/);
      expect(csp(res.headers.get('content-security-policy'))['upgrade-insecure-requests']).toEqual([]);
    } finally {
      server.close();
    }
  });

  it("allow exactly the web build's inline scripts by their sha256 hash", () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-csp-'));
    try {
      const inline = 'globalThis.__flag = true;';
      fs.mkdirSync(path.join(dir, 'plans'));
      fs.writeFileSync(path.join(dir, 'index.html'), `<html><head><script src="/a.js" defer></script><script>${inline}</script></head></html>`);
      fs.writeFileSync(path.join(dir, 'plans', 'x.html'), `<script type="module">${inline}</script>`);
      // The hash of the script text as CSP level 3 defines it (base64 of sha256 over the UTF-8 text), by node:crypto.
      const want = `'sha256-${crypto.createHash('sha256').update(inline).digest('base64')}'`;
      expect(inlineScriptHashes(dir)).toEqual([want]);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});

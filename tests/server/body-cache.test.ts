import zlib from 'node:zlib';
import type { Request, Response } from 'express';
import { describe, expect, it } from 'vitest';
import { createBodyCache } from '../../server/http/body-cache';

/** The least of an Express request/response pair that the cache touches, recording what was sent. */
function exchange(headers: Record<string, string> = {}) {
  const sent: { status?: number; headers: Record<string, string>; body?: Buffer } = { headers: {} };
  const res = {
    setHeader: (k: string, v: string) => (sent.headers[k.toLowerCase()] = v),
    status: (s: number) => {
      sent.status = s;
      return res;
    },
    end: (b?: Buffer) => (sent.body = b),
  };
  return { req: { headers } as unknown as Request, res: res as unknown as Response, sent };
}

describe('body cache', () => {
  it('builds a body once, answers gzip to clients that take it and plain JSON to others, with one strong ETag', async () => {
    const cache = createBodyCache();
    let builds = 0;
    const build = async () => {
      builds++;
      return { lines: Array.from({ length: 200 }, (_, i) => ({ i, gsdCm: 2.5 })) };
    };
    const a = exchange({ 'accept-encoding': 'gzip, br' });
    const b = exchange();
    await Promise.all([cache.send(a.req, a.res, 'k', build), cache.send(b.req, b.res, 'k', build)]);
    expect(builds).toBe(1);
    expect(a.sent.headers['content-encoding']).toBe('gzip');
    expect(b.sent.headers['content-encoding']).toBeUndefined();
    expect(JSON.parse(zlib.gunzipSync(a.sent.body!).toString())).toEqual(JSON.parse(b.sent.body!.toString()));
    expect(a.sent.headers.etag).toMatch(/^"[\w-]+"$/);
    expect(a.sent.headers.etag).toBe(b.sent.headers.etag);
  });

  it('answers 304 with no body when the client sends the current ETag (weak or strong form)', async () => {
    const cache = createBodyCache();
    const first = exchange();
    await cache.send(first.req, first.res, 'k', async () => ({ a: 1 }));
    for (const tag of [first.sent.headers.etag, `W/${first.sent.headers.etag}`, `"other", ${first.sent.headers.etag}`]) {
      const again = exchange({ 'if-none-match': tag });
      await cache.send(again.req, again.res, 'k', async () => ({ a: 2 }));
      expect(again.sent.status).toBe(304);
      expect(again.sent.body).toBeUndefined();
    }
    const stale = exchange({ 'if-none-match': '"nope"' });
    await cache.send(stale.req, stale.res, 'k', async () => ({ a: 2 }));
    expect(stale.sent.status).toBe(200);
    expect(JSON.parse(stale.sent.body!.toString())).toEqual({ a: 1 });
  });

  it('does not keep a failed build, so the next reader builds again', async () => {
    const cache = createBodyCache();
    const x = exchange();
    await expect(cache.send(x.req, x.res, 'k', async () => Promise.reject(new Error('not yet')))).rejects.toThrow('not yet');
    const y = exchange();
    await cache.send(y.req, y.res, 'k', async () => ({ ok: true }));
    expect(JSON.parse(y.sent.body!.toString())).toEqual({ ok: true });
  });

  it('stays under its byte bound, dropping the least recently used body first', async () => {
    const cache = createBodyCache({ maxBytes: 40_000 });
    // random digits compress poorly, so each entry holds about 2 x 6 KB
    const body = (seed: number) => async () => ({ s: Array.from({ length: 1000 }, (_, i) => ((seed * 7919 + i * 104729) % 1_000_003).toString(36)).join('') });
    const builds = new Map<string, number>();
    const counted = (k: string, seed: number) => async () => {
      builds.set(k, (builds.get(k) ?? 0) + 1);
      return body(seed)();
    };
    for (let i = 0; i < 10; i++) {
      const e = exchange();
      await cache.send(e.req, e.res, `k${i}`, counted(`k${i}`, i));
      const keep = exchange(); // k0 is read after every insert: the most recent, never dropped
      await cache.send(keep.req, keep.res, 'k0', counted('k0', 0));
      expect(cache.bytes()).toBeLessThanOrEqual(40_000);
    }
    expect(builds.get('k0')).toBe(1);
    const old = exchange();
    await cache.send(old.req, old.res, 'k1', counted('k1', 1));
    expect(builds.get('k1')).toBe(2); // dropped and rebuilt
  });
});

/**
 * Serialized answers of reads whose content only changes with a known stamp (an analysed plan version, a leg sheet):
 * built once, kept as JSON and gzip bytes in a byte-bounded LRU, answered with a strong ETag and 304 when the client
 * already has it. Serializing and compressing a 400 KB result for every reader is what made reads slow under load;
 * the access check still runs on every request, only the body is reused.
 */
import { createHash } from 'node:crypto';
import { promisify } from 'node:util';
import zlib from 'node:zlib';
import type { Request, Response } from 'express';

const gzip = promisify(zlib.gzip);

interface Entry {
  etag: string;
  json: Buffer;
  gzip: Buffer;
}

export interface BodyCache {
  /**
   * Answer `req` with the body under `key`, building it with `build` (once, even for concurrent readers) when
   * absent. `key` must change whenever the body would; `cacheControl` is the Cache-Control header to send.
   */
  send(req: Request, res: Response, key: string, build: () => Promise<unknown>, cacheControl?: string): Promise<void>;
  /** Bytes held now (JSON plus gzip), for tests and the benchmark. */
  bytes(): number;
  clear(): void;
}

/** A cache holding at most `maxBytes` of bodies (default 64 MiB), least recently used dropped first. */
export function createBodyCache(opts: { maxBytes?: number } = {}): BodyCache {
  const maxBytes = opts.maxBytes ?? 64 * 1024 * 1024;
  const entries = new Map<string, Entry>(); // insertion order = recency order (re-inserted on every hit)
  const pending = new Map<string, Promise<Entry>>();
  let held = 0;

  const size = (e: Entry) => e.json.byteLength + e.gzip.byteLength;

  function remember(key: string, e: Entry) {
    if (size(e) > maxBytes / 4) return; // one huge body must not flush everything else
    entries.set(key, e);
    held += size(e);
    for (const [k, old] of entries) {
      if (held <= maxBytes) break;
      entries.delete(k);
      held -= size(old);
    }
  }

  async function entryFor(key: string, build: () => Promise<unknown>): Promise<Entry> {
    const hit = entries.get(key);
    if (hit) {
      entries.delete(key);
      entries.set(key, hit);
      return hit;
    }
    const inFlight = pending.get(key);
    if (inFlight) return inFlight;
    const p = (async () => {
      const json = Buffer.from(JSON.stringify(await build()));
      const e: Entry = { etag: `"${createHash('sha1').update(json).digest('base64url')}"`, json, gzip: await gzip(json, { level: 6 }) };
      remember(key, e);
      return e;
    })();
    pending.set(key, p);
    try {
      return await p;
    } finally {
      pending.delete(key);
    }
  }

  return {
    async send(req, res, key, build, cacheControl = 'private, no-cache') {
      const e = await entryFor(key, build);
      res.setHeader('ETag', e.etag);
      res.setHeader('Cache-Control', cacheControl);
      res.setHeader('Vary', 'Accept-Encoding, Cookie');
      const tags = String(req.headers['if-none-match'] ?? '').split(',').map((t) => t.trim().replace(/^W\//, ''));
      if (tags.includes(e.etag)) {
        res.status(304).end();
        return;
      }
      res.setHeader('Content-Type', 'application/json; charset=utf-8');
      if (/\bgzip\b/.test(String(req.headers['accept-encoding'] ?? ''))) {
        res.setHeader('Content-Encoding', 'gzip');
        res.status(200).end(e.gzip);
      } else {
        res.status(200).end(e.json);
      }
    },
    bytes: () => held,
    clear: () => {
      entries.clear();
      held = 0;
    },
  };
}

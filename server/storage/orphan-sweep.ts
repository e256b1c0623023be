/**
 * Crash debris in storage: partial writes (`.part` files) and a site's stored objects whose row was never
 * inserted (the process died while the upload was being checked). Swept at start and then periodically; only
 * what is older than a grace period goes, so an upload still being checked is never touched.
 */
import { inArray } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { planVersion, site } from '../../db/schema';
import { versionObjectKey } from '../coverage/coverage-keys';
import type { Config } from '../config';
import type { Storage } from './storage';

/** `teams/<team>/sites/<site id>/<object>`: the keys of a site's objects (sites.usecases.ts siteKeys). */
const siteObjectKey = /^teams\/[^/]+\/sites\/([0-9a-f-]{36})\/[^/]+$/;

/** What one sweep removed. */
interface SweepResult {
  partial: string[];
  orphans: string[];
}

/**
 * Remove partial writes, site objects without a site row and version files (coverage rasters and images)
 * without a version row (its plan was deleted), older than `graceMs`.
 */
export async function sweepOrphans(deps: { storage: Storage; db: Db; graceMs: number }): Promise<SweepResult> {
  const { storage, db, graceMs } = deps;
  const partial = await storage.sweepPartial(graceMs);
  const bySite = new Map<string, string[]>();
  const byVersion = new Map<string, string[]>();
  for (const key of await storage.list('teams/')) {
    const m = siteObjectKey.exec(key);
    if (m) bySite.set(m[1], [...(bySite.get(m[1]) ?? []), key]);
    const v = versionObjectKey.exec(key);
    if (v) byVersion.set(v[1], [...(byVersion.get(v[1]) ?? []), key]);
  }
  const known = new Set<string>();
  const siteIds = [...bySite.keys()];
  for (let i = 0; i < siteIds.length; i += 500) {
    const rows = await db.select({ id: site.id }).from(site).where(inArray(site.id, siteIds.slice(i, i + 500)));
    for (const r of rows) known.add(r.id);
  }
  const versionIds = [...byVersion.keys()];
  for (let i = 0; i < versionIds.length; i += 500) {
    const rows = await db.select({ id: planVersion.id }).from(planVersion).where(inArray(planVersion.id, versionIds.slice(i, i + 500)));
    for (const r of rows) known.add(r.id);
  }
  const orphans: string[] = [];
  for (const [id, keys] of [...bySite, ...byVersion]) {
    if (known.has(id)) continue;
    for (const key of keys) {
      const at = await storage.modifiedAt(key);
      if (at && Date.now() - at.getTime() > graceMs) {
        await storage.delete(key);
        orphans.push(key);
      }
    }
  }
  return { partial, orphans };
}

/** A sweep at start (in the background) and then every ORPHAN_SWEEP_MINUTES; returns the stop. */
export function startOrphanSweep(opts: { db: Db; storage: Storage; config: Pick<Config, 'env'> }): () => Promise<void> {
  const { ORPHAN_GRACE_MINUTES, ORPHAN_SWEEP_MINUTES } = opts.config.env;
  const deps = { storage: opts.storage, db: opts.db, graceMs: ORPHAN_GRACE_MINUTES * 60_000 };
  const run = () =>
    sweepOrphans(deps).then(
      (r) => {
        if (r.partial.length || r.orphans.length) console.log(`loftline: removed ${r.partial.length} partial upload(s) and ${r.orphans.length} stored object(s) without a site`);
      },
      (err) => console.error('loftline: orphan sweep failed', err),
    );
  const first = run();
  const timer = setInterval(run, ORPHAN_SWEEP_MINUTES * 60_000);
  (timer as unknown as { unref?: () => void }).unref?.(); // the DOM typings (tsconfig lib) type timers as numbers
  return async () => {
    clearInterval(timer);
    await first;
  };
}

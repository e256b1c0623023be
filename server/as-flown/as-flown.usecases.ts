/**
 * Running an as-flown check: the version's grid and mission, the photo log, the terrain thread's document (with
 * the cautions), stored with who ran it. The photos themselves never reach the server, only their metadata.
 */
import { and, eq } from 'drizzle-orm';
import { asFlownDocSchema, type NewAsFlownCheck } from '../../contracts/as-flown';
import { generalCautions } from '../../contracts/cautions';
import type { Db } from '../../db/client';
import { site } from '../../db/schema';
import { TerrainError } from '../../terrain/errors';
import { TerrainTimeoutError, type TerrainRunner } from '../analysis/terrain-pool';
import { requireAnalysed } from '../versions/result-view';
import type { VersionRecord } from '../versions/versions.repository';
import { StorageNotFoundError, type Storage } from '../storage/storage';
import type { createAsFlownRepository } from './as-flown.repository';
import { terrainRefusal } from '../http/terrain.errors';
import { asFlownErrors } from './as-flown.errors';

export function createAsFlownUsecases(deps: { db: Db; storage: Storage; terrain: TerrainRunner; repo: ReturnType<typeof createAsFlownRepository> }) {
  const { db, storage, terrain, repo } = deps;
  return {
    /** Check `input` against version `v`; 409 before its analysis is done, 422 with the engine's reason when refused. */
    async check(v: VersionRecord, userId: string, input: NewAsFlownCheck): Promise<string> {
      requireAnalysed(v);
      const [s] = await db.select({ storageKey: site.storageKey, verticalDatum: site.verticalDatum }).from(site).where(and(eq(site.id, v.siteId), eq(site.teamId, v.teamId))).limit(1);
      if (!s) throw asFlownErrors.site_missing(false);
      let bytes: Buffer;
      try {
        bytes = await storage.getBytes(s.storageKey);
      } catch (err) {
        if (err instanceof StorageNotFoundError) throw asFlownErrors.site_missing(true);
        throw err;
      }
      let raw;
      try {
        raw = await terrain.asFlown(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength), v.input, input.photos, { siteVerticalDatum: s.verticalDatum });
      } catch (err) {
        if (err instanceof TerrainError) throw terrainRefusal(err, 'photos', `The photos cannot be checked: ${err.message}`);
        if (err instanceof TerrainTimeoutError) throw asFlownErrors.check_timeout(err.message);
        throw err;
      }
      const parsed = asFlownDocSchema.safeParse({ ...raw, cautions: [...generalCautions] });
      if (!parsed.success) throw new Error(`The as-flown check produced a document the server cannot store (${parsed.error.issues[0]?.path.join('.')}: ${parsed.error.issues[0]?.message}); this is a Loftline bug.`);
      return repo.insert({ teamId: v.teamId, planId: v.planId, versionId: v.id, userId, input, document: parsed.data });
    },
  };
}

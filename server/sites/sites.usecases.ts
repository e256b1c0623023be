/** Turning a received upload into a site (or a clear refusal that leaves nothing behind), and deleting sites. */
import type { Site } from '../../contracts/sites';
import { siteSchema, siteUploadFieldsSchema } from '../../contracts/sites';
import { TerrainError } from '../../terrain/errors';
import { TerrainTimeoutError, type TerrainRunner } from '../analysis/terrain-pool';
import { inspectDemHeader, type DemFile } from '../analysis/terrain-tasks';
import { errors, type AppError } from '../http/errors';
import { terrainRefusal } from '../http/terrain.errors';
import { siteErrors } from './sites.errors';
import { nulProblem } from '../http/text-guard';
import { parseInput } from '../http/validate';
import type { Storage } from '../storage/storage';
import type { ReceivedFile } from './site-upload';
import { toSite, type SitesRepository } from './sites.repository';

/** Storage keys of a site's objects. */
export const siteKeys = {
  dem: (teamId: string, siteId: string) => `teams/${teamId}/sites/${siteId}/dem.tif`,
  hillshade: (teamId: string, siteId: string) => `teams/${teamId}/sites/${siteId}/hillshade.png`,
};

/** The engine's reason as a 422 (error code = TerrainError code). */
function refusal(err: unknown): unknown {
  if (err instanceof TerrainError) return terrainRefusal(err, 'file');
  if (err instanceof TerrainTimeoutError) return siteErrors['too-slow'](err.limitMs);
  return err;
}

/** A file name safe to show and store: its last path part, control characters removed, at most 200 characters. */
function cleanFileName(name: string | undefined): string {
  const base = (name ?? '').split(/[\\/]/).pop() ?? '';
  return base.replace(/[\u0000-\u001f\u007f]/g, '').trim().slice(0, 200) || 'dem.tif';
}

/** A stored grid as the terrain tasks read it: a local file, a range source, or (a store with neither) its bytes. */
async function storedGrid(storage: Storage, key: string): Promise<DemFile> {
  const local = storage.localPath ? await storage.localPath(key) : null;
  if (local) return { path: local };
  if (storage.openRanges) return storage.openRanges(key);
  const bytes = await storage.getBytes(key);
  return new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}

type UploadOutcome = { site: Site } | { duplicateOf: string };

export function createSitesUsecases(deps: { sites: SitesRepository; storage: Storage; terrain: TerrainRunner; maxPixels?: number; log?: (err: unknown) => void }) {
  const { sites, storage, terrain, maxPixels } = deps;
  const log = deps.log ?? ((err: unknown) => console.error(err));

  return {
    /**
     * Check the fields, recognise a duplicate by checksum, let the terrain engine read the file (header first,
     * then the grid), store the hillshade and insert the row. Whatever fails, the stored objects are removed.
     */
    async finishUpload(ctx: { teamId: string; projectId: string; siteId: string; userId: string; file: ReceivedFile; body: unknown }): Promise<UploadOutcome> {
      const { teamId, projectId, siteId, file } = ctx;
      const leftovers = [file.storageKey];
      try {
        const nul = nulProblem(ctx.body);
        if (nul) throw nul;
        const fields = parseInput(siteUploadFieldsSchema, ctx.body);
        const dup = await sites.findBySha(teamId, projectId, file.sha256);
        if (dup) return { duplicateOf: dup.id };
        // the stored file is read by ranges (a local file through its handle, an object store by ranged GETs),
        // so checking a 512 MB grid never holds the whole file
        const grid = await storedGrid(storage, file.storageKey);
        const header = await inspectDemHeader(grid, { maxPixels }).catch((e) => { throw refusal(e); });
        const verticalDatum = fields.verticalDatum ?? header.declaredVerticalDatum?.name;
        if (!verticalDatum) {
          throw errors.invalid('State the vertical datum of the heights: the file does not declare one.', [
            { path: 'verticalDatum', message: 'The GeoTIFF declares no vertical datum; state it (for example "EGM96" or a national height datum).' },
          ]);
        }
        const inspection = await terrain.inspect(grid, { maxPixels }).catch((e) => { throw refusal(e); });
        const hillshadeKey = siteKeys.hillshade(teamId, siteId);
        leftovers.push(hillshadeKey);
        await storage.put(hillshadeKey, inspection.hillshade.png, { contentType: 'image/png' });
        const { png: _png, ...hillshade } = inspection.hillshade;
        const fileName = cleanFileName(file.originalname);
        const values = {
          id: siteId,
          teamId,
          projectId,
          name: fields.name ?? fileName.replace(/\.(tiff?|gtiff?)$/i, ''),
          fileName,
          storageKey: file.storageKey,
          sizeBytes: file.size,
          sha256: file.sha256,
          surfaceKind: fields.surfaceKind,
          verticalDatum,
          metadata: { ...inspection.metadata, file: header },
          hillshadeKey,
          hillshade,
          createdBy: ctx.userId,
        };
        // the record must read back as a site before it is kept: a figure the API cannot send (an infinite
        // bound, say) is refused now, instead of a saved site that fails every list
        const readBack = siteSchema.safeParse(toSite({ ...values, planCount: 0, createdAt: new Date() } as Parameters<typeof toSite>[0]));
        if (!readBack.success) {
          const where = readBack.error.issues[0]?.path.join('.') ?? 'metadata';
          throw siteErrors['unreadable-grid'](where);
        }
        const row = await sites.insert(values);
        if (!row) {
          // the same file arrived twice at once: the other upload won the unique index
          const other = await sites.findBySha(teamId, projectId, file.sha256);
          if (other) return { duplicateOf: other.id };
          throw new Error('Site insert conflicted but no site with that checksum exists.');
        }
        leftovers.length = 0;
        return { site: toSite(row) };
      } finally {
        for (const key of leftovers) await storage.delete(key).catch(log);
      }
    },

    /** Delete a site and its stored objects; refused while a plan or plan version uses it. */
    async remove(teamId: string, projectId: string, siteId: string): Promise<void> {
      const found = await sites.get(teamId, siteId, projectId);
      if (!found) throw errors.not_found('Site');
      const use = await sites.usage(teamId, siteId);
      if (use.plans > 0 || use.versions > 0) throw inUse(use.plans);
      let removed;
      try {
        removed = await sites.remove(teamId, siteId);
      } catch (err) {
        // a plan created between the check and the delete trips the foreign key
        if ((err as { cause?: { code?: string }; code?: string }).code === '23503' || (err as { cause?: { code?: string } }).cause?.code === '23503') throw inUse(1);
        throw err;
      }
      if (!removed) throw errors.not_found('Site');
      for (const key of [removed.storageKey, removed.hillshadeKey]) await storage.delete(key).catch(log);
    },
  };
}

function inUse(plans: number): AppError {
  return siteErrors.site_in_use(plans);
}

export type SitesUsecases = ReturnType<typeof createSitesUsecases>;

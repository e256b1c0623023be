/**
 * Analysing one plan version: claim it, read the part of its DEM the mission needs, run the terrain engine, store
 * the result once. Safe to run twice for the same version (a retried job): a version already done is left alone,
 * and only one finish can win.
 */
import { and, eq, inArray, ne, sql } from 'drizzle-orm';
import { planResultSchema } from '../../contracts/plan-result';
import type { Db } from '../../db/client';
import { auditEvent, planVersion, site } from '../../db/schema';
import { TerrainError } from '../../terrain/errors';
import { StorageNotFoundError, type Storage } from '../storage/storage';
import type { TerrainRunner } from './terrain-pool';
import type { CoverageFiles, DemFile } from './terrain-tasks';
import { storedCoverageSchema, type StoredCoverage } from '../../contracts/coverage';
import { coverageKeys } from '../coverage/coverage-keys';
import type { CoverageMeasure } from '../../terrain/coverage-measures';

/** What one attempt ended with. */
type AnalysisOutcome = 'done' | 'failed' | 'skipped';

/** A failure that no retry can mend (bad input, missing grid): the version is marked failed at once. */
class FinalAnalysisError extends Error {}

interface AttemptInfo {
  /** 1 for the first attempt. */
  attempt: number;
  /** No retry follows this attempt: a failure marks the version failed. */
  final: boolean;
}

export function createAnalysisUsecases(deps: { db: Db; storage: Storage; terrain: TerrainRunner; log?: (msg: string) => void; heartbeatSeconds?: number }) {
  const { db, storage, terrain } = deps;
  const log = deps.log ?? (() => {});
  const heartbeatMs = (deps.heartbeatSeconds ?? 5) * 1000;

  /**
   * Record "still alive" every few seconds from the main thread while the attempt runs (the terrain work itself is
   * in a pool thread, so the timer keeps firing); the supervisor (analysis-supervisor.ts) hands back a running
   * version whose heartbeat stopped. Returns the function that stops the heartbeat.
   */
  function startHeartbeat(versionId: string): () => void {
    const timer = setInterval(() => {
      db.update(planVersion)
        .set({ analysisHeartbeatAt: sql`now()` })
        .where(and(eq(planVersion.id, versionId), eq(planVersion.analysisState, 'running')))
        .catch(() => undefined); // a missed beat is harmless; several in a row hand the run to another worker
    }, heartbeatMs);
    (timer as unknown as { unref?: () => void }).unref?.(); // the DOM typings (tsconfig lib) type timers as numbers
    return () => clearInterval(timer);
  }

  /** Take a queued (or interrupted) version for analysis; null when it is already done or failed. */
  async function claim(versionId: string) {
    const [row] = await db
      .update(planVersion)
      .set({ analysisState: 'running', analysisProgress: 5, analysisError: null, analysisHeartbeatAt: sql`now()` })
      .where(and(eq(planVersion.id, versionId), inArray(planVersion.analysisState, ['queued', 'running'])))
      .returning({ id: planVersion.id, teamId: planVersion.teamId, planId: planVersion.planId, siteId: planVersion.siteId, input: planVersion.input });
    return row ?? null;
  }

  async function setProgress(versionId: string, pct: number) {
    await db
      .update(planVersion)
      .set({ analysisProgress: Math.round(pct) })
      .where(and(eq(planVersion.id, versionId), eq(planVersion.analysisState, 'running')));
  }

  /** Write the final state once (never over a done version) with its audit event. */
  async function settle(v: { id: string; teamId: string; planId: string }, outcome: { result: unknown; coverage: StoredCoverage } | { error: string }): Promise<boolean> {
    return db.transaction(async (tx) => {
      const done = 'result' in outcome;
      const rows = await tx
        .update(planVersion)
        .set(
          done
            ? { analysisState: 'done', result: outcome.result, coverage: outcome.coverage, analysisProgress: 100, analysisError: null, analysedAt: sql`now()` }
            : { analysisState: 'failed', analysisError: outcome.error, analysedAt: sql`now()` },
        )
        .where(and(eq(planVersion.id, v.id), ne(planVersion.analysisState, 'done')))
        .returning({ id: planVersion.id });
      if (rows.length === 0) return false;
      await tx.insert(auditEvent).values({
        teamId: v.teamId,
        planId: v.planId,
        planVersionId: v.id,
        action: done ? 'analysis.done' : 'analysis.failed',
        toState: done ? 'done' : 'failed',
        comment: done ? null : outcome.error,
      });
      return true;
    });
  }

  async function compute(v: { id: string; teamId: string; siteId: string; input: unknown }) {
    const [s] = await db.select({ storageKey: site.storageKey, verticalDatum: site.verticalDatum }).from(site).where(and(eq(site.id, v.siteId), eq(site.teamId, v.teamId))).limit(1);
    if (!s) throw new FinalAnalysisError('The elevation grid of this version is gone.');
    // the grid is read by ranges (only the header and the blocks under the mission): a local file in the terrain
    // thread, an object store through ranged GETs; a store with neither hands over the bytes
    let file: DemFile;
    try {
      const local = storage.localPath ? await storage.localPath(s.storageKey) : null;
      if (local) file = { path: local };
      else if (storage.openRanges) file = await storage.openRanges(s.storageKey);
      else {
        const bytes = await storage.getBytes(s.storageKey);
        file = new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength);
      }
    } catch (err) {
      if (err instanceof StorageNotFoundError) throw new FinalAnalysisError('The stored elevation grid file of this version is missing; upload it again.');
      throw err;
    }
    await setProgress(v.id, 20);
    let last = 0;
    // the site's datum goes into the result, so every stored height names its reference
    const analysis = await terrain.analyse(file, v.input, (pct) => {
      if (pct - last >= 5) {
        last = pct;
        setProgress(v.id, pct).catch(() => undefined);
      }
    }, { siteVerticalDatum: s.verticalDatum });
    const checked = planResultSchema.safeParse(analysis.result);
    if (!checked.success) throw new FinalAnalysisError(`The analysis produced a result the server cannot store (${checked.error.issues[0]?.message}); this is a Loftline bug.`);
    const coverage = storedCoverageSchema.safeParse(analysis.coverage);
    if (!coverage.success) throw new FinalAnalysisError(`The coverage run produced a document the server cannot store (${coverage.error.issues[0]?.message}); this is a Loftline bug.`);
    // the files go in before the row says done, so a reader never finds a ready coverage without its files
    if (analysis.files) await storeCoverageFiles(v, analysis.files);
    return { result: checked.data, coverage: coverage.data };
  }

  async function storeCoverageFiles(v: { id: string; teamId: string }, files: CoverageFiles) {
    await storage.put(coverageKeys.raster(v.teamId, v.id), files.raster, { contentType: 'image/tiff' });
    for (const [measure, png] of Object.entries(files.layers)) {
      await storage.put(coverageKeys.layer(v.teamId, v.id, measure as CoverageMeasure), png, { contentType: 'image/png' });
    }
    await storage.put(coverageKeys.failing(v.teamId, v.id), files.failing, { contentType: 'image/png' });
    await storage.put(coverageKeys.print(v.teamId, v.id), files.print, { contentType: 'image/png' });
  }

  return {
    /** One attempt at analysing a version. Throws (for the queue to retry) only on failures a retry may mend. */
    async analyseVersion(versionId: string, attempt: AttemptInfo = { attempt: 1, final: true }): Promise<AnalysisOutcome> {
      const v = await claim(versionId);
      if (!v) {
        log(`analysis ${versionId}: already settled, nothing to do`);
        return 'skipped';
      }
      const stopHeartbeat = startHeartbeat(versionId);
      try {
        const wrote = await settle(v, await compute(v));
        log(`analysis ${versionId}: ${wrote ? 'done' : 'finished by another worker first'}`);
        return wrote ? 'done' : 'skipped';
      } catch (err) {
        const message = err instanceof TerrainError || err instanceof FinalAnalysisError ? err.message : `The analysis stopped: ${(err as Error)?.message ?? String(err)}`;
        if (err instanceof TerrainError || err instanceof FinalAnalysisError || attempt.final) {
          const suffix = attempt.final && !(err instanceof TerrainError || err instanceof FinalAnalysisError) && attempt.attempt > 1 ? ` (after ${attempt.attempt} attempts)` : '';
          await settle(v, { error: message + suffix });
          log(`analysis ${versionId}: failed: ${message}`);
          return 'failed';
        }
        // back in the queue: say why the last attempt stopped while the next one waits
        await db
          .update(planVersion)
          .set({ analysisState: 'queued', analysisProgress: 0, analysisHeartbeatAt: null, analysisError: `Attempt ${attempt.attempt} stopped (${(err as Error)?.message}); trying again.` })
          .where(and(eq(planVersion.id, versionId), eq(planVersion.analysisState, 'running')));
        throw err;
      } finally {
        stopHeartbeat();
      }
    },

    /** Mark a version failed when its job ran out of retries without a worker finishing it (e.g. every worker died). */
    async giveUp(versionId: string, reason: string): Promise<void> {
      const [v] = await db
        .select({ id: planVersion.id, teamId: planVersion.teamId, planId: planVersion.planId })
        .from(planVersion)
        .where(and(eq(planVersion.id, versionId), inArray(planVersion.analysisState, ['queued', 'running'])))
        .limit(1);
      if (v) await settle(v, { error: reason });
    },
  };
}

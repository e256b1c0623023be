/**
 * The shared services of one process, built once by `createServices()` and typed: the API server (server/boot.ts)
 * hands them to every route group, and the worker script (scripts/worker.ts) builds the same ones for its analysis
 * workers. Each service lives in its own folder (storage/, analysis/, jobs/, mail/) and takes its dependencies as
 * arguments, so none of them imports this file back.
 */
import type { ServerResponse } from 'node:http';
import type { Db } from '../db/client';
import type { Auth } from './auth/auth';
import type { Config } from './config';
import { startAnalysisSupervisor } from './analysis/analysis-supervisor';
import { startAnalysisWorkers } from './analysis/analysis.worker';
import { createTerrainService } from './analysis/terrain.service';
import { createBodyCache, type BodyCache } from './http/body-cache';
import { startJobs, type Jobs } from './jobs/jobs.service';
import { noMail, startMail } from './mail/mail.service';
import type { Mailer } from './mail/mailer';
import { startOrphanSweep } from './storage/orphan-sweep';
import type { Storage } from './storage/storage';
import { createStorageFromConfig } from './storage/storage.service';
import type { TerrainRunner } from './analysis/terrain-pool';

export interface Services {
  db: Db;
  auth: Auth;
  config: Config;
  /** Stored grids, hillshades, coverage rasters (the driver named by STORAGE_DRIVER). */
  storage: Storage;
  /** The pool of terrain threads shared by uploads and analysis workers of this process. */
  terrain: TerrainRunner;
  /** The PostgreSQL job queue (pg-boss) with the analysis queue. */
  jobs: Jobs;
  /** The mailer; one that sends nothing in a process built with `mail: false` (the worker script). */
  mail: Mailer;
  /** Long-lived answers (server-sent events), ended first at shutdown (http/open-streams.ts). */
  openStreams: Set<ServerResponse>;
  /** The process's one cache of JSON bodies for repeated reads. */
  bodyCache: BodyCache;
}

interface ServicesOptions {
  /** Analysis workers started in this process (0: it only queues; another process works the queue). */
  workers: number;
  /** Start the mailer (and, with no SMTP_HOST, the fake SMTP server); the worker script sends no mail. */
  mail?: boolean;
  /** Sweep crash debris out of storage at start and periodically (the server does; one sweeper is enough). */
  orphanSweep?: boolean;
  /** Progress lines of the workers and the supervisor (none when left out). */
  log?: (msg: string) => void;
  /** Errors of the queue itself (console.error when left out). */
  queueError?: (err: unknown) => void;
}

interface ServicesHandle {
  services: Services;
  /** Stop everything started, in reverse start-up order; never throws. */
  close(): Promise<void>;
}

/**
 * Build the services of one process in start-up order: storage, the orphan sweep, terrain threads, the queue with
 * its analysis workers and supervisor, then mail (which queues through the jobs service). A step that fails stops
 * what started before it.
 */
export async function createServices(base: Pick<Services, 'db' | 'auth' | 'config'>, opts: ServicesOptions): Promise<ServicesHandle> {
  const { db, config } = base;
  const env = config.env;
  const cleanups: Array<() => Promise<void>> = [];
  const close = async () => {
    for (const cleanup of cleanups.splice(0).reverse()) await cleanup().catch(() => undefined);
  };
  try {
    const storage = createStorageFromConfig(config);
    if (opts.orphanSweep) cleanups.push(startOrphanSweep({ db, storage, config }));
    const terrain = createTerrainService(config);
    cleanups.push(() => terrain.close());
    const jobs = await startJobs(config, opts.queueError);
    cleanups.push(() => jobs.stop());
    await startAnalysisWorkers({ db, storage, terrain, jobs, config }, opts.workers, opts.log);
    // every process looks for analyses whose worker died, also one that only queues (WORKERS=0)
    const stopSupervisor = startAnalysisSupervisor(db, jobs, { staleSeconds: env.ANALYSIS_STALE_SECONDS, everySeconds: env.ANALYSIS_HEARTBEAT_SECONDS, log: opts.log });
    // the supervisor stops before the queue it hands jobs back to
    cleanups.push(() => stopSupervisor());
    let mail: Mailer = noMail;
    if (opts.mail) {
      mail = await startMail({ db, config, storage, jobs });
      cleanups.push(() => mail.close());
    }
    return { services: { ...base, storage, terrain, jobs, mail, openStreams: new Set(), bodyCache: createBodyCache() }, close };
  } catch (err) {
    await close();
    throw err;
  }
}

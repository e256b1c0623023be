/**
 * The `jobs` service: pg-boss (a PostgreSQL job queue) on Loftline's own database, with the analysis queue.
 * Any number of processes may share it: each job goes to one worker, and a job whose worker died is retried.
 */
import { sql, type SQL } from 'drizzle-orm';
import PgBoss from 'pg-boss';
import type { Config } from '../config';

export interface AnalysisJobData {
  versionId: string;
  teamId: string;
}

/** A pg-boss `db` option: run the queue's SQL on the caller's connection (to send inside a transaction). */
export type JobsDb = PgBoss.Db;

/**
 * A pg-boss `db` over a Drizzle transaction: pg-boss's numbered placeholders ($1, $2…) become Drizzle parameters, so
 * a job is inserted on the transaction's connection and commits (or rolls back) with it.
 */
export function jobsDbOf(tx: { execute: (query: SQL) => PromiseLike<unknown> }): JobsDb {
  return {
    async executeSql(text: string, values: unknown[] = []) {
      const parts = text.split(/\$(\d+)/);
      const chunks = parts.map((p, i) => (i % 2 === 0 ? sql.raw(p) : sql`${sql.param(values[Number(p) - 1])}`));
      return (await tx.execute(sql.join(chunks))) as { rows: unknown[] };
    },
  } as JobsDb;
}

export interface Jobs {
  boss: PgBoss;
  /** The analysis queue (ANALYSIS_QUEUE), and where pg-boss moves its jobs that ran out of retries. */
  queues: { analysis: string; analysisDead: string };
  /** Queue the analysis of a version (job id = version id, so a second send of the same version is a no-op). */
  queueAnalysis(data: AnalysisJobData, db?: JobsDb): Promise<string | null>;
  stop(): Promise<void>;
}

/** Start pg-boss on the configured database and make sure the analysis queues exist. */
export async function startJobs(config: Pick<Config, 'databaseUrl' | 'env'>, log: (err: unknown) => void = console.error): Promise<Jobs> {
  const env = config.env;
  const boss = new PgBoss({
    connectionString: config.databaseUrl,
    schema: 'pgboss',
    application_name: 'loftline-jobs',
    max: 4,
    maintenanceIntervalSeconds: env.JOBS_MAINTENANCE_SECONDS,
  });
  boss.on('error', log);
  await boss.start();
  const queues = { analysis: env.ANALYSIS_QUEUE, analysisDead: `${env.ANALYSIS_QUEUE}-dead` };
  const retry = { retryLimit: env.ANALYSIS_RETRY_LIMIT, expireInSeconds: env.ANALYSIS_EXPIRE_SECONDS, retryDelay: 1, deadLetter: queues.analysisDead };
  // the dead-letter queue first: pg-boss can only move a job into a queue that exists
  await boss.createQueue(queues.analysisDead, { name: queues.analysisDead, retryLimit: 2 });
  await boss.createQueue(queues.analysis, { name: queues.analysis, ...retry });
  await boss.updateQueue(queues.analysis, { name: queues.analysis, ...retry });
  let stopped = false;
  return {
    boss,
    queues,
    queueAnalysis: (data, db) => boss.send(queues.analysis, data, { id: data.versionId, ...retry, ...(db ? { db } : {}) }),
    async stop() {
      if (stopped) return;
      stopped = true;
      // graceful: running jobs get a few seconds; what is still active is failed for retry by pg-boss
      await boss.stop({ graceful: true, wait: true, timeout: 5000 });
    },
  };
}

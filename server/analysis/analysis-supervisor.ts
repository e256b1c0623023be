/**
 * The analysis supervisor: finds analyses whose worker died (kill -9, crash, lost machine) by their stopped heartbeat
 * and hands their job back to the queue for retry, so a lost run is retried within ANALYSIS_STALE_SECONDS plus one
 * check instead of waiting for the queue's own expiry (ANALYSIS_EXPIRE_SECONDS, minutes).
 *
 * Every server and worker process runs one. Each hand-back happens exactly once: the job row is locked
 * (FOR UPDATE SKIP LOCKED, so two supervisors never take the same job), the version is moved back to "queued" with
 * a conditional UPDATE, and the job is failed for retry through pg-boss's own `fail` on the same transaction, so
 * either all three happen or none.
 */
import { sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { jobsDbOf, type Jobs } from '../jobs/jobs.service';

interface SupervisorOptions {
  /** A running analysis with no heartbeat for this long is taken as lost. */
  staleSeconds: number;
  /** How often to look. */
  everySeconds: number;
  log?: (msg: string) => void;
}

interface LostJob extends Record<string, unknown> {
  job_id: string;
  version_id: string;
  team_id: string;
  plan_id: string;
  retry_count: number;
  retry_limit: number;
}

/** One look: hand back every lost analysis job found; returns the version ids handed back. */
export async function handBackLostAnalyses(db: Db, jobs: Pick<Jobs, 'boss' | 'queues'>, staleSeconds: number): Promise<string[]> {
  return db.transaction(async (tx) => {
    // pg-boss keeps an active job's start in started_on; a version not yet claimed by its attempt has no heartbeat yet
    const found = await tx.execute<LostJob>(sql`
      select j.id as job_id, v.id as version_id, v.team_id, v.plan_id, j.retry_count, j.retry_limit
      from pgboss.job j
      join plan_version v on v.id = (j.data->>'versionId')::uuid
      where j.name = ${jobs.queues.analysis}
        and j.state = 'active'
        and v.analysis_state in ('queued', 'running')
        and coalesce(v.analysis_heartbeat_at, j.started_on) < now() - make_interval(secs => ${staleSeconds})
        and j.started_on < now() - make_interval(secs => ${staleSeconds})
      order by j.started_on
      limit 20
      for update of j skip locked`);
    const handedBack: string[] = [];
    for (const lost of found.rows) {
      const attempt = lost.retry_count + 1;
      const retries = lost.retry_count < lost.retry_limit;
      const why = `Attempt ${attempt} lost its worker (no sign of life for ${staleSeconds} s: the process stopped or crashed)${retries ? '' : ' and no retries are left'}.`;
      const moved = await tx.execute(sql`
        update plan_version
        set analysis_state = 'queued', analysis_progress_pct = 0, analysis_heartbeat_at = null, analysis_error = ${why}
        where id = ${lost.version_id} and analysis_state in ('queued', 'running')
        returning id`);
      if (moved.rows.length === 0) continue;
      await tx.execute(sql`
        insert into audit_event (team_id, plan_id, plan_version_id, action, from_state, to_state, comment)
        values (${lost.team_id}, ${lost.plan_id}, ${lost.version_id}, 'analysis.retried', 'running', 'queued', ${why})`);
      // the queue's own fail: the job goes to "retry" (or, out of retries, to failed and its dead-letter queue)
      // pg-boss 10 answers { affected } (its typings say void)
      const r = (await jobs.boss.fail(jobs.queues.analysis, lost.job_id, { message: why }, { db: jobsDbOf(tx) })) as unknown as { affected: number };
      if (r.affected !== 1) throw new Error(`The analysis job ${lost.job_id} could not be handed back (${r.affected} rows changed).`);
      handedBack.push(lost.version_id);
    }
    return handedBack;
  });
}

/** Look every `everySeconds` until stopped; returns the stop function. */
export function startAnalysisSupervisor(db: Db, jobs: Pick<Jobs, 'boss' | 'queues'>, options: SupervisorOptions): () => Promise<void> {
  const log = options.log ?? (() => {});
  let running: Promise<unknown> | null = null;
  const timer = setInterval(() => {
    if (running) return; // one look at a time in this process
    running = handBackLostAnalyses(db, jobs, options.staleSeconds)
      .then((ids) => {
        for (const id of ids) log(`analysis ${id}: its worker stopped answering; handed back to the queue for retry`);
      })
      .catch((err) => log(`supervisor: ${(err as Error)?.message ?? err}`))
      .finally(() => (running = null));
  }, options.everySeconds * 1000);
  (timer as unknown as { unref?: () => void }).unref?.(); // the DOM typings (tsconfig lib) type timers as numbers
  return async () => {
    clearInterval(timer);
    await running;
  };
}

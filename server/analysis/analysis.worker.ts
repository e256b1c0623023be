/** Analysis workers: take `plan-analysis` jobs from the queue one at a time and analyse their version. */
import type { Db } from '../../db/client';
import type { Config } from '../config';
import type { AnalysisJobData, Jobs } from '../jobs/jobs.service';
import type { Storage } from '../storage/storage';
import { createAnalysisUsecases } from './analysis.usecases';
import type { TerrainRunner } from './terrain-pool';

/** What the workers use of the process's services. */
interface AnalysisWorkerDeps {
  db: Db;
  storage: Storage;
  terrain: TerrainRunner;
  jobs: Pick<Jobs, 'boss' | 'queues'>;
  config: Pick<Config, 'env'>;
}

/** Start `count` workers in this process (each polls and works one job at a time), plus the dead-letter handler. */
export async function startAnalysisWorkers(deps: AnalysisWorkerDeps, count: number, log: (msg: string) => void = () => {}): Promise<string[]> {
  if (count <= 0) return [];
  const { boss, queues } = deps.jobs;
  const analysis = createAnalysisUsecases({ db: deps.db, storage: deps.storage, terrain: deps.terrain, log, heartbeatSeconds: deps.config.env.ANALYSIS_HEARTBEAT_SECONDS });
  const pollingIntervalSeconds = deps.config.env.JOBS_POLL_SECONDS;
  const ids: string[] = [];
  for (let i = 0; i < count; i++) {
    ids.push(
      await boss.work<AnalysisJobData>(queues.analysis, { batchSize: 1, includeMetadata: true, pollingIntervalSeconds }, async ([job]) => {
        const attempt = job.retryCount + 1;
        return analysis.analyseVersion(job.data.versionId, { attempt, final: job.retryCount >= job.retryLimit });
      }),
    );
  }
  ids.push(
    await boss.work<AnalysisJobData>(queues.analysisDead, { batchSize: 1, pollingIntervalSeconds }, async ([job]) => {
      await analysis.giveUp(job.data.versionId, 'The analysis stopped every time it was tried (a worker crashed or timed out); run it again, or try a smaller area.');
    }),
  );
  return ids;
}

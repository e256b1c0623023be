/** Analysis workers: take `plan-analysis` jobs from the queue one at a time and analyse their version. */
import type { Services } from '../services';
import { jobsOf, type AnalysisJobData } from '../jobs/jobs.service';
import { storageOf } from '../storage/storage.service';
import { createAnalysisUsecases } from './analysis.usecases';
import { terrainOf } from './terrain.service';

/** Start `count` workers in this process (each polls and works one job at a time), plus the dead-letter handler. */
export async function startAnalysisWorkers(services: Services, count: number, log: (msg: string) => void = () => {}): Promise<string[]> {
  if (count <= 0) return [];
  const { boss, queues } = jobsOf(services);
  const analysis = createAnalysisUsecases({ db: services.db, storage: storageOf(services), terrain: terrainOf(services), log, heartbeatSeconds: services.config.env.ANALYSIS_HEARTBEAT_SECONDS });
  const pollingIntervalSeconds = services.config.env.JOBS_POLL_SECONDS;
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

/**
 * The jobs service factory, apart from the queue itself so that the analysis worker (which queues through
 * jobs.service.ts) and the queue never import each other.
 */
import type { ServiceFactory } from '../services';
import { startAnalysisSupervisor } from '../analysis/analysis-supervisor';
import { startAnalysisWorkers } from '../analysis/analysis.worker';
import { startJobs } from './jobs.service';

/**
 * Service factory: puts `jobs` on the services, starts the analysis supervisor and WORKERS analysis workers in this process
 * (WORKERS=0: this process only queues; scripts/worker.ts or another server does the work).
 */
export const jobsFactory: ServiceFactory = async (services) => {
  const jobs = await startJobs(services.config);
  services.jobs = jobs;
  const quiet = services.config.env.NODE_ENV === 'test';
  const log = quiet ? undefined : (m: string) => console.log(`loftline worker: ${m}`);
  await startAnalysisWorkers(services, services.config.env.WORKERS, log);
  // every process looks for analyses whose worker died, also one that only queues (WORKERS=0)
  const env = services.config.env;
  const stopSupervisor = startAnalysisSupervisor(services.db, jobs, { staleSeconds: env.ANALYSIS_STALE_SECONDS, everySeconds: env.ANALYSIS_HEARTBEAT_SECONDS, log });
  return async () => {
    await stopSupervisor();
    await jobs.stop();
  };
};

/**
 * The jobs service factory, apart from the queue itself so that the analysis worker (which queues through
 * jobs.service.ts) and the queue never import each other.
 */
import type { ServiceFactory } from '../services';
import { startAnalysisWorkers } from '../analysis/analysis.worker';
import { startJobs } from './jobs.service';

/**
 * Service factory: puts `jobs` on the services and starts WORKERS analysis workers in this process
 * (WORKERS=0: this process only queues; scripts/worker.ts or another server does the work).
 */
export const jobsFactory: ServiceFactory = async (services) => {
  const jobs = await startJobs(services.config);
  services.jobs = jobs;
  const quiet = services.config.env.NODE_ENV === 'test';
  await startAnalysisWorkers(services, services.config.env.WORKERS, quiet ? undefined : (m) => console.log(`loftline worker: ${m}`));
  return () => jobs.stop();
};

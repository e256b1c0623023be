/** The `terrain` service: the pool of terrain threads shared by uploads and analysis workers of this process. */
import type { Config } from '../config';
import { createTerrainRunner, type TerrainRunner } from './terrain-pool';

/** The terrain runner of a process (TERRAIN_THREADS threads; 0 runs inline); its `close` ends the threads. */
export function createTerrainService(config: Pick<Config, 'env'>): TerrainRunner {
  const { TERRAIN_THREADS, TERRAIN_TASK_SECONDS, DATUM_GRID_DIR, ANALYSIS_NICE, TERRAIN_THREADS_COMPILED } = config.env;
  const runner = createTerrainRunner({ threads: TERRAIN_THREADS, taskTimeoutMs: TERRAIN_TASK_SECONDS * 1000, datumGridDir: DATUM_GRID_DIR, nice: ANALYSIS_NICE, compiled: TERRAIN_THREADS_COMPILED });
  // A process that runs analyses starts its threads with the server, so memory is steady from boot and the first
  // analysis does not load the terrain code beside the reads.
  if (config.env.WORKERS > 0) runner.warm();
  return runner;
}

/** The `terrain` service: the pool of terrain threads shared by uploads and analysis workers of this process. */
import type { ServiceFactory, Services } from '../services';
import { createTerrainRunner, type TerrainRunner } from './terrain-pool';

/** Service factory: puts `terrain` on the services (TERRAIN_THREADS threads; 0 runs inline). */
export const terrainFactory: ServiceFactory = async (services) => {
  const { TERRAIN_THREADS, TERRAIN_TASK_SECONDS, DATUM_GRID_DIR, ANALYSIS_NICE } = services.config.env;
  const runner = createTerrainRunner({ threads: TERRAIN_THREADS, taskTimeoutMs: TERRAIN_TASK_SECONDS * 1000, datumGridDir: DATUM_GRID_DIR, nice: ANALYSIS_NICE });
  services.terrain = runner;
  // A process that runs analyses starts its threads with the server, so memory is steady from boot and the first
  // analysis does not load the terrain code beside the reads.
  if (services.config.env.WORKERS > 0) runner.warm();
  return () => runner.close();
};

/** The terrain runner, or a clear error when the factory did not run. */
export function terrainOf(services: Services): TerrainRunner {
  const t = services.terrain as TerrainRunner | undefined;
  if (!t) throw new Error('The terrain service is not set up: terrainFactory must run before the routes that use it.');
  return t;
}

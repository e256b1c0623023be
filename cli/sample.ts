/** `terrain sample DEM.tif --at X,Y [--at …] [--crs EPSG:N] [--method bilinear|nearest]`: heights at points. */
import { openDem } from '../terrain/dem';
import { WGS84, crsFromString } from '../terrain/crs';
import { sampleAt, type SampleMethod } from '../terrain/sample';
import { TerrainError } from '../terrain/errors';
import { CliError, nodeInflate, parseCommandArgs, parsePair, readFileBytes } from './io';

export const usage = 'usage: npm run -s terrain -- sample DEM.tif --at X,Y [--at X,Y …] [--crs EPSG:N (default EPSG:4326, X = lon)] [--method bilinear|nearest]';

/** Heights (metres) at the given points; `elevation: null` outside the grid or on nodata. */
export async function run(args: string[]): Promise<unknown> {
  const { values, positionals } = parseCommandArgs(args, {
    at: { type: 'string', multiple: true },
    crs: { type: 'string' },
    method: { type: 'string' },
  });
  if (positionals.length !== 1) throw new CliError(`sample takes one DEM file, got ${positionals.length} arguments. ${usage}`);
  const points = (values.at ?? []).map((a) => parsePair(a, '--at'));
  if (points.length === 0) throw new CliError(`sample needs at least one --at X,Y. ${usage}`);
  const method = (values.method ?? 'bilinear') as SampleMethod;
  if (method !== 'bilinear' && method !== 'nearest') throw new CliError(`--method must be bilinear or nearest, got "${values.method}".`);
  const crs = values.crs ? crsFromString(values.crs) : WGS84;
  const dem = await openDem(await readFileBytes(positionals[0]), { inflate: nodeInflate });
  const samples = [];
  for (const [x, y] of points) {
    let elevation: number | null = null;
    try {
      // decode only the blocks around the point (cached between points)
      const grid = await dem.read({ window: { bbox: [x, y, x, y], crs, marginPx: 1 } });
      elevation = sampleAt(grid, x, y, { crs, method });
    } catch (err) {
      if (!(err instanceof TerrainError && (err.code === 'outside-grid' || err.code === 'all-nodata'))) throw err;
    }
    samples.push({ x, y, elevation });
  }
  return { samples };
}

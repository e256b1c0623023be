/** `terrain info DEM.tif`: size, CRS, resolution, bounds, elevation range, nodata share and units of a DEM. */
import { openDem } from '../terrain/dem';
import { describeGrid } from '../terrain/metadata';
import { CliError, nodeInflate, parseCommandArgs, readFileBytes } from './io';

export const usage = 'usage: npm run -s terrain -- info DEM.tif';

/** The info document for one DEM file. */
export async function run(args: string[]): Promise<unknown> {
  const { positionals } = parseCommandArgs(args, {});
  if (positionals.length !== 1) throw new CliError(`info takes one DEM file, got ${positionals.length} arguments. ${usage}`);
  const dem = await openDem(await readFileBytes(positionals[0]), { inflate: nodeInflate, cacheBytes: 0 });
  const header = dem.header;
  const m = describeGrid(await dem.read());
  return {
    width: m.width,
    height: m.height,
    crs: m.crs,
    resolution: m.resolution,
    bounds: m.bounds,
    boundsWgs84: m.boundsWgs84,
    elevation: m.elevation,
    nodataShare: m.nodataShare,
    verticalUnit: m.verticalUnit,
    verticalDatum: header.verticalDatum,
    storage: { sampleType: header.sampleType, compression: header.compression, predictor: header.predictor, tiling: header.tiling, rasterType: header.rasterType, mask: header.mask },
  };
}

/** `terrain coverage DEM.tif --mission mission.json --out coverage.tif [--cell-m N]`: the coverage raster of the plan over every ground cell, as a GeoTIFF and a compliance document. */
import { openDem } from '../terrain/dem';
import { WGS84 } from '../terrain/crs';
import { analysePlan, missionBboxWgs84 } from '../terrain/plan';
import { resolveMission } from '../terrain/mission';
import { resolveCoverageInput } from '../terrain/coverage-spec';
import { checkCoverageRun, runCoverage } from '../terrain/coverage-document';
import { coverageGeoTiffParts } from '../terrain/coverage-raster-file';
import { TerrainError } from '../terrain/errors';
import { generalCautions } from '../contracts/cautions';
import { CliError, nodeInflate, parseCommandArgs, readFileBytes, writeFileParts } from './io';
import { readMission } from './plan';

export const usage = 'usage: npm run -s terrain -- coverage DEM.tif --mission mission.json --out coverage.tif [--cell-m N]';

export async function run(args: string[]): Promise<unknown> {
  const { values, positionals } = parseCommandArgs(args, { mission: { type: 'string' }, out: { type: 'string' }, 'cell-m': { type: 'string' } });
  if (positionals.length !== 1) throw new CliError(`coverage takes one DEM file, got ${positionals.length} arguments. ${usage}`);
  if (!values.mission) throw new CliError(`coverage needs --mission mission.json. ${usage}`);
  if (!values.out) throw new CliError(`coverage needs --out coverage.tif for the raster. ${usage}`);
  let cellArg: number | null = null;
  if (values['cell-m'] !== undefined) {
    cellArg = Number(values['cell-m']);
    if (!(Number.isFinite(cellArg) && cellArg >= 0.1 && cellArg <= 100)) throw new CliError(`--cell-m must be a number of metres from 0.1 to 100, got "${values['cell-m']}".`);
  }
  const input = await readMission(values.mission);
  const bbox = missionBboxWgs84(input); // checks the mission before the DEM is decoded
  const mission = resolveMission(input);
  resolveCoverageInput(input, mission); // refuses a bad spec or envelope before the DEM is decoded
  const dem = await openDem(await readFileBytes(positionals[0]), { inflate: nodeInflate });
  const grid = await dem.read({ window: { bbox, crs: WGS84, marginPx: 2 } });
  try {
    checkCoverageRun(grid, input, mission, cellArg);
  } catch (err) {
    if (err instanceof TerrainError && err.code === 'unsupported') throw new CliError(err.message, 1);
    throw err;
  }
  const t0 = performance.now();
  const plan = analysePlan(grid, input, { verticalDatum: dem.header.verticalDatum, mission });
  const t1 = performance.now();
  const run = runCoverage(grid, input, mission, plan, { cellM: cellArg, now: () => performance.now() });
  try {
    // in parts: the file is never held whole
    await writeFileParts(values.out, coverageGeoTiffParts(run.raster));
  } catch (err) {
    throw new CliError(`Cannot write the coverage raster to "${values.out}": ${(err as Error).message}.`, 1);
  }
  const { document: doc } = run;
  return {
    ...doc,
    raster: { path: values.out, ...doc.raster },
    timingMs: { plan: Math.round((t1 - t0) * 10) / 10, coverage: doc.timingMs.coverage },
    cautions: [...generalCautions],
  };
}

/** `terrain solve DEM.tif --mission mission.json`: the plan that meets the mission's coverage spec on every reachable cell in the least flight time found, with every choice explained. */
import { openDem } from '../terrain/dem';
import { WGS84 } from '../terrain/crs';
import { missionBboxWgs84 } from '../terrain/plan';
import { resolveMission } from '../terrain/mission';
import { resolveCoverageInput } from '../terrain/coverage-spec';
import { resolveSolveOptions } from '../terrain/solve-options';
import { solvePlan } from '../terrain/solve';
import { generalCautions } from '../contracts/cautions';
import { CliError, nodeInflate, parseCommandArgs, readFileBytes } from './io';
import { readMission } from './plan';

export const usage = 'usage: npm run -s terrain -- solve DEM.tif --mission mission.json';

/** The solved plan document: the `plan` document plus `choices`, `unreachable`, `proof` and `comparison`. */
export async function run(args: string[]): Promise<unknown> {
  const { values, positionals } = parseCommandArgs(args, { mission: { type: 'string' } });
  if (positionals.length !== 1) throw new CliError(`solve takes one DEM file, got ${positionals.length} arguments. ${usage}`);
  if (!values.mission) throw new CliError(`solve needs --mission mission.json. ${usage}`);
  const input = await readMission(values.mission);
  const bbox = missionBboxWgs84(input); // checks the mission before the DEM is decoded
  const mission = resolveMission(input);
  resolveCoverageInput(input, mission);
  resolveSolveOptions(input, mission);
  const dem = await openDem(await readFileBytes(positionals[0]), { inflate: nodeInflate });
  const grid = await dem.read({ window: { bbox, crs: WGS84, marginPx: 2 } });
  const t0 = performance.now();
  const result = solvePlan(grid, input, { verticalDatum: dem.header.verticalDatum });
  const solveS = (performance.now() - t0) / 1000;
  return { ...result, solveTimeS: Math.round(solveS * 100) / 100, cautions: [...generalCautions] };
}

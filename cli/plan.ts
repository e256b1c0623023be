/** `terrain plan DEM.tif --mission mission.json`: the whole plan analysis over the DEM, decoding only the tiles under the mission. */
import { readFile } from 'node:fs/promises';
import { openDem } from '../terrain/dem';
import { WGS84 } from '../terrain/crs';
import { analysePlan, missionBboxWgs84 } from '../terrain/plan';
import { generalCautions } from '../contracts/cautions';
import { CliError, nodeInflate, parseCommandArgs, readFileBytes } from './io';

export const usage = 'usage: npm run -s terrain -- plan DEM.tif --mission mission.json';

/** The mission file as JSON, or a CliError naming the file and what is wrong. */
export async function readMission(path: string | undefined): Promise<unknown> {
  if (!path) throw new CliError(`plan needs --mission mission.json. ${usage}`);
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    throw new CliError(`Cannot read mission file "${path}": ${code === 'ENOENT' ? 'no such file' : (err as Error).message}.`, 1);
  }
  try {
    return JSON.parse(text);
  } catch (err) {
    throw new CliError(`Mission file "${path}" is not valid JSON: ${(err as Error).message}.`, 1);
  }
}

/** The plan document (lines, stations, legs, summary, warnings) for a DEM and a mission file. */
export async function run(args: string[]): Promise<unknown> {
  const { values, positionals } = parseCommandArgs(args, { mission: { type: 'string' } });
  if (positionals.length !== 1) throw new CliError(`plan takes one DEM file, got ${positionals.length} arguments. ${usage}`);
  const mission = await readMission(values.mission);
  const bbox = missionBboxWgs84(mission); // checks the mission before the DEM is decoded
  const dem = await openDem(await readFileBytes(positionals[0]), { inflate: nodeInflate });
  const grid = await dem.read({ window: { bbox, crs: WGS84, marginPx: 2 } });
  const result = analysePlan(grid, mission, { verticalDatum: dem.header.verticalDatum });
  // The same cautions as every flight-facing output; the plan's own warnings stay in `warnings`.
  return { ...result, cautions: [...generalCautions] };
}

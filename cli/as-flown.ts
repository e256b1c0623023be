/** `terrain as-flown DEM.tif --mission mission.json --photos log.csv [--cell-m N]`: the photos as flown against the plan — matching, as-flown coverage, failing patches and re-flight lines. */
import { readFile } from 'node:fs/promises';
import { openDem } from '../terrain/dem';
import { WGS84 } from '../terrain/crs';
import { missionBboxWgs84 } from '../terrain/plan';
import { resolveMission } from '../terrain/mission';
import { resolveCoverageInput } from '../terrain/coverage-spec';
import { runAsFlownCheck } from '../terrain/as-flown-document';
import { solvePlan } from '../terrain/solve';
import { generalCautions } from '../contracts/cautions';
import { PhotoLogError, parsePhotoLogCsv } from '../contracts/photo-log';
import { CliError, nodeInflate, parseCommandArgs, readFileBytes } from './io';
import { readMission } from './plan';

export const usage = 'usage: npm run -s terrain -- as-flown DEM.tif --mission mission.json --photos log.csv [--cell-m N]';

/** The photo log's records, or a one-line error naming the file and the first problems. */
async function readPhotoLog(path: string) {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    throw new CliError(`Cannot read photo log "${path}": ${code === 'ENOENT' ? 'no such file' : (err as Error).message}.`, 1);
  }
  try {
    return parsePhotoLogCsv(text);
  } catch (err) {
    if (err instanceof PhotoLogError) throw new CliError(`Photo log "${path}": ${err.message}.`, 1);
    throw err;
  }
}

/** The as-flown document. */
export async function run(args: string[]): Promise<unknown> {
  const { values, positionals } = parseCommandArgs(args, { mission: { type: 'string' }, photos: { type: 'string' }, 'cell-m': { type: 'string' } });
  if (positionals.length !== 1) throw new CliError(`as-flown takes one DEM file, got ${positionals.length} arguments. ${usage}`);
  if (!values.mission) throw new CliError(`as-flown needs --mission mission.json. ${usage}`);
  if (!values.photos) throw new CliError(`as-flown needs --photos log.csv (header file,lon,lat,altitudeM,altitudeRef,yawDeg,pitchDeg,rollDeg,time). ${usage}`);
  let cellArg: number | null = null;
  if (values['cell-m'] !== undefined) {
    cellArg = Number(values['cell-m']);
    if (!(Number.isFinite(cellArg) && cellArg >= 0.1 && cellArg <= 100)) throw new CliError(`--cell-m must be a number of metres from 0.1 to 100, got "${values['cell-m']}".`);
  }
  const input = (await readMission(values.mission)) as Record<string, unknown>;
  const bbox = missionBboxWgs84(input); // checks the mission before the DEM is decoded
  resolveCoverageInput(input, resolveMission(input)); // refuses a bad spec or envelope before the DEM is decoded
  const photos = await readPhotoLog(values.photos);
  const dem = await openDem(await readFileBytes(positionals[0]), { inflate: nodeInflate });
  const grid = await dem.read({ window: { bbox, crs: WGS84, marginPx: 2 } });
  // a solved mission flies the solver's lines: the photos are matched to those, as the server does
  const plan = (input as { layoutBy?: unknown }).layoutBy === 'solver' ? solvePlan(grid, input, { verticalDatum: dem.header.verticalDatum }) : undefined;
  return { ...runAsFlownCheck(grid, input, photos, { verticalDatum: dem.header.verticalDatum, cellM: cellArg, plan, base64: (b) => Buffer.from(b.buffer, b.byteOffset, b.byteLength).toString('base64') }), cautions: [...generalCautions] };
}

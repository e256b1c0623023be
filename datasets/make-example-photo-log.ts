/**
 * `npx tsx datasets/make-example-photo-log.ts`: writes `example-photo-log.csv`, a synthetic photo log of the
 * example mission flown over the demo grid (`simulated-flight.ts`: wind drift, crab, small roll and pitch, a
 * barometer reading 1.2 m high, six triggers skipped in a row on line 5 and one on line 9, a test shot at
 * takeoff and a photo in a turn). No real flight or camera made it.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { openDem } from '../terrain/dem';
import { WGS84 } from '../terrain/crs';
import { analysePlan, missionBboxWgs84 } from '../terrain/plan';
import { resolveMission } from '../terrain/mission';
import { coverageFrame } from '../terrain/coverage-photos';
import { photoLogToCsv } from '../contracts/photo-log';
import { nodeInflate } from '../cli/io';
import { flyPlan } from './simulated-flight';

/** Triggers the example flight skips (1-based line and station of the example mission's plan). */
export const EXAMPLE_SKIPPED = [10, 11, 12, 13, 14, 15].map((station) => ({ line: 5, station })).concat([{ line: 9, station: 9 }]);

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

/** The example flight's log as CSV text, and the plan it flew. */
export async function exampleFlight() {
  const input = JSON.parse(readFileSync(here('./example-mission.json'), 'utf8'));
  const dem = await openDem(new Uint8Array(readFileSync(here('./harrow-fell-dem.tif'))), { inflate: nodeInflate });
  const grid = await dem.read({ window: { bbox: missionBboxWgs84(input), crs: WGS84, marginPx: 2 } });
  const plan = analysePlan(grid, input, { verticalDatum: dem.header.verticalDatum });
  const log = flyPlan(plan, coverageFrame(resolveMission(input).area), EXAMPLE_SKIPPED);
  return { plan, log, csv: photoLogToCsv(log.photos) };
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const out = process.argv[2] ?? here('./example-photo-log.csv');
  const { csv, log } = await exampleFlight();
  writeFileSync(out, csv);
  process.stdout.write(`wrote ${out} (${log.photos.length} photos)\n`);
}

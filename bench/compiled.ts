/**
 * Runs a bench entry as shipped code runs: compiled to plain JavaScript first (`server/analysis/compiled-entry.ts`)
 * and then run by a plain `node` process of its own, without the TypeScript loader this script is started with
 * (`tsx bench/compiled.ts bench/run.ts` is what `npm run bench` does). Importing the compiled module here, into the
 * loader's process, is not the same: with the loader's hooks installed the same compiled coverage pass took 1.44 s
 * a round against 1.24 s in a plain process (demo raster at 1 m, measured in turns on 4 Dec 2026), and the
 * loader's own output of the TypeScript about 6 % more again.
 */
import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';
import { compiledEntry } from '../server/analysis/compiled-entry';

const entry = process.argv[2];
if (!entry) {
  console.error('usage: tsx bench/compiled.ts <bench entry .ts> [its arguments]');
  process.exit(2);
}
const compiled = compiledEntry(resolve(entry));
// the loader comes in through the command line of this process, never through the environment the child gets;
// NODE_OPTIONS is cleaned all the same, should a caller have put the loader there
const env = { ...process.env, NODE_OPTIONS: (process.env.NODE_OPTIONS ?? '').split(/\s+/).filter((o) => o && !/tsx/.test(o)).join(' ') };
// the entry sees its own arguments after its name, as if run directly, and its name is the compiled file's (so an
// entry's test "am I the program run?" (`bench/run-as-main.ts`) holds)
const run = spawnSync(process.execPath, [compiled, ...process.argv.slice(3)], { stdio: 'inherit', env });
if (run.error) {
  console.error(`could not run ${compiled}: ${run.error.message}`);
  process.exit(1);
}
process.exit(run.status ?? 1);

/** `npm run -s terrain -- <command> …`: one JSON document on stdout, or one line on stderr and a non-zero exit. */
import { CliError, printJson, reportError } from './io';
import { loadDatumGrids } from '../server/analysis/datum-grids';
import { installNodeCodecs } from '../server/analysis/node-codecs';

/** What every command file exports. */
interface Command {
  usage: string;
  run(args: string[]): Promise<unknown>;
}

// One line per command file; loaded on demand so each command pays only for what it uses.
const COMMANDS: Record<string, () => Promise<Command>> = {
  info: () => import('./info'),
  sample: () => import('./sample'),
  gsd: () => import('./gsd'),
  plan: () => import('./plan'),
  coverage: () => import('./coverage'),
  solve: () => import('./solve'),
  'as-flown': () => import('./as-flown'),
};

async function main(argv: string[]): Promise<void> {
  const [name, ...args] = argv;
  const load = name ? COMMANDS[name] : undefined;
  if (!load) {
    const list = Object.keys(COMMANDS).join(', ');
    throw new CliError(name ? `Unknown command "${name}"; commands: ${list}.` : `Give a command: ${list}.`);
  }
  const command = await load();
  installNodeCodecs(); // the LZMA (.xz) block decoder
  loadDatumGrids(); // NTv2 datum-shift grids from DATUM_GRID_DIR (default /usr/share/proj, Debian proj-data)
  if (args.includes('--help') || args.includes('-h')) {
    process.stdout.write(`${command.usage}\n`);
    return;
  }
  printJson(await command.run(args));
}

main(process.argv.slice(2)).catch(reportError);

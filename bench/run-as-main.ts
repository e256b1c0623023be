/**
 * Whether the bench module `name` (its file name without `.ts`) is the program being run: `tsx bench/NAME.ts`, or
 * its compiled form `.NAME.<hash>.compiled.mjs` (`bench/compiled.ts`). Not `import.meta.url` against the program's
 * path: compiled, every module of a bundle shares the bundle's URL, so each module of `npm run bench` would take
 * itself for the program and start its own run beside the whole bench's.
 */
import { basename } from 'node:path';

export function runAsMain(name: string): boolean {
  const program = basename(process.argv[1] ?? '');
  return program === `${name}.ts` || (program.startsWith(`.${name}.`) && program.endsWith('.compiled.mjs'));
}

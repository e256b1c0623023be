/**
 * Runs a bench entry as the server's terrain threads run the engine with TERRAIN_THREADS_COMPILED: compiled to plain JavaScript first
 * (`server/analysis/compiled-entry.ts`), not through the TypeScript loader, which costs the terrain passes about
 * 6 %. `tsx bench/compiled.ts bench/run.ts` (what `npm run bench` does).
 */
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { compiledEntry } from '../server/analysis/compiled-entry';

const entry = process.argv[2];
if (!entry) {
  console.error('usage: tsx bench/compiled.ts <bench entry .ts>');
  process.exit(2);
}
const compiled = compiledEntry(resolve(entry));
// the entry sees its own arguments after its name, as if run directly, and its name is the compiled file's (so an
// entry's test "am I the program run?" against its own import.meta.url holds)
process.argv.splice(1, 2, compiled);
await import(pathToFileURL(compiled).href);

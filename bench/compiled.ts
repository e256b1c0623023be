/**
 * Runs a bench entry as the server's terrain threads run the engine: compiled to plain JavaScript first
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
// the entry sees its own arguments after its name, as if run directly
process.argv.splice(1, 2, resolve(entry));
await import(pathToFileURL(compiledEntry(resolve(entry))).href);

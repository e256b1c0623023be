/**
 * After `expo export`: folds Metro's shared chunk (`__common-*.js`) into the lazily loaded screen groups that need it,
 * so the sign-in screen does not download it.
 *
 * Why: Metro gathers every module that two lazily loaded files both use into one `__common` file and lists it in
 * index.html, so every page loads it up front — about 50 KB gzipped of the pilot's and the office screens' shared
 * code that the sign-in screen never runs (the first screen has a size budget: tests/support/web-budget.ts). Metro's
 * module registry ignores a module defined a second time, so prepending the shared modules to each screen group
 * that needs them is safe; files loaded later from inside a group find them already defined.
 *
 * Every rewritten file gets a new content hash in its name and every reference to it is rewritten, so a cached
 * file (hashed names are `immutable` for a year) never stands for other content.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

const jsDir = (buildDir: string) => path.join(buildDir, '_expo', 'static', 'js', 'web');
const sourceMapComment = /^\/\/# (sourceMappingURL|debugId)=.*$/gm;

/** Module ids defined in a Metro bundle file (`__d(factory, id, deps)`, one per line). */
function definedIds(code: string): Set<number> {
  const ids = new Set<number>();
  for (const m of code.matchAll(/\},(\d+),(?:\[|\{)[^\n]*\);?$/gm)) ids.add(Number(m[1]));
  return ids;
}

/** Module ids a bundle file requires, read from each definition's dependency list. */
function requiredIds(code: string): Set<number> {
  const ids = new Set<number>();
  for (const line of code.split('\n')) {
    const m = /\},\d+,(\[[\d,]*\]|\{.*\})\);?$/.exec(line);
    if (!m) continue;
    const deps = JSON.parse(m[1]) as number[] | Record<string, unknown>;
    const values = Array.isArray(deps) ? deps : Object.entries(deps).filter(([k]) => k !== 'paths').map(([, v]) => v);
    for (const v of values) if (typeof v === 'number') ids.add(v);
  }
  return ids;
}

/** The file name with its content hash replaced by one of the new content. */
function rehashedName(name: string, content: string): string {
  const hash = crypto.createHash('md5').update(content).digest('hex');
  return name.replace(/-[0-9a-f]{32}\.js$/, `-${hash}.js`);
}

interface FoldResult {
  /** Bytes (uncompressed) the first screen no longer loads; 0 when the build had no shared chunk. */
  commonBytes: number;
  /** The screen-group files that received the shared modules, by their new names. */
  foldedInto: string[];
}

/** Rewrites the build in place; returns what moved. */
export function foldCommonChunk(buildDir: string): FoldResult {
  const dir = jsDir(buildDir);
  const indexFile = path.join(buildDir, 'index.html');
  let html = fs.readFileSync(indexFile, 'utf8');
  const commonName = fs.readdirSync(dir).find((f) => /^__common-[0-9a-f]{32}\.js$/.test(f));
  if (!commonName) return { commonBytes: 0, foldedInto: [] };
  const entryName = fs.readdirSync(dir).find((f) => /^entry-[0-9a-f]{32}\.js$/.test(f));
  if (!entryName) throw new Error('web build: no entry bundle found beside the shared chunk');

  const common = fs.readFileSync(path.join(dir, commonName), 'utf8').replace(sourceMapComment, '').trimEnd();
  const commonIds = definedIds(common);
  let entry = fs.readFileSync(path.join(dir, entryName), 'utf8');
  // The files the entry loads lazily (its `paths` maps): the screen groups, the service worker's helper.
  const lazyNames = new Set([...entry.matchAll(/"\/_expo\/static\/js\/web\/([^"]+\.js)"/g)].map((m) => m[1]));
  const renamed = new Map<string, string>();
  const writes = new Map<string, string>();
  for (const name of lazyNames) {
    const code = fs.readFileSync(path.join(dir, name), 'utf8');
    if (![...requiredIds(code)].some((id) => commonIds.has(id))) continue;
    const folded = `${common}\n${code}`;
    const next = rehashedName(name, folded);
    renamed.set(name, next);
    writes.set(next, folded);
  }
  // A file that needs the shared modules but was not folded must only ever load after a group that carries them
  // (a chart's code loads from a screen group, CanvasKit's wrapper from the chart's code): check before writing.
  const others = fs.readdirSync(dir).filter((f) => f.endsWith('.js') && f !== entryName && f !== commonName && !renamed.has(f));
  const codeOf = new Map(others.map((f) => [f, fs.readFileSync(path.join(dir, f), 'utf8')]));
  const loadersOf = (name: string) =>
    [...renamed.keys(), commonName, ...others].filter((f) => f !== name && (f === commonName ? common : codeOf.get(f) ?? fs.readFileSync(path.join(dir, f), 'utf8')).includes(name));
  const safe = (name: string, seen = new Set<string>()): boolean => {
    if (renamed.has(name) || name === commonName) return true; // the shared code itself only runs inside a group
    if (seen.has(name)) return false;
    seen.add(name);
    const loaders = loadersOf(name);
    return loaders.length > 0 && loaders.every((f) => safe(f, seen));
  };
  for (const name of others) {
    if (![...requiredIds(codeOf.get(name)!)].some((id) => commonIds.has(id))) continue;
    if (!safe(name)) throw new Error(`web build: ${name} needs the shared chunk but can load before any screen group that carries it; cannot fold`);
  }

  for (const from of renamed.keys()) if (common.includes(from)) throw new Error(`web build: the shared chunk names ${from}; cannot fold`);
  for (const [from, to] of renamed) {
    fs.writeFileSync(path.join(dir, to), writes.get(to)!);
    fs.rmSync(path.join(dir, from));
    fs.rmSync(path.join(dir, `${from}.map`), { force: true });
    entry = entry.split(from).join(to);
  }
  // Other lazily loaded files may name a renamed group too (none does today; stay correct anyway).
  for (const [name, code] of codeOf) {
    let next = code;
    for (const [from, to] of renamed) next = next.split(from).join(to);
    if (next !== code) fs.writeFileSync(path.join(dir, name), next);
  }
  const newEntryName = rehashedName(entryName, entry);
  fs.writeFileSync(path.join(dir, newEntryName), entry);
  if (newEntryName !== entryName) {
    fs.rmSync(path.join(dir, entryName));
    fs.rmSync(path.join(dir, `${entryName}.map`), { force: true });
  }
  const commonTag = new RegExp(`<script[^>]*src="/_expo/static/js/web/${commonName.replace(/[.]/g, '\\.')}"[^>]*></script>`);
  if (!commonTag.test(html)) throw new Error(`web build: index.html does not load ${commonName} as expected`);
  html = html.replace(commonTag, '').split(entryName).join(newEntryName);
  fs.writeFileSync(indexFile, html);
  fs.rmSync(path.join(dir, commonName));
  fs.rmSync(path.join(dir, `${commonName}.map`), { force: true });
  return { commonBytes: Buffer.byteLength(common), foldedInto: [...renamed.values()] };
}

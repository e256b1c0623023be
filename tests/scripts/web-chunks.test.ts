/**
 * Folding Metro's shared chunk into the screen groups (scripts/lib/web-chunks.ts), on a small build written here in
 * Metro's own module format (`__d(factory, id, deps)`, with `paths` naming lazily loaded files), and run: the
 * folded files, evaluated in order with a minimal Metro-style registry, still define and run every module.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import vm from 'node:vm';
import { afterEach, describe, expect, it } from 'vitest';
import { foldCommonChunk } from '../../scripts/lib/web-chunks';

const web = '_expo/static/js/web';
const h = (s: string) => crypto.createHash('md5').update(s).digest('hex');
let dir: string;
afterEach(() => fs.rmSync(dir, { recursive: true, force: true }));

/** A build: entry (module 1) lazily loads group A (module 10) and group B (module 20); both use module 5 (shared). */
function writeBuild(opts: { chartNeedsShared?: boolean } = {}) {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-fold-'));
  fs.mkdirSync(path.join(dir, web), { recursive: true });
  const common = `__d(function(g,r,i,a,m,e,d){e.value='shared'},5,[]);\n`;
  const chartName = `chart-${h('chart')}.js`;
  const chart = `__d(function(g,r,i,a,m,e,d){e.value='chart:'+${opts.chartNeedsShared ? "r(d[0]).value" : "'own'"}},30,[${opts.chartNeedsShared ? '5' : ''}]);\n`;
  const groupA = `__d(function(g,r,i,a,m,e,d){e.value='A+'+r(d[0]).value},10,{"0":5,"1":30,"paths":{"30":"/${web}/${chartName}"}});\n`;
  const groupB = `__d(function(g,r,i,a,m,e,d){e.value='B+'+r(d[0]).value},20,[5]);\n`;
  const names = { common: `__common-${h(common)}.js`, a: `group-a-${h(groupA)}.js`, b: `group-b-${h(groupB)}.js`, chart: chartName };
  const entry = `__d(function(g,r,i,a,m,e,d){},1,{"0":10,"1":20,"paths":{"10":"/${web}/${names.a}","20":"/${web}/${names.b}"}});\n`;
  const entryName = `entry-${h(entry)}.js`;
  for (const [name, code] of [[names.common, common], [names.a, groupA], [names.b, groupB], [names.chart, chart], [entryName, entry]]) {
    fs.writeFileSync(path.join(dir, web, name), code);
  }
  fs.writeFileSync(path.join(dir, 'index.html'), `<html><head><script src="/${web}/${names.common}" defer></script><script src="/${web}/${entryName}" defer></script></head></html>`);
  return { names, entryName };
}

/** Evaluates files in order with a registry that, like Metro's, ignores a module defined twice; returns a require. */
function run(files: string[]) {
  const factories = new Map<number, { f: Function; deps: unknown }>();
  const cache = new Map<number, { value?: string }>();
  const define = (f: Function, id: number, deps: unknown) => {
    if (!factories.has(id)) factories.set(id, { f, deps });
  };
  const req = (id: number): { value?: string } => {
    if (cache.has(id)) return cache.get(id)!;
    const mod = factories.get(id);
    if (!mod) throw new Error(`Requiring unknown module ${id}`);
    const exports: { value?: string } = {};
    cache.set(id, exports);
    mod.f({}, req, null, null, { exports }, exports, mod.deps);
    return exports;
  };
  for (const f of files) vm.runInNewContext(fs.readFileSync(f, 'utf8'), { __d: define });
  return req;
}

describe('folding the shared chunk into the screen groups', () => {
  it('drops the shared chunk from the page, puts its modules in each group that needs them, and renames what changed', () => {
    const { names, entryName } = writeBuild();
    const result = foldCommonChunk(dir);
    const files = fs.readdirSync(path.join(dir, web));
    expect(files.some((f) => f.startsWith('__common-'))).toBe(false);
    expect(result.foldedInto).toHaveLength(2);
    // New names carry the new content's hash; the old names are gone, so no cache can serve the old content.
    for (const f of result.foldedInto) expect(f).toBe(f.replace(/-[0-9a-f]{32}\.js$/, `-${h(fs.readFileSync(path.join(dir, web, f), 'utf8'))}.js`));
    expect(files).not.toContain(names.a);
    expect(files).not.toContain(entryName);
    const html = fs.readFileSync(path.join(dir, 'index.html'), 'utf8');
    expect(html).not.toContain('__common-');
    const newEntry = files.find((f) => f.startsWith('entry-'))!;
    expect(html).toContain(newEntry);
    const entry = fs.readFileSync(path.join(dir, web, newEntry), 'utf8');
    for (const f of result.foldedInto) expect(entry).toContain(f);

    // The page loads the entry, then one group (as a pilot would), then the chart that group loads.
    const groupA = result.foldedInto.find((f) => f.startsWith('group-a-'))!;
    const req = run([path.join(dir, web, newEntry), path.join(dir, web, groupA), path.join(dir, web, names.chart)]);
    expect(req(10).value).toBe('A+shared');
    expect(req(30).value).toBe('chart:own');
    // Both groups loaded: the shared module is defined twice and kept once.
    const groupB = result.foldedInto.find((f) => f.startsWith('group-b-'))!;
    const both = run([path.join(dir, web, newEntry), path.join(dir, web, groupA), path.join(dir, web, groupB)]);
    expect(both(20).value).toBe('B+shared');
  });

  it('accepts a lazily loaded file that needs shared modules when only a group loads it', () => {
    writeBuild({ chartNeedsShared: true });
    expect(foldCommonChunk(dir).foldedInto).toHaveLength(2);
  });

  it('refuses to fold when a file that needs shared modules can load before any group', () => {
    const { names, entryName } = writeBuild({ chartNeedsShared: true });
    // A helper the entry loads itself, needing nothing shared, that loads the chart (which does).
    const helper = `__d(function(g,r,i,a,m,e,d){},40,{"0":30,"paths":{"30":"/${web}/${names.chart}"}});\n`;
    const helperName = `helper-${h(helper)}.js`;
    fs.writeFileSync(path.join(dir, web, helperName), helper);
    const entryFile = path.join(dir, web, entryName);
    fs.writeFileSync(entryFile, fs.readFileSync(entryFile, 'utf8').replace('"paths":{', `"paths":{"40":"/${web}/${helperName}",`));
    expect(() => foldCommonChunk(dir)).toThrow(/chart-.*needs the shared chunk/);
    expect(fs.readdirSync(path.join(dir, web))).toContain(names.common); // nothing written
  });

  it('does nothing to a build without a shared chunk', () => {
    const { names } = writeBuild();
    fs.rmSync(path.join(dir, web, names.common));
    const before = fs.readFileSync(path.join(dir, 'index.html'), 'utf8');
    expect(foldCommonChunk(dir)).toEqual({ commonBytes: 0, foldedInto: [] });
    expect(fs.readFileSync(path.join(dir, 'index.html'), 'utf8')).toBe(before);
  });
});

/**
 * The layering rules, checked on the source as it is (one test per rule, so a new file cannot break one unseen):
 * terrain/ imports only terrain/ (its purity test checks the libraries and globals); contracts/ imports nothing of
 * server/, db/, app/ or components/; app/ and components/ import nothing of server/, db/, cli/ or scripts/; db/
 * imports nothing of server/, app/ or components/; and no module imports itself round a cycle (type-only imports
 * are erased at build time and do not count).
 */
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '../..');
const folders = ['app', 'components', 'contracts', 'server', 'db', 'terrain', 'cli', 'scripts', 'datasets'];

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(path.join(root, dir), { withFileTypes: true })) {
    const rel = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...sourceFiles(rel));
    else if (/\.tsx?$/.test(e.name) && !e.name.endsWith('.d.ts')) out.push(rel);
  }
  return out;
}

const files = new Set(folders.filter((d) => fs.existsSync(path.join(root, d))).flatMap(sourceFiles));
/** `import … from './x'`, `export … from './x'` at a statement's start, `import('./x')`; group 1 marks `import type`/`export type`. */
const importRe = /(?:^[ \t]*(?:import|export)\s+(type\s+)?(?:[^'";]*?\sfrom\s+)?|\bimport\()\s*['"](\.{1,2}\/[^'"]+)['"]/gm;
/** Comments out of the way first, so a sentence that says "import" is never read as one. */
const withoutComments = (text: string) => text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/^\s*\/\/.*$/gm, '');

function resolve(from: string, spec: string): string | null {
  const base = path.normalize(path.join(path.dirname(from), spec));
  for (const c of [base, `${base}.ts`, `${base}.tsx`, `${base}.web.tsx`, path.join(base, 'index.ts')]) if (files.has(c)) return c;
  return null;
}

/** Each file's value imports (resolved to files of the project). */
const graph = new Map<string, string[]>();
for (const f of files) {
  const text = withoutComments(fs.readFileSync(path.join(root, f), 'utf8'));
  const deps: string[] = [];
  for (const m of text.matchAll(importRe)) {
    if (m[1]) continue;
    const r = resolve(f, m[2]);
    if (r) deps.push(r);
  }
  graph.set(f, deps);
}

const top = (f: string) => f.split(path.sep)[0];

function breaches(from: string[], forbidden: string[]): string[] {
  const out: string[] = [];
  for (const [f, deps] of graph) {
    if (!from.includes(top(f))) continue;
    for (const d of deps) if (forbidden.includes(top(d))) out.push(`${f} → ${d}`);
  }
  return out;
}

describe('import rules', () => {
  it('reads the project (and finds imports to check)', () => {
    expect(graph.size).toBeGreaterThan(200);
    expect(graph.get(path.join('server', 'app.ts'))?.length).toBeGreaterThan(5);
  });

  it('keeps terrain/ to itself', () => {
    expect(breaches(['terrain'], folders.filter((d) => d !== 'terrain'))).toEqual([]);
  });

  it('keeps contracts/ free of server, database and screens', () => {
    expect(breaches(['contracts'], ['server', 'db', 'app', 'components', 'cli', 'scripts'])).toEqual([]);
  });

  it('keeps app/ and components/ free of server, database and scripts', () => {
    expect(breaches(['app', 'components'], ['server', 'db', 'cli', 'scripts'])).toEqual([]);
  });

  it('keeps db/ free of server and screens', () => {
    expect(breaches(['db'], ['server', 'app', 'components'])).toEqual([]);
  });

  it('has no import cycles', () => {
    // Tarjan's strongly connected components: any component of more than one file is a cycle
    let index = 0;
    const idx = new Map<string, number>();
    const low = new Map<string, number>();
    const stack: string[] = [];
    const onStack = new Set<string>();
    const cycles: string[][] = [];
    const visit = (v: string) => {
      idx.set(v, index);
      low.set(v, index++);
      stack.push(v);
      onStack.add(v);
      for (const w of graph.get(v) ?? []) {
        if (!idx.has(w)) {
          visit(w);
          low.set(v, Math.min(low.get(v)!, low.get(w)!));
        } else if (onStack.has(w)) low.set(v, Math.min(low.get(v)!, idx.get(w)!));
      }
      if (low.get(v) === idx.get(v)) {
        const comp: string[] = [];
        let w: string;
        do {
          w = stack.pop()!;
          onStack.delete(w);
          comp.push(w);
        } while (w !== v);
        if (comp.length > 1 || (graph.get(v) ?? []).includes(v)) cycles.push(comp.sort());
      }
    };
    for (const v of graph.keys()) if (!idx.has(v)) visit(v);
    expect(cycles).toEqual([]);
  });
});

/**
 * The layering rules, checked on the source as it is, one test per rule (so a new file cannot break one unseen):
 * - terrain/ imports only terrain/ (nothing of server/, db/, app/, components/, cli/ or scripts/), and no Node
 *   built-in, not even through a library (what needs zlib, a PNG's deflate or a TIFF's inflate, is handed in by
 *   its caller; tests/terrain/purity.test.ts lists the libraries it may use);
 * - contracts/ imports nothing of server/, db/, app/ or components/;
 * - app/ and components/ import only contracts/, terrain/ modules and each other (and npm packages that are not Node
 *   built-ins);
 * - db/ imports nothing of server/, app/ or components/;
 * - no module of ours imports itself round a cycle, type-only imports included (a type imported back from the file
 *   that imports you is still a circle a reader has to walk): each cycle is reported as its path.
 * Imports are read with the TypeScript compiler's own parser (typescript's createSourceFile), so comments, strings
 * and template text are never taken for an import.
 */
import fs from 'node:fs';
import { builtinModules } from 'node:module';
import path from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '../..');
/** Our folders: every cycle among them counts. */
const folders = ['app', 'components', 'contracts', 'server', 'db', 'terrain', 'cli', 'scripts', 'datasets', 'bench'];

interface Import {
  spec: string;
  typeOnly: boolean;
}

/** The module specifiers of one file: import/export declarations, `import x = require()`, `import()` and `require()`. */
function importsOf(fileName: string, text: string): Import[] {
  const sf = ts.createSourceFile(fileName, text, ts.ScriptTarget.Latest, false, fileName.endsWith('x') ? ts.ScriptKind.TSX : ts.ScriptKind.TS);
  const out: Import[] = [];
  const visit = (node: ts.Node) => {
    if (ts.isImportDeclaration(node) && ts.isStringLiteral(node.moduleSpecifier)) {
      const clause = node.importClause;
      // `import type {…}` or `import { type A, type B }` with every name type-only: erased at build time
      const allTypeNames =
        !!clause && !clause.name && !!clause.namedBindings && ts.isNamedImports(clause.namedBindings) && clause.namedBindings.elements.length > 0 && clause.namedBindings.elements.every((e) => e.isTypeOnly);
      out.push({ spec: node.moduleSpecifier.text, typeOnly: !!clause?.isTypeOnly || allTypeNames });
    } else if (ts.isExportDeclaration(node) && node.moduleSpecifier && ts.isStringLiteral(node.moduleSpecifier)) {
      out.push({ spec: node.moduleSpecifier.text, typeOnly: node.isTypeOnly });
    } else if (ts.isImportEqualsDeclaration(node) && ts.isExternalModuleReference(node.moduleReference) && ts.isStringLiteral(node.moduleReference.expression)) {
      out.push({ spec: node.moduleReference.expression.text, typeOnly: node.isTypeOnly });
    } else if (ts.isCallExpression(node) && node.arguments.length >= 1 && ts.isStringLiteralLike(node.arguments[0])) {
      const isImport = node.expression.kind === ts.SyntaxKind.ImportKeyword;
      const isRequire = ts.isIdentifier(node.expression) && node.expression.text === 'require';
      if (isImport || isRequire) out.push({ spec: node.arguments[0].text, typeOnly: false });
    } else if (ts.isImportTypeNode(node) && ts.isLiteralTypeNode(node.argument) && ts.isStringLiteral(node.argument.literal)) {
      // `typeof import('pngjs')` in a type position
      out.push({ spec: node.argument.literal.text, typeOnly: true });
    }
    ts.forEachChild(node, visit);
  };
  visit(sf);
  return out;
}

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(path.join(root, dir), { withFileTypes: true })) {
    const rel = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...sourceFiles(rel));
    else if (/\.(tsx?|mjs)$/.test(e.name) && !e.name.endsWith('.d.ts')) out.push(rel);
  }
  return out;
}

const files = new Set(folders.filter((d) => fs.existsSync(path.join(root, d))).flatMap(sourceFiles));

function resolveLocal(from: string, spec: string): string | null {
  const base = path.normalize(path.join(path.dirname(from), spec));
  const candidates = [base, `${base}.ts`, `${base}.tsx`, `${base}.web.tsx`, `${base}.web.ts`, path.join(base, 'index.ts'), path.join(base, 'index.tsx')];
  // `import … from './x.js'` or './x.mjs' names the emitted file
  if (/\.m?js$/.test(base)) candidates.push(base.replace(/\.m?js$/, '.ts'));
  for (const c of candidates) if (files.has(c)) return c;
  return null;
}

const builtins = new Set(builtinModules.flatMap((m) => [m, `node:${m}`]));
const isBuiltin = (spec: string) => spec.startsWith('node:') || builtins.has(spec) || builtins.has(spec.split('/')[0]);

/** npm packages known to load a Node built-in themselves (pngjs needs zlib, stream and Buffer). */
const nodeOnlyPackages = [/^pngjs$/, /^lzma-native$/, /^pg$/, /^express$/, /^nodemailer$/, /^pdfkit$/];

interface Edge {
  to: string;
  typeOnly: boolean;
}
/** Our modules and the import edges between them; `outside` keeps what each file imports from elsewhere. */
const graph = new Map<string, Edge[]>();
const outside = new Map<string, Import[]>();
for (const f of files) {
  const edges: Edge[] = [];
  const ext: Import[] = [];
  for (const imp of importsOf(f, fs.readFileSync(path.join(root, f), 'utf8'))) {
    if (imp.spec.startsWith('.')) {
      const r = resolveLocal(f, imp.spec);
      if (r) edges.push({ to: r, typeOnly: imp.typeOnly });
      else ext.push(imp); // a relative import of a non-source file (JSON, an asset)
    } else ext.push(imp);
  }
  graph.set(f, edges);
  outside.set(f, ext);
}

const top = (f: string) => f.split(path.sep)[0];

/** `a.ts → b.ts` for each import of a file under `from` into a folder outside `allowed`. */
function breachesOutsideOf(from: string[], allowed: string[]): string[] {
  const out: string[] = [];
  for (const [f, deps] of graph) {
    if (!from.includes(top(f))) continue;
    for (const d of deps) if (!allowed.includes(top(d.to))) out.push(`${f} → ${d.to}`);
  }
  return out;
}

/** Each import of a Node built-in (or of a library that loads one) by a file under `from`. */
function nodeImports(from: string[]): string[] {
  const out: string[] = [];
  for (const [f, ext] of outside) {
    if (!from.includes(top(f))) continue;
    for (const i of ext) if (!i.typeOnly && (isBuiltin(i.spec) || nodeOnlyPackages.some((re) => re.test(i.spec)))) out.push(`${f} → ${i.spec}`);
  }
  return out;
}

/** Every cycle of the graph as a path `a → b → … → a`: one per strongly connected component (Tarjan), walked from its first file. */
function cyclesOf(g: Map<string, Edge[]>): string[] {
  let index = 0;
  const idx = new Map<string, number>();
  const low = new Map<string, number>();
  const stack: string[] = [];
  const onStack = new Set<string>();
  const components: string[][] = [];
  const visit = (v: string) => {
    idx.set(v, index);
    low.set(v, index++);
    stack.push(v);
    onStack.add(v);
    for (const { to: w } of g.get(v) ?? []) {
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
      if (comp.length > 1 || (g.get(v) ?? []).some((e) => e.to === v)) components.push(comp.sort());
    }
  };
  for (const v of g.keys()) if (!idx.has(v)) visit(v);
  // a shortest way back to the start inside the component (breadth-first), so the report names a real path
  return components.map((comp) => {
    const inComp = new Set(comp);
    const start = comp[0];
    const prev = new Map<string, string>();
    const queue = (g.get(start) ?? []).filter((e) => inComp.has(e.to)).map((e) => (prev.set(e.to, start), e.to));
    const seen = new Set(queue);
    while (queue.length && !prev.has(start)) {
      const v = queue.shift()!;
      for (const { to: w } of g.get(v) ?? []) {
        if (!inComp.has(w) || seen.has(w)) continue;
        seen.add(w);
        prev.set(w, v);
        queue.push(w);
      }
    }
    const pathBack = [start];
    for (let v = prev.get(start)!; v !== start; v = prev.get(v)!) pathBack.unshift(v);
    pathBack.unshift(start);
    const more = comp.length > pathBack.length - 1 ? ` (and ${comp.length - (pathBack.length - 1)} more files tangled with them)` : '';
    return pathBack.join(' → ') + more;
  });
}

describe('import rules', () => {
  it('reads the project with the compiler and finds imports to check', () => {
    expect(graph.size).toBeGreaterThan(200);
    expect(graph.get(path.join('server', 'app.ts'))?.length).toBeGreaterThan(5);
    // the parser tells a type-only import from a value import, and never reads one out of a comment or a string
    const probe = importsOf('x.ts', "// import a from './in-comment'\nimport type { A } from './t';\nimport { type B } from './u';\nimport c from './v';\nconst s = \"import d from './w'\";\nawait import('./dyn');");
    expect(probe).toEqual([
      { spec: './t', typeOnly: true },
      { spec: './u', typeOnly: true },
      { spec: './v', typeOnly: false },
      { spec: './dyn', typeOnly: false },
    ]);
  });

  it('keeps terrain/ to itself', () => {
    expect(breachesOutsideOf(['terrain'], ['terrain'])).toEqual([]);
  });

  it('keeps terrain/ free of Node built-ins, also through a library', () => {
    expect(nodeImports(['terrain'])).toEqual([]);
  });

  it('keeps contracts/ free of server, database and screens', () => {
    expect(breachesOutsideOf(['contracts'], ['contracts', 'terrain'])).toEqual([]);
    expect(nodeImports(['contracts'])).toEqual([]);
  });

  it('keeps app/ and components/ to contracts/, terrain/ and each other', () => {
    expect(breachesOutsideOf(['app', 'components'], ['app', 'components', 'contracts', 'terrain'])).toEqual([]);
    expect(nodeImports(['app', 'components'])).toEqual([]);
  });

  it('keeps db/ free of server and screens', () => {
    expect(breachesOutsideOf(['db'], ['db', 'contracts', 'terrain'])).toEqual([]);
  });

  it('finds a cycle when there is one, and names its path', () => {
    const g = new Map<string, Edge[]>([
      ['a.ts', [{ to: 'b.ts', typeOnly: false }]],
      ['b.ts', [{ to: 'c.ts', typeOnly: true }]],
      ['c.ts', [{ to: 'a.ts', typeOnly: false }]],
      ['d.ts', [{ to: 'a.ts', typeOnly: false }]],
    ]);
    expect(cyclesOf(g)).toEqual(['a.ts → b.ts → c.ts → a.ts']);
  });

  it('has no import cycles, type-only imports included', () => {
    expect(cyclesOf(graph)).toEqual([]);
  });
});

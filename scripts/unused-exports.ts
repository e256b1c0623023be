/**
 * Lists exports no other module imports (read with the TypeScript compiler's parser, as the import-rules test
 * reads imports): exports used only in their own file, and exports used nowhere. With --fix, the first lose their
 * `export` and the second are removed. Default exports and app/ (Expo Router reads its route files' exports by
 * name) are left alone; a module imported whole (`import * as`, `import()`, `require()`, `export *`) counts as
 * using every export.
 *
 *   npx tsx scripts/unused-exports.ts [--fix]
 */
import fs from 'node:fs';
import path from 'node:path';
import ts from 'typescript';

const root = path.resolve(import.meta.dirname, '..');
const folders = ['app', 'components', 'contracts', 'server', 'db', 'terrain', 'cli', 'scripts', 'datasets', 'bench', 'tests'];
/** Folders whose exports are read by a framework rather than imported. */
const frameworkRead = ['app'];

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  if (!fs.existsSync(path.join(root, dir))) return out;
  for (const e of fs.readdirSync(path.join(root, dir), { withFileTypes: true })) {
    const rel = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...sourceFiles(rel));
    // (the hidden `.compiled.mjs` bundles the terrain threads and the bench build are output, not source)
    else if (/\.(tsx?|mjs)$/.test(e.name) && !e.name.endsWith('.d.ts') && !e.name.endsWith('.compiled.mjs')) out.push(rel);
  }
  return out;
}
const files = folders.flatMap(sourceFiles);
const fileSet = new Set(files);

function resolveLocal(from: string, spec: string): string | null {
  const base = path.normalize(path.join(path.dirname(from), spec));
  const candidates = [base, `${base}.ts`, `${base}.tsx`, `${base}.web.tsx`, `${base}.web.ts`, `${base}.native.tsx`, path.join(base, 'index.ts'), path.join(base, 'index.tsx')];
  if (/\.m?js$/.test(base)) candidates.push(base.replace(/\.m?js$/, '.ts'));
  // a platform pair (x.web.tsx beside x.tsx) is one module to its importers
  return candidates.filter((c) => fileSet.has(c))[0] ?? null;
}
/** Both files of a platform pair answer an import of either. */
function siblings(f: string): string[] {
  const stem = f.replace(/(\.web|\.native)?\.tsx?$/, '');
  return files.filter((g) => g.replace(/(\.web|\.native)?\.tsx?$/, '') === stem);
}

interface Exported {
  file: string;
  name: string;
  /** The node to edit: a declaration with an export modifier, or an export specifier. */
  node: ts.Node;
  kind: 'declaration' | 'specifier' | 'reexport';
}

const sources = new Map<string, ts.SourceFile>();
for (const f of files) {
  const text = fs.readFileSync(path.join(root, f), 'utf8');
  sources.set(f, ts.createSourceFile(f, text, ts.ScriptTarget.Latest, true, f.endsWith('x') ? ts.ScriptKind.TSX : ts.ScriptKind.TS));
}

const exported: Exported[] = [];
/** file -> names imported from it by other files; '*' for the whole module. */
const importedNames = new Map<string, Set<string>>();
const markUsed = (target: string, name: string) => {
  for (const t of siblings(target)) {
    if (!importedNames.has(t)) importedNames.set(t, new Set());
    importedNames.get(t)!.add(name);
  }
};

const hasExport = (n: ts.Node) => ts.canHaveModifiers(n) && (ts.getModifiers(n) ?? []).some((m) => m.kind === ts.SyntaxKind.ExportKeyword);
const isDefault = (n: ts.Node) => ts.canHaveModifiers(n) && (ts.getModifiers(n) ?? []).some((m) => m.kind === ts.SyntaxKind.DefaultKeyword);

for (const [f, sf] of sources) {
  for (const st of sf.statements) {
    if (hasExport(st) && !isDefault(st)) {
      if (ts.isVariableStatement(st)) {
        for (const d of st.declarationList.declarations) if (ts.isIdentifier(d.name)) exported.push({ file: f, name: d.name.text, node: st, kind: 'declaration' });
      } else if ((ts.isFunctionDeclaration(st) || ts.isClassDeclaration(st) || ts.isInterfaceDeclaration(st) || ts.isTypeAliasDeclaration(st) || ts.isEnumDeclaration(st)) && st.name) {
        exported.push({ file: f, name: st.name.text, node: st, kind: 'declaration' });
      }
    }
    if (ts.isExportDeclaration(st) && st.exportClause && ts.isNamedExports(st.exportClause)) {
      const from = st.moduleSpecifier && ts.isStringLiteral(st.moduleSpecifier) ? st.moduleSpecifier.text : null;
      for (const el of st.exportClause.elements) {
        exported.push({ file: f, name: el.name.text, node: el, kind: from ? 'reexport' : 'specifier' });
        if (from?.startsWith('.')) {
          const r = resolveLocal(f, from);
          if (r) markUsed(r, (el.propertyName ?? el.name).text);
        }
      }
    } else if (ts.isExportDeclaration(st) && !st.exportClause && st.moduleSpecifier && ts.isStringLiteral(st.moduleSpecifier)) {
      const r = resolveLocal(f, st.moduleSpecifier.text);
      if (r) markUsed(r, '*');
    }
  }
  const visit = (node: ts.Node) => {
    if (ts.isImportDeclaration(node) && ts.isStringLiteral(node.moduleSpecifier) && node.moduleSpecifier.text.startsWith('.')) {
      const r = resolveLocal(f, node.moduleSpecifier.text);
      const b = node.importClause?.namedBindings;
      if (r && b && ts.isNamespaceImport(b)) markUsed(r, '*');
      else if (r && b && ts.isNamedImports(b)) for (const el of b.elements) markUsed(r, (el.propertyName ?? el.name).text);
    } else if (ts.isImportTypeNode(node) && ts.isLiteralTypeNode(node.argument) && ts.isStringLiteral(node.argument.literal)) {
      const r = resolveLocal(f, node.argument.literal.text);
      if (r) {
        if (node.qualifier && ts.isIdentifier(node.qualifier)) markUsed(r, node.qualifier.text);
        else if (node.qualifier && ts.isQualifiedName(node.qualifier)) markUsed(r, '*');
        else markUsed(r, '*');
      }
    } else if (ts.isCallExpression(node) && node.arguments.length >= 1 && ts.isStringLiteralLike(node.arguments[0]) && node.arguments[0].text.startsWith('.')) {
      const isImport = node.expression.kind === ts.SyntaxKind.ImportKeyword;
      const isRequire = ts.isIdentifier(node.expression) && node.expression.text === 'require';
      if (isImport || isRequire) {
        const r = resolveLocal(f, node.arguments[0].text);
        if (r) markUsed(r, '*');
      }
    }
    ts.forEachChild(node, visit);
  };
  visit(sf);
}

/** Uses of `name` in its own file beyond its declaration (identifiers with that text). */
function localUses(e: Exported): number {
  const sf = sources.get(e.file)!;
  let n = 0;
  const visit = (node: ts.Node) => {
    if (ts.isIdentifier(node) && node.text === e.name) n++;
    ts.forEachChild(node, visit);
  };
  visit(sf);
  // the declaration's own name, and an export specifier's mention
  return n - 1 - (e.kind === 'specifier' ? 1 : 0);
}

const unused = exported.filter((e) => !frameworkRead.includes(e.file.split(path.sep)[0]) && !(importedNames.get(e.file)?.has(e.name) || importedNames.get(e.file)?.has('*')));
const report = unused.map((e) => ({ ...e, uses: localUses(e) }));
for (const r of report) console.log(`${r.file}\t${r.name}\t${r.kind}\t${r.uses > 0 ? 'own file only' : 'used nowhere'}`);
console.error(`${report.length} exports no other module imports (${report.filter((r) => r.uses <= 0).length} used nowhere).`);

if (process.argv.includes('--fix')) {
  const byFile = new Map<string, typeof report>();
  for (const r of report) byFile.set(r.file, [...(byFile.get(r.file) ?? []), r]);
  for (const [f, list] of byFile) {
    const sf = sources.get(f)!;
    let text = sf.text;
    const edits: Array<{ start: number; end: number; insert: string }> = [];
    const seen = new Set<ts.Node>();
    for (const r of list) {
      if (r.kind === 'declaration') {
        if (seen.has(r.node)) continue;
        seen.add(r.node);
        const decls = ts.isVariableStatement(r.node) ? r.node.declarationList.declarations.length : 1;
        const allUnusedHere = list.filter((x) => x.node === r.node).length === decls;
        if (!allUnusedHere) continue; // one of several names is imported elsewhere: keep the export
        const removable = list.filter((x) => x.node === r.node).every((x) => x.uses <= 0);
        if (removable) {
          // the whole statement and its leading comment go
          edits.push({ start: r.node.getFullStart(), end: r.node.getEnd(), insert: '' });
        } else {
          const mod = (ts.getModifiers(r.node as ts.HasModifiers) ?? []).find((m) => m.kind === ts.SyntaxKind.ExportKeyword)!;
          edits.push({ start: mod.getStart(), end: mod.getEnd() + 1, insert: '' });
        }
      } else {
        // an `export { a, b }` list: drop the name; the list itself goes when it empties
        const decl = r.node.parent.parent as ts.ExportDeclaration;
        const clause = decl.exportClause as ts.NamedExports;
        if (seen.has(decl)) continue;
        const gone = list.filter((x) => x.node.parent.parent === decl).map((x) => x.node);
        seen.add(decl);
        const keep = clause.elements.filter((el) => !gone.includes(el));
        if (keep.length === 0) edits.push({ start: decl.getFullStart(), end: decl.getEnd(), insert: '' });
        else edits.push({ start: clause.getStart(), end: clause.getEnd(), insert: `{ ${keep.map((el) => el.getText()).join(', ')} }` });
      }
    }
    edits.sort((a, b) => b.start - a.start);
    for (const e of edits) text = text.slice(0, e.start) + e.insert + text.slice(e.end);
    fs.writeFileSync(path.join(root, f), text);
  }
}

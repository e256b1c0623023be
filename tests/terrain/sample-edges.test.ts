import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readDem } from '../../terrain/dem';
import { sampleAt } from '../../terrain/sample';

// GDAL 3.6.2 `gdallocationinfo -valonly -geoloc FILE X Y` at points inside, on every outer edge and just off four
// WGS 84 grids, one per hemisphere: tests/fixtures/grid-trust/make-fixtures.py wrote the grids and reference.json
const ref = JSON.parse(readFileSync(new URL('../fixtures/grid-trust/reference.json', import.meta.url), 'utf8'));
const fixture = (name: string) => readFileSync(new URL(`../fixtures/grid-trust/${name}`, import.meta.url));

describe('what is on the grid, against gdallocationinfo', () => {
  for (const [key, g] of Object.entries<any>(ref.hemispheres.grids)) {
    it(`reads the pixel GDAL reads, and nothing where GDAL says "off this file" (${key})`, async () => {
      const grid = await readDem(fixture(g.file));
      const offs = g.points.filter((p: any) => p.gdallocationinfo === null);
      expect(offs.map((p: any) => p.what)).toContain('bottom-right outer corner'); // the check the edge rule is about
      for (const p of g.points) {
        const near = sampleAt(grid, p.x, p.y, { method: 'nearest' });
        const bil = sampleAt(grid, p.x, p.y);
        if (p.gdallocationinfo === null) {
          expect(near, `${p.what} nearest`).toBeNull();
          expect(bil, `${p.what} bilinear`).toBeNull();
        } else {
          // gdallocationinfo prints 15 significant digits of the float32 pixel
          expect(near, `${p.what} nearest`).toBeCloseTo(p.gdallocationinfo, 9);
          expect(bil, `${p.what} bilinear`).not.toBeNull();
        }
      }
    });
  }
});

import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runTerrainCli } from './run-cli';

// GDAL 3.6.2 `gdallocationinfo -valonly -geoloc` values at points on four WGS 84 grids, one per hemisphere
// (tests/fixtures/grid-trust/make-fixtures.py, reference.json)
const ref = JSON.parse(readFileSync(new URL('../fixtures/grid-trust/reference.json', import.meta.url), 'utf8'));

describe('terrain sample in every hemisphere', () => {
  for (const [key, g] of Object.entries<any>(ref.hemispheres.grids)) {
    it(`takes a leading minus in --at, as "--at X,Y" and "--at=X,Y", and matches gdallocationinfo (${key})`, async () => {
      const pts = g.points.filter((p: any) => p.what === 'interior' || p.what === 'bottom-right outer corner');
      const args = ['sample', `tests/fixtures/grid-trust/${g.file}`, '--method', 'nearest'];
      pts.forEach((p: any, i: number) => (i % 2 ? args.push(`--at=${p.x},${p.y}`) : args.push('--at', `${p.x},${p.y}`)));
      const r = await runTerrainCli(args);
      expect(r.stderr).toBe('');
      expect(r.code).toBe(0);
      const doc = JSON.parse(r.stdout);
      expect(doc.samples.map((s: any) => [s.x, s.y])).toEqual(pts.map((p: any) => [p.x, p.y]));
      doc.samples.forEach((s: any, i: number) => {
        const want = pts[i].gdallocationinfo;
        if (want === null) expect(s.elevation, pts[i].what).toBeNull();
        else expect(s.elevation, pts[i].what).toBeCloseTo(want, 9);
      });
    });
  }

  it('reads the western example from the issue, -121.7,45.3, as GDAL does', async () => {
    const g = ref.hemispheres.grids.northWest;
    const p = g.points.find((q: any) => q.x === -121.7 && q.y === 45.3);
    const r = await runTerrainCli(['sample', `tests/fixtures/grid-trust/${g.file}`, '--at', '-121.7,45.3', '--method', 'nearest']);
    expect(r.code, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout).samples[0].elevation).toBeCloseTo(p.gdallocationinfo, 9);
  });

  it('treats a negative number as a value in other options too, and keeps real option mistakes one line', async () => {
    const gsd = await runTerrainCli(['gsd', '--sensor-width-mm', '13.2', '--focal-mm', '8.8', '--image-width-px', '5472', '--height-m', '-100']);
    expect(gsd.code).toBe(2);
    expect(gsd.stderr).toMatch(/--height-m must be a positive number, got "-100"/);
    const missing = await runTerrainCli(['sample', 'tests/fixtures/grid-trust/hemisphere-northWest.tif', '--at', '--method', 'nearest']);
    expect(missing.code).toBe(2);
    expect(missing.stderr.trim().split('\n')).toHaveLength(1);
    expect(missing.stderr).toMatch(/--at=-XYZ/); // node's hint is kept whole
  }, 60_000);
});

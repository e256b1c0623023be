import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { createGrid, sampleBilinear, sampleNearest } from '../../terrain/grid';
import { WGS84, createTransform, crsFromEpsg } from '../../terrain/crs';
import { densifyLine, sampleAlongLine, sampleAt, sampleGridCoords, samplePoints } from '../../terrain/sample';
import { readDem } from '../../terrain/dem';
import { TerrainError } from '../../terrain/errors';
import { lineStations } from '../../terrain/geodesic-line';
import geodesic from 'geographiclib-geodesic';

const fixture = (name: string) => readFileSync(new URL(`../fixtures/dem/${name}`, import.meta.url));
// GDAL 3.6.2 reads and bilinear samples (gdal.Warp -r bilinear to a 1x1 output), from tests/fixtures/dem/make-fixtures.py
const ref = JSON.parse(readFileSync(new URL('../fixtures/dem/reference.json', import.meta.url), 'utf8'));
// WGS 84 geodesics from GeographicLib GeodSolve 2.1.2 (Debian geographiclib-tools), tests/fixtures/crs/make-references.sh
const geod = JSON.parse(readFileSync(new URL('../fixtures/crs/geodsolve.json', import.meta.url), 'utf8'));

const UTM33 = crsFromEpsg(32633);
/** A 4 x 3 plane z = 10 + 2 col + 100 row (pixel-centre indices), 1 m pixels, UTM 33N. */
function plane() {
  const data = new Float32Array(12);
  for (let r = 0; r < 3; r++) for (let c = 0; c < 4; c++) data[r * 4 + c] = 10 + 2 * c + 100 * r;
  return createGrid({ width: 4, height: 3, data, transform: [500000, 1, 0, 5550000, 0, -1], crs: UTM33 });
}

describe('bilinear and nearest samples against GDAL', () => {
  const metresPer: Record<string, number> = { feet: 0.3048, usFeet: 1200 / 3937 };
  for (const [key, g] of Object.entries<any>(ref.grids)) {
    it(`match ${ref.tool} on the ${key} grid (${g.file})`, async () => {
      const grid = await readDem(fixture(g.file));
      const f = metresPer[key] ?? 1;
      for (const s of g.samples) {
        const bil = sampleAt(grid, s.x, s.y, { crs: grid.crs });
        // GDAL's warper re-weights the valid neighbours beside a nodata hole; Loftline calls such a point unknown.
        if (s.bilinear === null) expect(bil, `bilinear at ${s.x},${s.y}`).toBeNull();
        else if (bil !== null) expect(Math.abs(bil - s.bilinear * f), `bilinear at ${s.x},${s.y}`).toBeLessThan(2e-5 * Math.max(1, Math.abs(s.bilinear)));
        else expect(touchesNodata(g, s.x, s.y), `only nodata neighbours may make ${s.x},${s.y} unknown`).toBe(true);
        const near = sampleAt(grid, s.x, s.y, { crs: grid.crs, method: 'nearest' });
        if (s.nearest === null) expect(near).toBeNull();
        else expect(near).toBe(Math.fround(s.nearest * f));
      }
    });
  }

  it('call a point beside the nodata hole unknown where GDAL re-weights (documented difference)', async () => {
    const g = ref.grids.nodataHole;
    const grid = await readDem(fixture(g.file));
    const beside = g.samples.filter((s: any) => s.bilinear !== null && touchesNodata(g, s.x, s.y));
    expect(beside.length).toBeGreaterThan(0);
    for (const s of beside) expect(sampleAt(grid, s.x, s.y, { crs: grid.crs })).toBeNull();
  });
});

/** Whether any of the four pixel centres around (x, y) is nodata in GDAL's decoded array (axis-aligned grids). */
function touchesNodata(g: any, x: number, y: number): boolean {
  const t = g.geoTransform;
  const fx = (x - t[0]) / t[1] - 0.5, fy = (y - t[3]) / t[5] - 0.5;
  const c0 = Math.max(0, Math.floor(fx)), r0 = Math.max(0, Math.floor(fy));
  const c1 = Math.min(g.width - 1, c0 + 1), r1 = Math.min(g.height - 1, r0 + 1);
  return [g.values[r0][c0], g.values[r0][c1], g.values[r1][c0], g.values[r1][c1]].some((v) => v === null);
}

describe('sampleAt', () => {
  it('interpolates a plane exactly and reads the nearest pixel', () => {
    const g = plane();
    // pixel centre (col 1, row 1) is at x = 500001.5, y = 5549998.5 -> 10 + 2 + 100
    expect(sampleAt(g, 500001.5, 5549998.5, { crs: UTM33 })).toBeCloseTo(112, 10);
    expect(sampleAt(g, 500002.0, 5549998.0, { crs: UTM33 })).toBeCloseTo(10 + 2 * 1.5 + 100 * 1.5, 10);
    expect(sampleAt(g, 500002.9, 5549998.1, { crs: UTM33, method: 'nearest' })).toBe(10 + 4 + 100);
  });

  it('takes WGS 84 lon/lat by default and transforms to the grid CRS', () => {
    const g = plane();
    const [lon, lat] = createTransform(UTM33, WGS84).forward(500001.5, 5549998.5);
    expect(sampleAt(g, lon, lat)).toBeCloseTo(112, 5);
  });

  it('returns null outside the grid and on nodata, never 0', () => {
    const g = plane();
    g.data[5] = NaN;
    expect(sampleAt(g, 499999, 5549999, { crs: UTM33 })).toBeNull();
    expect(sampleAt(g, 500001.5, 5549998.5, { crs: UTM33 })).toBeNull();
    expect(sampleAt(g, 500001.5, 5549998.5, { crs: UTM33, method: 'nearest' })).toBeNull();
  });

  it('throws on bad input', () => {
    expect(() => sampleAt(plane(), NaN, 1)).toThrow(TerrainError);
    expect(() => sampleAt(plane(), 1, 1, { method: 'cubic' as never })).toThrow(/bilinear.*nearest/);
  });
});

describe('samplePoints and the hot loop', () => {
  it('counts unknown points and keeps their order', () => {
    const r = samplePoints(plane(), [[500001.5, 5549998.5], [400000, 0], [500000.5, 5549999.5]], { crs: UTM33 });
    expect(r.values[0]).toBeCloseTo(112, 10);
    expect(r.values[1]).toBeNull();
    expect(r.values[2]).toBeCloseTo(10, 10);
    expect(r.unknownCount).toBe(1);
  });

  it('agrees with grid.ts sampleBilinear/sampleNearest everywhere, edges included', () => {
    const g = plane();
    g.data[6] = NaN;
    const xs: number[] = [], ys: number[] = [];
    for (let i = -3; i <= 43; i++) for (let j = -3; j <= 33; j++) { xs.push(500000 + i / 10); ys.push(5550000 - j / 10); }
    for (const method of ['bilinear', 'nearest'] as const) {
      const out = new Float64Array(xs.length);
      const unknown = sampleGridCoords(g, xs, ys, out, method);
      let n = 0;
      for (let k = 0; k < xs.length; k++) {
        const e = method === 'bilinear' ? sampleBilinear(g, xs[k], ys[k]) : sampleNearest(g, xs[k], ys[k]);
        if (Number.isNaN(e)) { expect(out[k]).toBeNaN(); n++; } else expect(out[k]).toBeCloseTo(e, 9);
      }
      expect(unknown).toBe(n);
    }
  });

  it('does not mutate its inputs', () => {
    const g = plane();
    const before = Array.from(g.data);
    const pts: Array<[number, number]> = [[500001.5, 5549998.5]];
    samplePoints(g, pts, { crs: UTM33 });
    expect(Array.from(g.data)).toEqual(before);
    expect(pts).toEqual([[500001.5, 5549998.5]]);
  });

  it('throws on a malformed point', () => {
    expect(() => samplePoints(plane(), [[1, Number.NaN]] as never)).toThrow(/Point 0/);
  });
});

describe('sampleAlongLine', () => {
  it(`has geodesic lengths matching ${geod.tool} to 1 mm`, () => {
    for (const p of geod.pairs) {
      const d = densifyLine([[p.lon1, p.lat1], [p.lon2, p.lat2]], 1e9);
      expect(Math.abs(d.distanceM[d.distanceM.length - 1] - p.s12), `${p.lat1},${p.lon1} -> ${p.lat2},${p.lon2}`).toBeLessThan(1e-3);
      expect(d.lon[1]).toBeCloseTo(p.lon2, 9);
      expect(d.lat[1]).toBeCloseTo(p.lat2, 9);
    }
  });

  it('puts samples every stepM metres of geodesic distance, plus the end point', () => {
    const p = geod.pairs[0]; // 1430.9386 m along a parallel
    const d = densifyLine([[p.lon1, p.lat1], [p.lon2, p.lat2]], 100);
    expect(d.distanceM.length).toBe(16);
    expect(d.distanceM[14]).toBe(1400);
    expect(d.distanceM[15]).toBeCloseTo(p.s12, 6);
    const a = densifyLine([[p.lon1, p.lat1], [d.lon[7], d.lat[7]]], 1e9);
    expect(a.distanceM[a.distanceM.length - 1]).toBeCloseTo(700, 6);
  });

  it('walks across vertices of a polyline with continuous distances', () => {
    const d = densifyLine([[15.19, 50.1], [15.2, 50.1], [15.2, 50.11]], 50);
    for (let i = 1; i < d.distanceM.length; i++) expect(d.distanceM[i]).toBeGreaterThan(d.distanceM[i - 1]);
    expect(d.distanceM[d.distanceM.length - 1]).toBeCloseTo(715.47 + 1112.3, -1);
  });

  it('samples heights along a line and counts the unknown stretch', () => {
    const data = new Float32Array(200 * 50).fill(300);
    const [e, n] = createTransform(WGS84, UTM33).forward(15.2, 50.1);
    const g = createGrid({ width: 200, height: 50, data, transform: [e - 100, 1, 0, n + 25, 0, -1], crs: UTM33 });
    for (let r = 0; r < 50; r++) for (let c = 150; c < 200; c++) data[r * 200 + c] = NaN;
    const [lonA, latA] = createTransform(UTM33, WGS84).forward(e - 90, n);
    const [lonB, latB] = createTransform(UTM33, WGS84).forward(e + 90, n);
    const r = sampleAlongLine(g, [[lonA, latA], [lonB, latB]], { stepM: 1 });
    expect(r.lon.length).toBe(r.elevationM.length);
    const unknown = Array.from(r.elevationM).filter(Number.isNaN).length;
    expect(r.unknownCount).toBe(unknown);
    expect(unknown).toBeGreaterThan(35); // the last ~40 m lie over the nodata block
    expect(unknown).toBeLessThan(45);
    expect(r.elevationM[0]).toBe(300);
  });

  it('puts stations within 1 mm of exact geodesic positions and their exact UTM coordinates (geographiclib-geodesic, proj4)', () => {
    const { Geodesic } = geodesic as unknown as typeof import('geographiclib-geodesic');
    const utm = crsFromEpsg(32633);
    const toUtm = createTransform(WGS84, utm);
    for (const line of [[[14.9, 60.2], [15.1, 60.25]], [[15.0, -33.9], [15.0, -33.99]], [[15.2, 50.1], [15.21, 50.1], [15.21, 50.12]]] as Array<Array<[number, number]>>) {
      const g = createGrid({ width: 2, height: 2, data: new Float32Array(4).fill(1), transform: [0, 1, 0, 0, 0, -1], crs: utm });
      const r = sampleAlongLine(g, line, { stepM: 7.3 });
      const d = densifyLine(line, 7.3);
      expect(Array.from(d.lon)).toEqual(Array.from(r.lon));
      const g0 = Geodesic.WGS84.InverseLine(line[0][1], line[0][0], line[1][1], line[1][0]);
      for (let i = 0; i < r.distanceM.length && r.distanceM[i] <= g0.s13; i += 37) {
        const exact = g0.Position(r.distanceM[i]);
        // position error in metres, from the inverse problem between the station and the exact point
        const err = Geodesic.WGS84.Inverse(r.lat[i], r.lon[i], exact.lat2 as number, exact.lon2 as number).s12 as number;
        expect(err, `station ${i}`).toBeLessThan(1e-3);
      }
      // the grid coordinates the sampling pass uses: exact UTM of the exact geodesic point, within 1 mm
      const st = lineStations(line, 7.3, utm);
      for (let i = 0; i < st.distanceM.length && st.distanceM[i] <= g0.s13; i += 37) {
        const exact = g0.Position(st.distanceM[i]);
        const [ex, ey] = toUtm.forward(exact.lon2 as number, exact.lat2 as number);
        expect(Math.hypot((st.x as Float64Array)[i] - ex, (st.y as Float64Array)[i] - ey), `station ${i}`).toBeLessThan(1e-3);
      }
    }
  });

  it('throws on bad input', () => {
    const g = plane();
    expect(() => sampleAlongLine(g, [[15, 50]], { stepM: 1 })).toThrow(/at least two/);
    expect(() => sampleAlongLine(g, [[15, 50], [15, 51]], { stepM: 0 })).toThrow(/stepM/);
    expect(() => sampleAlongLine(g, [[15, 95], [15, 51]], { stepM: 1 })).toThrow(/Vertex 0/);
  });
});

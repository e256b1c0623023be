import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { WGS84, createTransform, crsFromEpsg, crsFromProj4 } from '../../terrain/crs';
import { lookupEpsg } from '../../terrain/epsg-table';
import { TerrainError } from '../../terrain/errors';

// Reference transforms from PROJ cs2cs 9.1.1 (Debian proj-bin + proj-data): 600 EPSG CRSs drawn with a fixed seed
// across terrain/data/epsg-proj.json, two points each inside the CRS's area of use; the cs2cs command line of each
// point is recorded beside it, and the way back from cs2cs's output (cs2cs EPSG:<code> EPSG:4326). Made by
// tests/fixtures/crs/make-epsg-references.py.
const ref = JSON.parse(readFileSync(new URL('../fixtures/crs/epsg-cs2cs.json', import.meta.url), 'utf8')) as {
  tool: string;
  points: Array<{ epsg: number; lon: number; lat: number; x: number; y: number; z: number; cs2cs: string; backLon: number; backLat: number; back: string }>;
};

/** Metres per CRS unit along x/y near the point, so that a 1 cm bound also holds for geographic CRSs. */
function metresPerUnit(epsg: number, lat: number): [number, number] {
  const crs = crsFromEpsg(epsg);
  if (!crs.geographic) return [crs.horizontalUnit === 'foot' ? 0.3048 : crs.horizontalUnit === 'us-survey-foot' ? 1200 / 3937 : 1, crs.horizontalUnit === 'foot' ? 0.3048 : crs.horizontalUnit === 'us-survey-foot' ? 1200 / 3937 : 1];
  const mPerDeg = 111320; // metres per degree of latitude, near enough for a tolerance (common practice)
  return [mPerDeg * Math.cos((lat * Math.PI) / 180), mPerDeg];
}

/** The sampled points whose CRS Loftline accepts; the rest must be refused with unknown-crs (checked below). */
const accepted = ref.points.filter((p) => {
  try {
    crsFromEpsg(p.epsg);
    return true;
  } catch (e) {
    if (!(e instanceof TerrainError) || e.code !== 'unknown-crs') throw e;
    return false;
  }
});

/** Of those, the points where an EPSG transformation to WGS 84 holds (elsewhere Loftline refuses the place). */
const placed = accepted.filter((p) => !refusedPlace(p));

function refusedPlace(p: { epsg: number; lon: number; lat: number }): boolean {
  try {
    createTransform(WGS84, crsFromEpsg(p.epsg)).forward(p.lon, p.lat);
    return false;
  } catch (e) {
    if (!(e instanceof TerrainError) || e.code !== 'unknown-crs') throw e;
    return true;
  }
}

describe('EPSG CRSs against PROJ cs2cs', () => {
  it('covers at least 500 accepted CRSs of the table, including ones with several datum shifts', () => {
    const codes = new Set(placed.map((p) => p.epsg));
    expect(codes.size).toBeGreaterThanOrEqual(500);
    expect([...codes].filter((c) => (lookupEpsg(c)?.shifts.length ?? 0) > 1).length).toBeGreaterThan(40);
  });

  it(`lands within 1 cm of ${ref.tool} for every sampled point (datum shift included)`, () => {
    const bad: string[] = [];
    for (const p of placed) {
      const crs = crsFromEpsg(p.epsg);
      const [x, y] = createTransform(WGS84, crs).forward(p.lon, p.lat);
      const [mx, my] = metresPerUnit(p.epsg, p.lat);
      const dx = Math.abs(x - p.x) * mx, dy = Math.abs(y - p.y) * my;
      if (!(dx < 0.01 && dy < 0.01)) bad.push(`EPSG:${p.epsg} (${crs.name}) at ${p.lon},${p.lat}: off by ${dx.toFixed(3)} m, ${dy.toFixed(3)} m [${p.cs2cs}]`);
    }
    expect(bad, bad.slice(0, 20).join('\n')).toEqual([]);
  });

  it(`places CRS coordinates back on WGS 84 within 1 cm of ${ref.tool} (the direction a grid's corners go)`, () => {
    const bad: string[] = [];
    for (const p of placed) {
      const [lon, lat] = createTransform(WGS84, crsFromEpsg(p.epsg)).inverse(p.x, p.y);
      const dx = Math.abs(lon - p.backLon) * 111320 * Math.cos((p.lat * Math.PI) / 180), dy = Math.abs(lat - p.backLat) * 111320;
      if (!(dx < 0.01 && dy < 0.01)) bad.push(`EPSG:${p.epsg} at ${p.x},${p.y}: ${dx.toFixed(3)} m, ${dy.toFixed(3)} m [${p.back}]`);
    }
    expect(bad, bad.slice(0, 20).join('\n')).toEqual([]);
  });

  it('keeps heights as cs2cs does (a 2D CRS change leaves the height unchanged, within 1 mm)', () => {
    // cs2cs wraps a datum shift between 2D CRSs in push/pop of the height (PROJ 9 pipelines): z out = z in (0 here).
    // Loftline's transforms are 2D and never change a grid's heights; the recorded z must say the same, except
    // where PROJ 9.1.1's pipeline carries the ellipsoidal height through its Helmert (listed with their change):
    // a DEM's heights are not ellipsoidal heights of that datum, so Loftline keeps them as they are.
    const changed = ref.points.filter((p) => Math.abs(p.z) >= 1e-3);
    expect(changed.map((p) => p.epsg), changed.map((p) => `${p.cs2cs}: z ${p.z}`).join('\n')).toEqual(changed.map(() => 9296));
    expect(changed.every((p) => Math.abs(p.z) < 0.2)).toBe(true);
  });
});

describe('EPSG CRSs that PROJ places through something Loftline cannot apply', () => {
  it('refuses the places no EPSG transformation covers, where cs2cs applies no datum shift at all (ballpark)', () => {
    const refused = accepted.filter((p) => refusedPlace(p));
    expect(refused.length).toBeLessThan(accepted.length / 20);
    for (const p of refused) {
      expect(() => createTransform(WGS84, crsFromEpsg(p.epsg)).forward(p.lon, p.lat)).toThrow(/no EPSG transformation to WGS 84 covers/);
      // the same CRS without any shift reproduces cs2cs: PROJ put the point through its ballpark there
      const entry = lookupEpsg(p.epsg);
      const bare = crsFromProj4(entry?.proj4 as string, 'no shift');
      const [x, y] = createTransform(WGS84, bare).forward(p.lon, p.lat);
      const [mx, my] = metresPerUnit(p.epsg, p.lat);
      expect(Math.abs(x - p.x) * mx, p.cs2cs).toBeLessThan(0.01);
      expect(Math.abs(y - p.y) * my, p.cs2cs).toBeLessThan(0.01);
    }
  });

  it('refuses the sampled CRSs whose projection method proj4js lacks or that are 3D, saying so', () => {
    const refused = ref.points.filter((p) => !accepted.includes(p));
    for (const p of refused) expect(() => crsFromEpsg(p.epsg)).toThrow(/projection method "\w+", which Loftline's transform library|is a 3D geographic CRS/);
  });

  it('refuses them naming the CRS and the missing transformation', () => {
    // DHDN: PROJ 9.1.1 uses the BETA2007 grid (proj-data ships it); NZGD49: the nzgd2kgrid0005 grid
    expect(() => crsFromEpsg(31467)).toThrow(/DHDN \/ 3-degree Gauss-Kruger zone 3 .*datum-shift grid .*BETA2007/);
    expect(() => crsFromEpsg(27200)).toThrow(/NZGD49 \/ New Zealand Map Grid .*nzgd2kgrid0005/);
    // Beijing 1954: EPSG has no transformation to WGS 84, PROJ would use a ballpark (no shift) on a different ellipsoid
    expect(() => crsFromEpsg(2401)).toThrow(/Beijing 1954 .*no transformation from its datum to WGS 84/);
    try {
      crsFromEpsg(31467);
    } catch (e) {
      expect(e).toBeInstanceOf(TerrainError);
      expect((e as TerrainError).code).toBe('unknown-crs');
      expect((e as Error).message).toMatch(/gdalwarp -t_srs/);
    }
  });

  it('says which EPSG transformation each accepted legacy CRS uses (OSGB36: EPSG transformation 1314, as cs2cs without OSTN15)', () => {
    const osgb = lookupEpsg(27700);
    expect(osgb?.shifts[0].name).toBe('OSGB36 to WGS 84 (6)');
    expect(osgb?.shifts[0].towgs84).toBe('+towgs84=446.448,-125.157,542.06,0.15,0.247,0.842,-20.489');
    expect(lookupEpsg(23031)?.shifts.length).toBeGreaterThan(5); // ED50: PROJ picks by region
  });
});

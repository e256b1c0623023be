import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { WGS84, createTransform, crsFromEpsg, crsFromString, utmCrsFor } from '../../terrain/crs';
import { crsFromGeoKeys } from '../../terrain/geokeys';
import { TerrainError } from '../../terrain/errors';

// Reference coordinates from PROJ cs2cs 9.1.1 (Debian proj-bin), made by tests/fixtures/crs/make-references.sh
const cs2cs = JSON.parse(readFileSync(new URL('../fixtures/crs/cs2cs.json', import.meta.url), 'utf8')) as {
  tool: string;
  points: Array<{ epsg: number; lon: number; lat: number; x: number; y: number }>;
};

describe('crsFromEpsg', () => {
  it('builds WGS 84 UTM zones north and south with their EPSG names', () => {
    expect(crsFromEpsg(32633)).toMatchObject({ epsg: 32633, geographic: false, horizontalUnit: 'metre', name: 'WGS 84 / UTM zone 33N' });
    expect(crsFromEpsg(32755).name).toBe('WGS 84 / UTM zone 55S');
    expect(crsFromEpsg(32755).proj4).toContain('+south');
    expect(crsFromEpsg(4326)).toBe(WGS84);
  });

  it('resolves other codes through the table generated from PROJ 9.1.1, with their length units', () => {
    expect(crsFromEpsg(2263)).toMatchObject({ epsg: 2263, horizontalUnit: 'us-survey-foot', name: 'NAD83 / New York Long Island (ftUS)' });
    expect(crsFromEpsg(2056).name).toBe('CH1903+ / LV95');
    expect(crsFromEpsg(4258).geographic).toBe(true);
  });

  it('throws unknown-crs for codes that are missing or are not horizontal CRSs', () => {
    expect(() => crsFromEpsg(999999)).toThrow(/not a map or geographic CRS in the EPSG dataset of PROJ 9\.1\.1/);
    expect(() => crsFromEpsg(5703)).toThrow(/is a vertical CRS/); // NAVD88 height
    expect(() => crsFromEpsg(-1)).toThrow(TerrainError);
    try {
      crsFromEpsg(999999);
    } catch (e) {
      expect((e as TerrainError).code).toBe('unknown-crs');
    }
  });

  it('refuses a CRS whose only datum shift is a grid file it cannot apply', () => {
    // PROJ 9.1.1 knows NAD27(CGQ77) -> WGS 84 only through a grid that Debian's proj-data does not ship
    expect(() => crsFromEpsg(2009)).toThrow(/NAD27\(CGQ77\) \/ SCoPQ zone 3 .*datum-shift grid ca_que_mern_cq77na83\.tif/);
  });

  it('parses EPSG:<code> strings and rejects anything else', () => {
    expect(crsFromString('EPSG:32633').epsg).toBe(32633);
    expect(crsFromString('epsg:4326')).toBe(WGS84);
    expect(() => crsFromString('UTM33')).toThrow(/EPSG:<code>/);
  });
});

describe('utmCrsFor', () => {
  it('picks the standard 6-degree zone and the hemisphere', () => {
    expect(utmCrsFor(15.2, 50.1).epsg).toBe(32633);
    expect(utmCrsFor(18.4, -33.9).epsg).toBe(32734);
    expect(utmCrsFor(-179.9, 10).epsg).toBe(32601);
    expect(utmCrsFor(179.9, -10).epsg).toBe(32760);
    expect(utmCrsFor(180, 10).epsg).toBe(32601); // 180 E is 180 W
  });

  it('applies the Norway and Svalbard exceptions of the UTM grid (NGA UTM/UPS standard; common practice)', () => {
    expect(utmCrsFor(5.3, 60.4).epsg).toBe(32632); // Bergen: zone 32, not 31
    expect(utmCrsFor(15.6, 78.2).epsg).toBe(32633); // Longyearbyen
    expect(utmCrsFor(10, 79).epsg).toBe(32633);
  });

  it('throws on a latitude outside -90..90', () => {
    expect(() => utmCrsFor(0, 91)).toThrow(TerrainError);
  });
});

describe('createTransform against PROJ cs2cs', () => {
  it(`matches ${cs2cs.tool} within 1 mm for UTM north, UTM south, EPSG:3857 and table CRSs`, () => {
    expect(cs2cs.points.length).toBeGreaterThan(15);
    for (const p of cs2cs.points) {
      const t = createTransform(WGS84, crsFromEpsg(p.epsg));
      const [x, y] = t.forward(p.lon, p.lat);
      // 27700 uses EPSG's Helmert fit (transformation 1314) here, as cs2cs does without the OSTN15 grid
      expect(Math.abs(x - p.x), `EPSG:${p.epsg} x at ${p.lon},${p.lat}`).toBeLessThan(1e-3);
      expect(Math.abs(y - p.y), `EPSG:${p.epsg} y at ${p.lon},${p.lat}`).toBeLessThan(1e-3);
    }
  });

  it('inverts back to the cs2cs input within 1e-8 degrees', () => {
    for (const p of cs2cs.points) {
      const [lon, lat] = createTransform(WGS84, crsFromEpsg(p.epsg)).inverse(p.x, p.y);
      expect(Math.abs(lon - p.lon)).toBeLessThan(1e-7);
      expect(Math.abs(lat - p.lat)).toBeLessThan(1e-7);
    }
  });

  it('transforms arrays in place to the same values as single points', () => {
    const t = createTransform(WGS84, crsFromEpsg(32633));
    const xs = Float64Array.from([15.2, 12.05]);
    const ys = Float64Array.from([50.1, 48.5]);
    t.forwardArrays(xs, ys);
    expect([xs[0], ys[0]]).toEqual(t.forward(15.2, 50.1));
    expect([xs[1], ys[1]]).toEqual(t.forward(12.05, 48.5));
  });

  it('is the identity between equal CRSs and never mutates its inputs', () => {
    const utm = crsFromEpsg(32633);
    const before = JSON.stringify(utm);
    const t = createTransform(utm, crsFromEpsg(32633));
    expect(t.identity).toBe(true);
    expect(t.forward(500000, 5550000)).toEqual([500000, 5550000]);
    expect(JSON.stringify(utm)).toBe(before);
  });
});

describe('crsFromGeoKeys', () => {
  it('reads projected, geographic and user-defined transverse Mercator keys', () => {
    expect(crsFromGeoKeys({ GTModelTypeGeoKey: 1, ProjectedCSTypeGeoKey: 32633 }).epsg).toBe(32633);
    expect(crsFromGeoKeys({ GTModelTypeGeoKey: 2, GeographicTypeGeoKey: 4326 })).toBe(WGS84);
    const tm = crsFromGeoKeys({
      GTModelTypeGeoKey: 1, ProjectedCSTypeGeoKey: 32767, ProjCoordTransGeoKey: 1, GeographicTypeGeoKey: 4326,
      ProjNatOriginLongGeoKey: 15.3, ProjNatOriginLatGeoKey: 50, ProjFalseEastingGeoKey: 10000, ProjFalseNorthingGeoKey: 20100,
      ProjScaleAtNatOriginGeoKey: 0.9999, ProjLinearUnitsGeoKey: 9001,
    });
    expect(tm.proj4).toMatch(/\+proj=tmerc .*\+lon_0=15\.3 .*\+k=0\.9999/);
    // the natural origin maps to the false easting/northing
    const [x, y] = createTransform(WGS84, tm).forward(15.3, 50);
    expect(x).toBeCloseTo(10000, 6);
    expect(y).toBeCloseTo(20100, 6);
  });

  it('throws unknown-crs when keys are missing or name an unsupported projection', () => {
    expect(() => crsFromGeoKeys(null)).toThrow(/no GeoKeys/);
    expect(() => crsFromGeoKeys({ GTModelTypeGeoKey: 3 })).toThrow(/geocentric/);
    expect(() => crsFromGeoKeys({ GTModelTypeGeoKey: 1, ProjectedCSTypeGeoKey: 32767, ProjCoordTransGeoKey: 10, GeographicTypeGeoKey: 4326 })).toThrow(/transformation 10/);
  });
});

import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { WGS84, createTransform, crsFromEpsg } from '../../terrain/crs';
import { crsFromGeoKeys } from '../../terrain/geokeys';
import { readDemHeader } from '../../terrain/dem';
import { pixelToMap } from '../../terrain/grid';

// GeoTIFFs in user-defined CRSs written by GDAL 3.6.2, and where GDAL (with PROJ 9.1.1) places their corners and
// centre: gdaltransform -t_srs EPSG:4326 (commands recorded in the reference). Made by
// tests/fixtures/dem/make-crs-fixtures.py.
const ref = JSON.parse(readFileSync(new URL('../fixtures/dem/crs-reference.json', import.meta.url), 'utf8')) as {
  tool: string;
  grids: Array<{ file: string; what: string; command: string; places: Array<{ col: number; row: number; lon: number; lat: number }> }>;
};
const fixture = (name: string) => readFileSync(new URL(`../fixtures/dem/${name}`, import.meta.url));
// cs2cs 9.1.1 reference points for EPSG:32633 (tests/fixtures/crs/cs2cs.json, made by make-references.sh)
const cs2cs = JSON.parse(readFileSync(new URL('../fixtures/crs/cs2cs.json', import.meta.url), 'utf8')) as {
  points: Array<{ epsg: number; lon: number; lat: number; x: number; y: number }>;
};

describe('user-defined GeoTIFF CRSs against GDAL', () => {
  for (const g of ref.grids) {
    it(`places ${g.file} (${g.what}) within 1 cm of ${ref.tool}`, async () => {
      const h = await readDemHeader(fixture(g.file));
      const t = createTransform(h.crs, WGS84);
      for (const p of g.places) {
        const [x, y] = pixelToMap(h.transform, p.col, p.row);
        const [lon, lat] = t.forward(x, y);
        const dx = (lon - p.lon) * 111320 * Math.cos((p.lat * Math.PI) / 180), dy = (lat - p.lat) * 111320;
        expect(Math.hypot(dx, dy), `${g.file} pixel ${p.col},${p.row} [${g.command}]`).toBeLessThan(0.01);
      }
    });
  }
});

describe('UTM declared only through ProjectionGeoKey', () => {
  it('reads ProjectionGeoKey 16033 on WGS 84 as EPSG:32633 and matches cs2cs', () => {
    const crs = crsFromGeoKeys({ GTModelTypeGeoKey: 1, ProjectedCSTypeGeoKey: 32767, ProjectionGeoKey: 16033, GeographicTypeGeoKey: 4326, ProjLinearUnitsGeoKey: 9001 });
    expect(crs).toEqual(crsFromEpsg(32633));
    for (const p of cs2cs.points.filter((q) => q.epsg === 32633)) {
      const [x, y] = createTransform(WGS84, crs).forward(p.lon, p.lat);
      expect(Math.abs(x - p.x)).toBeLessThan(0.01);
      expect(Math.abs(y - p.y)).toBeLessThan(0.01);
    }
  });

  it('reads a southern zone (ProjectionGeoKey 16155) and refuses other conversion codes naming them', () => {
    expect(crsFromGeoKeys({ GTModelTypeGeoKey: 1, ProjectionGeoKey: 16155, GeographicTypeGeoKey: 4326 }).epsg).toBe(32755);
    expect(() => crsFromGeoKeys({ GTModelTypeGeoKey: 1, ProjectedCSTypeGeoKey: 32767, ProjectionGeoKey: 10101, GeographicTypeGeoKey: 4326 })).toThrow(/EPSG conversion 10101.*only for UTM zones/);
  });
});

describe('user-defined keys that cannot be placed', () => {
  it('refuses a projection method it does not read, naming it', () => {
    expect(() => crsFromGeoKeys({ GTModelTypeGeoKey: 1, ProjectedCSTypeGeoKey: 32767, ProjCoordTransGeoKey: 3, GeographicTypeGeoKey: 4326 })).toThrow(/transformation 3, Hotine Oblique Mercator/);
  });

  it('refuses a datum of its own without a shift to WGS 84 (PROJ would apply none)', () => {
    expect(() => crsFromGeoKeys({ GTModelTypeGeoKey: 2, GeographicTypeGeoKey: 32767, GeogGeodeticDatumGeoKey: 32767, GeogEllipsoidGeoKey: 32767, GeogSemiMajorAxisGeoKey: 6378206.4, GeogInvFlatteningGeoKey: 294.9786982 })).toThrow(/own datum without a shift to WGS 84/);
  });
});

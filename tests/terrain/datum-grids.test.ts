import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { WGS84, createTransform, crsFromEpsg } from '../../terrain/crs';
import { datumGridFiles } from '../../terrain/epsg-table';
import { loadDatumGrids } from '../../server/analysis/datum-grids';

// Reference points by PROJ 9.1.1 cs2cs (Debian proj-bin, proj-data in /usr/share/proj, no network);
// tests/fixtures/datum-grids/make-cs2cs.py made cs2cs.json, each case with its two commands beside it
const ref = JSON.parse(readFileSync(new URL('../fixtures/datum-grids/cs2cs.json', import.meta.url), 'utf8'));
type Case = { epsg: number; via: string; x: number; y: number; lon: number; lat: number; backX: number; backY: number; forward: string };

/** Ground distance in metres between two lon/lat points a few centimetres apart (sphere of the mean radius). */
const metresLonLat = (lon1: number, lat1: number, lon2: number, lat2: number) =>
  Math.hypot((lon1 - lon2) * Math.cos((lat1 * Math.PI) / 180), lat1 - lat2) * ((Math.PI / 180) * 6_371_000);

describe('CRSs whose datum shift is an NTv2 grid of Debian proj-data', () => {
  it('are refused, naming the grid file, while the grid is not loaded', () => {
    const empty = mkdtempSync(join(tmpdir(), 'loftline-grids-'));
    const r = loadDatumGrids(empty);
    expect(r.loaded).toEqual([]);
    expect(r.missing).toEqual(datumGridFiles());
    expect(r.missing).toEqual(expect.arrayContaining(['BETA2007.gsb', 'nzgd2kgrid0005.gsb', 'ntf_r93.gsb']));
    expect(() => crsFromEpsg(31467)).toThrow(/DHDN \/ 3-degree Gauss-Kruger zone 3 needs the datum-shift grid BETA2007\.gsb, which is not loaded/);
    expect(() => crsFromEpsg(27200)).toThrow(/nzgd2kgrid0005\.gsb/);
    // NTF's grid is its first shift in PROJ's order: refused, not silently shifted by its Helmert instead
    expect(() => crsFromEpsg(4275)).toThrow(/ntf_r93\.gsb.*DATUM_GRID_DIR/);
  });

  it('load from the grid directory (Debian proj-data in /usr/share/proj)', () => {
    const r = loadDatumGrids('/usr/share/proj');
    expect(r.missing).toEqual([]);
    expect(r.loaded).toEqual(datumGridFiles());
  });

  it.each(ref.cases as Case[])('EPSG:$epsg ($x, $y) via $via lands within 1 cm of cs2cs, both ways', (c) => {
    const crs = crsFromEpsg(c.epsg);
    const t = createTransform(crs, WGS84);
    const [lon, lat] = t.forward(c.x, c.y);
    expect(metresLonLat(lon, lat, c.lon, c.lat), c.forward).toBeLessThan(0.01);
    const [bx, by] = t.inverse(c.lon, c.lat);
    const back = crs.geographic ? metresLonLat(bx, by, c.backX, c.backY) : Math.hypot(bx - c.backX, by - c.backY);
    expect(back).toBeLessThan(0.01);
  });

  it('refuse a point the grid does not cover instead of placing it unshifted', () => {
    const t = createTransform(crsFromEpsg(4314), WGS84);
    expect(() => t.forward(2.35, 48.85)).toThrow(/DHDN: no EPSG transformation to WGS 84 covers|does not cover/);
  });
});

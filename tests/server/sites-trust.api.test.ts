import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

// Files GDAL 3.6.2 wrote and that were then broken on purpose, or that GDAL reads but that hold no elevation
// (tests/fixtures/grid-trust/make-fixtures.py; GDAL's own verdicts in reference.json)
const fixture = (name: string) => fs.readFileSync(path.join('tests/fixtures/grid-trust', name));

const tmpRoot = fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-sites-trust-'));
const storageDir = path.join(tmpRoot, 'storage');
let srv: TestServer;

beforeAll(async () => {
  srv = await startTestServer({ web: false, env: { STORAGE_DIR: storageDir, STORAGE_DRIVER: 'disk' } });
});
afterAll(async () => {
  await srv?.stop();
  fs.rmSync(tmpRoot, { recursive: true, force: true });
});

async function ownProject(tag: string) {
  const c = new ApiClient(srv.url);
  const email = uniqueEmail(tag);
  await c.signUp(email, 'sites password', tag);
  await c.signIn(email, 'sites password');
  const team = (await c.post('/api/teams', { name: `Team ${tag}` })).body as { id: string };
  const project = (await c.post(`/api/teams/${team.id}/projects`, { name: `Project ${tag}` })).body as { id: string };
  return { c, teamId: team.id, base: `/api/teams/${team.id}/projects/${project.id}/sites` };
}

function upload(c: ApiClient, base: string, file: Buffer) {
  const f = new FormData();
  f.append('surfaceKind', 'bare-earth');
  f.append('verticalDatum', 'EGM96');
  f.append('file', new Blob([new Uint8Array(file)], { type: 'image/tiff' }), 'dem.tif');
  return c.request('POST', base, { body: f });
}

/** Every file under a folder (temporary part files included). */
function filesUnder(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return (fs.readdirSync(dir, { recursive: true, withFileTypes: true }) as fs.Dirent[]).filter((e) => e.isFile()).map((e) => e.name);
}

const refusals: Array<[string, string, RegExp]> = [
  ['damaged-deflate-tile.tif', 'damaged', /^The file is damaged at tile 12 of 24 \(row 2, column 4\): its DEFLATE data does not decode/],
  ['cut-deflate-tile.tif', 'damaged', /^The file is damaged at tile 6 of 24 \(row 1, column 6\)/],
  ['tile-offsets-past-end.tif', 'damaged', /^The file is damaged in its TileOffsets table: it lies past the end/],
  ['strip-offsets-past-end.tif', 'damaged', /^The file is damaged in its StripOffsets table: it lies past the end/],
  ['tile-offset-beyond-file.tif', 'damaged', /^The file is damaged at tile 10 of 24 \(row 2, column 2\)/],
  ['cut-in-last-tile.tif', 'truncated', /^The file is cut short inside tile 24 of 24/],
  ['palette.tif', 'not-elevation', /^The file is a palette \(colour-mapped\) image, not an elevation grid/],
  ['rgb-band.tif', 'not-elevation', /^The file is an RGB colour image, not an elevation grid/],
];

describe('uploading a file that is not a usable elevation grid', () => {
  it.each(refusals)('refuses %s with 422 %s, naming what is wrong, and keeps nothing', async (name, code, message) => {
    const { c, teamId, base } = await ownProject(`trust-${code}`);
    const r = await upload(c, base, fixture(name));
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe(code);
    expect(r.body.error.message).toMatch(message);
    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toEqual([]);
    expect((await c.get(base)).body.sites).toEqual([]);
  });
});

// DEMs in CRSs whose datum shift is an NTv2 grid of Debian proj-data, written by GDAL 3.6.2, and where
// gdaltransform (PROJ 9.1.1, the grid applied) puts their outlines: tests/fixtures/datum-grids/make-grids.py, grids.json
const gridRef = JSON.parse(fs.readFileSync('tests/fixtures/datum-grids/grids.json', 'utf8')) as {
  grids: Array<{ file: string; epsg: number; command: string; boundsWgs84: [number, number, number, number] }>;
};

describe('uploading a grid whose datum shift is an NTv2 grid', () => {
  it.each(gridRef.grids)('places $file (EPSG:$epsg) within 1 cm of gdaltransform', async (g) => {
    const { c, base } = await ownProject(`grid-${g.epsg}`);
    const r = await upload(c, base, fs.readFileSync(path.join('tests/fixtures/datum-grids', g.file)));
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    const meta = r.body.metadata as { crs: { epsg: number }; boundsWgs84: [number, number, number, number] };
    expect(meta.crs.epsg).toBe(g.epsg);
    const lat = (g.boundsWgs84[1] + g.boundsWgs84[3]) / 2;
    const mPerDegLat = 111_000, mPerDegLon = 111_000 * Math.cos((lat * Math.PI) / 180);
    for (let k = 0; k < 4; k++) {
      const m = Math.abs(meta.boundsWgs84[k] - g.boundsWgs84[k]) * (k % 2 === 0 ? mPerDegLon : mPerDegLat);
      expect(m, `${g.command}: bound ${k}`).toBeLessThan(0.01);
    }
  });
});

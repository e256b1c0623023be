import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import type { Storage } from '../../server/storage/storage';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../contracts/roles';
import { demoClients, demoTeamId } from '../support/demo';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

const demBytes = fs.readFileSync('datasets/harrow-fell-dem.tif');
const fixture = (name: string) => fs.readFileSync(path.join('tests/fixtures/dem', name));
// GDAL 3.6.2's reading of the demo DEM (tests/fixtures/uploads/make-references.sh)
const gdal = JSON.parse(fs.readFileSync('tests/fixtures/uploads/harrow-fell.gdalinfo.json', 'utf8'));

const tmpRoot = fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-sites-'));
const storageDir = path.join(tmpRoot, 'storage');
let srv: TestServer;
let demo: Record<Role, ApiClient>;
let demoTeam: string;

beforeAll(async () => {
  srv = await startTestServer({ web: false, env: { STORAGE_DIR: storageDir, STORAGE_DRIVER: 'disk' } });
  demo = await demoClients(srv);
  demoTeam = await demoTeamId(srv);
});
afterAll(async () => {
  await srv?.stop();
  fs.rmSync(tmpRoot, { recursive: true, force: true });
});

/** Every file under a storage folder (temporary part files included). */
function filesUnder(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return (fs.readdirSync(dir, { recursive: true, withFileTypes: true }) as fs.Dirent[])
    .filter((e) => e.isFile())
    .map((e) => path.relative(dir, path.join(e.parentPath ?? (e as unknown as { path: string }).path, e.name)))
    .sort();
}

async function ownProject(s: TestServer, tag: string) {
  const c = new ApiClient(s.url);
  const email = uniqueEmail(tag);
  await c.signUp(email, 'sites password', tag);
  await c.signIn(email, 'sites password');
  const team = (await c.post('/api/teams', { name: `Team ${tag}` })).body as { id: string };
  const project = (await c.post(`/api/teams/${team.id}/projects`, { name: `Project ${tag}` })).body as { id: string };
  return { c, teamId: team.id, projectId: project.id, base: `/api/teams/${team.id}/projects/${project.id}/sites` };
}

function form(file: Buffer | null, fields: Record<string, string> = { surfaceKind: 'bare-earth' }, fileName = 'dem.tif'): FormData {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.append(k, v);
  if (file) f.append('file', new Blob([new Uint8Array(file)], { type: 'image/tiff' }), fileName);
  return f;
}

const upload = (c: ApiClient, base: string, file: Buffer | null, fields?: Record<string, string>, name?: string) =>
  c.request('POST', base, { body: form(file, fields, name) });

/** The width and height in a PNG's IHDR chunk (PNG spec, ISO/IEC 15948 section 11.2.2). */
function pngSize(b: Buffer): { width: number; height: number } {
  expect(b.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))).toBe(true);
  expect(b.subarray(12, 16).toString('ascii')).toBe('IHDR');
  return { width: b.readUInt32BE(16), height: b.readUInt32BE(20) };
}

describe('uploading an elevation grid', () => {
  it('stores the demo DEM and reports the metadata GDAL reads from it', async () => {
    expect(crypto.createHash('sha256').update(demBytes).digest('hex'), 'the demo DEM changed: rerun tests/fixtures/uploads/make-references.sh').toBe(gdal.sha256);
    const { c, teamId, base } = await ownProject(srv, 'good');
    const r = await upload(c, base, demBytes, { name: 'Harrow Fell', surfaceKind: 'bare-earth' }, 'harrow-fell-dem.tif');
    expect(r.status).toBe(201);
    const s = r.body;
    expect(s).toMatchObject({ name: 'Harrow Fell', fileName: 'harrow-fell-dem.tif', surfaceKind: 'bare-earth', sizeBytes: demBytes.length, sha256: gdal.sha256 });
    const [x0, dx, , y0, , dy] = gdal.geoTransform;
    const [w, h] = gdal.size;
    expect(s.metadata).toMatchObject({ width: w, height: h, resolution: [dx, -dy], bounds: [x0, y0 + h * dy, x0 + w * dx, y0] });
    expect(s.metadata.crs.epsg).toBe(gdal.epsg);
    // describeGrid rounds heights to millimetres; GDAL prints float32 values in double precision
    expect(Math.abs(s.metadata.elevation.min - gdal.min)).toBeLessThan(0.001);
    expect(Math.abs(s.metadata.elevation.max - gdal.max)).toBeLessThan(0.001);
    expect(Math.abs(s.metadata.elevation.mean - gdal.mean)).toBeLessThan(0.001);
    expect(Math.abs((1 - s.metadata.nodataShare) * 100 - gdal.validPercent)).toBeLessThan(0.006); // GDAL rounds to 2 decimals
    expect(s.file).toMatchObject({ nodata: gdal.noDataValue, declaredVerticalDatum: { epsg: 5773 } });
    // no datum stated in the form: the one the file declares is taken
    expect(s.verticalDatum).toBe(s.file.declaredVerticalDatum.name);
    // GDAL's wgs84Extent lists the corner points; our bounds follow the edges, so they hold every corner
    for (const [lon, lat] of gdal.wgs84Extent) {
      expect(lon).toBeGreaterThanOrEqual(s.metadata.boundsWgs84[0] - 1e-6);
      expect(lon).toBeLessThanOrEqual(s.metadata.boundsWgs84[2] + 1e-6);
      expect(lat).toBeGreaterThanOrEqual(s.metadata.boundsWgs84[1] - 1e-6);
      expect(lat).toBeLessThanOrEqual(s.metadata.boundsWgs84[3] + 1e-6);
    }

    const png = await fetch(srv.url + s.hillshadeUrl, { headers: { Cookie: (c as unknown as { cookieHeader(): string }).cookieHeader() } });
    expect(png.status).toBe(200);
    expect(png.headers.get('content-type')).toBe('image/png');
    expect(pngSize(Buffer.from(await png.arrayBuffer()))).toEqual({ width: s.hillshade.width, height: s.hillshade.height });
    expect(Math.max(s.hillshade.width, s.hillshade.height)).toBeLessThanOrEqual(1024);

    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toEqual([`sites/${s.id}/dem.tif`, `sites/${s.id}/hillshade.png`]);
    const stored = fs.readFileSync(path.join(storageDir, 'teams', teamId, 'sites', s.id, 'dem.tif'));
    expect(stored.equals(demBytes)).toBe(true);

    expect((await c.get(base)).body.sites.map((x: { id: string }) => x.id)).toEqual([s.id]);
    expect((await c.get(`${base}/${s.id}`)).body).toEqual(s);
  });

  it('takes the vertical datum the planner states over the one in the file', async () => {
    const { c, base } = await ownProject(srv, 'datum');
    const r = await upload(c, base, demBytes, { surfaceKind: 'surface', verticalDatum: 'Local datum HF-1' });
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ verticalDatum: 'Local datum HF-1', surfaceKind: 'surface', name: 'dem' });
  });

  const refusals: Array<[string, () => Buffer, string]> = [
    ['a file that is not a TIFF', () => fixture('not-a-tiff.tif'), 'not-tiff'],
    ['a TIFF without georeference', () => fixture('no-georeference.tif'), 'no-georeference'],
    ['a truncated TIFF', () => fixture('truncated.tif'), 'truncated'],
    ['the demo DEM cut off half way', () => demBytes.subarray(0, Math.floor(demBytes.length / 2)), 'truncated'],
    ['a grid of nothing but nodata', () => fixture('all-nodata.tif'), 'all-nodata'],
  ];
  it.each(refusals)('refuses %s with the engine\'s reason and leaves nothing behind', async (_what, bytes, code) => {
    const { c, teamId, base } = await ownProject(srv, `refuse-${code}`);
    // every form field is fine: only the file is at fault
    const r = await upload(c, base, bytes(), { surfaceKind: 'bare-earth', verticalDatum: 'EGM96' });
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe(code);
    expect(r.body.error.message.length).toBeGreaterThan(20);
    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toEqual([]);
    expect(filesUnder(path.join(storageDir, '.tmp'))).toEqual([]);
    expect((await c.get(base)).body.sites).toEqual([]);
  });

  it('refuses a missing surface kind field by field and keeps nothing', async () => {
    const { c, teamId, base } = await ownProject(srv, 'fields');
    const r = await upload(c, base, demBytes, { surfaceKind: 'forest' });
    expect(r.status).toBe(422);
    expect(r.body.error.fields).toEqual([{ path: 'surfaceKind', message: expect.stringMatching(/bare-earth/) }]);
    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toEqual([]);
  });

  it('asks for the vertical datum when the file declares none', async () => {
    const { c, teamId, base } = await ownProject(srv, 'no-datum');
    const r = await upload(c, base, fixture('utm-f32-strips.tif'));
    expect(r.status).toBe(422);
    expect(r.body.error.fields[0].path).toBe('verticalDatum');
    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toEqual([]);
    const ok = await upload(c, base, fixture('utm-f32-strips.tif'), { surfaceKind: 'bare-earth', verticalDatum: 'EGM96' });
    expect(ok.status).toBe(201);
  });

  it('refuses a form without a file, and a JSON body', async () => {
    const { c, teamId, base } = await ownProject(srv, 'no-file');
    const r = await upload(c, base, null);
    expect(r.status).toBe(422);
    expect(r.body.error.fields[0].path).toBe('file');
    const j = await c.post(base, { surfaceKind: 'bare-earth' });
    expect(j.status).toBe(415);
    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toEqual([]);
  });

  it('recognises the same DEM uploaded twice by its checksum and removes the copy', async () => {
    const { c, teamId, base } = await ownProject(srv, 'dup');
    const first = await upload(c, base, demBytes);
    const again = await upload(c, base, demBytes, { surfaceKind: 'bare-earth', name: 'Same again' }, 'renamed.tif');
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({ code: 'duplicate_site', existingSiteId: first.body.id });
    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toEqual([`sites/${first.body.id}/dem.tif`, `sites/${first.body.id}/hillshade.png`]);
    expect((await c.get(base)).body.sites).toHaveLength(1);
  });

  it('accepts the same DEM in another project (duplicates are per project)', async () => {
    const a = await ownProject(srv, 'dup-a');
    const other = (await a.c.post(`/api/teams/${a.teamId}/projects`, { name: 'Second project' })).body;
    expect((await upload(a.c, a.base, demBytes)).status).toBe(201);
    expect((await upload(a.c, `/api/teams/${a.teamId}/projects/${other.id}/sites`, demBytes)).status).toBe(201);
  });

  it('refuses uploads into an archived project before reading the file', async () => {
    const { c, teamId, projectId, base } = await ownProject(srv, 'archived');
    await c.patch(`/api/teams/${teamId}/projects/${projectId}`, { archived: true });
    const r = await upload(c, base, demBytes);
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe('project_archived');
    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toEqual([]);
  });
});

describe('the upload size limit', () => {
  let small: TestServer;
  const smallDir = path.join(tmpRoot, 'small-storage');
  beforeAll(async () => {
    small = await startTestServer({ web: false, env: { STORAGE_DIR: smallDir, STORAGE_DRIVER: 'disk', UPLOAD_LIMIT_MB: '0.25' } });
  });
  afterAll(async () => small?.stop());

  it('answers 413 while streaming a file over the limit and keeps no part of it', async () => {
    const { c, teamId, base } = await ownProject(small, 'limit');
    const r = await upload(c, base, demBytes); // 1.5 MB against 0.25 MB
    expect(r.status).toBe(413);
    expect(r.body.error.code).toBe('too_large');
    expect(r.body.error.message).toMatch(/256 KB/);
    expect(filesUnder(smallDir)).toEqual([]);
    expect((await c.get(base)).body.sites).toEqual([]);
    // the same server still takes a file under the limit
    expect((await upload(c, base, fixture('tiled-deflate-fp.tif'), { surfaceKind: 'bare-earth', verticalDatum: 'EGM96' })).status).toBe(201);
  });
});

describe('reading and editing a site', () => {
  it('serves the stored DEM back byte for byte and renames the site', async () => {
    const { c, base } = await ownProject(srv, 'download');
    const s = (await upload(c, base, demBytes, undefined, 'harrow fell (copy).tif')).body;
    const res = await fetch(`${srv.url}${base}/${s.id}/dem.tif`, { headers: { Cookie: (c as unknown as { cookieHeader(): string }).cookieHeader() } });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-disposition')).toBe('attachment; filename="harrow_fell__copy_.tif"');
    expect(Buffer.from(await res.arrayBuffer()).equals(demBytes)).toBe(true);
    const renamed = await c.patch(`${base}/${s.id}`, { name: 'Harrow Fell, March flight' });
    expect(renamed.status).toBe(200);
    expect(renamed.body).toMatchObject({ name: 'Harrow Fell, March flight', sha256: s.sha256 });
    expect((await c.patch(`${base}/${s.id}`, { surfaceKind: 'lidar' })).status).toBe(422);
  });
});

describe('deleting a site', () => {
  it('removes the row and its stored files', async () => {
    const { c, teamId, base } = await ownProject(srv, 'delete');
    const s = (await upload(c, base, demBytes)).body;
    expect((await c.delete(`${base}/${s.id}`)).status).toBe(204);
    expect((await c.get(`${base}/${s.id}`)).status).toBe(404);
    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toEqual([]);
  });

  it('refuses while a plan uses the site', async () => {
    const { c, teamId, projectId, base } = await ownProject(srv, 'in-use');
    const s = (await upload(c, base, demBytes)).body;
    await srv.db.$client.query(`insert into plan (team_id, project_id, site_id, name, input) values ($1, $2, $3, 'Uses it', '{}')`, [teamId, projectId, s.id]);
    const r = await c.delete(`${base}/${s.id}`);
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe('site_in_use');
    expect((await c.get(`${base}/${s.id}`)).body.planCount).toBe(1);
    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toHaveLength(2);
  });
});

describe('site roles and team isolation', () => {
  it('lets the surveyor read sites but not upload; the pilot sees none', async () => {
    const project = (await demo.planner.post(`/api/teams/${demoTeam}/projects`, { name: `Sites roles ${crypto.randomUUID().slice(0, 6)}` })).body;
    const base = `/api/teams/${demoTeam}/projects/${project.id}/sites`;
    const s = (await upload(demo.planner, base, demBytes)).body;
    expect((await demo.surveyor.get(`${base}/${s.id}`)).status).toBe(200);
    expect((await demo.surveyor.get(`${base}/${s.id}/hillshade.png`)).status).toBe(200);
    const refused = await upload(demo.surveyor, base, fixture('tiled-deflate-fp.tif'));
    expect(refused.status).toBe(403);
    expect((await demo.surveyor.delete(`${base}/${s.id}`)).status).toBe(403);
    expect((await demo.pilot.get(base)).status).toBe(403);
    expect((await demo.pilot.get(`${base}/${s.id}/hillshade.png`)).status).toBe(403);
    expect(filesUnder(path.join(storageDir, 'teams', demoTeam)).filter((f) => !f.startsWith(`sites/${s.id}/`))).toEqual([]);
  });

  it('hides one team\'s sites from another, even with the exact ids', async () => {
    const a = await ownProject(srv, 'iso-a');
    const b = await ownProject(srv, 'iso-b');
    const s = (await upload(a.c, a.base, demBytes)).body;
    // b's own team route with a's project and site ids
    const crossed = `/api/teams/${b.teamId}/projects/${a.projectId}/sites`;
    expect((await b.c.get(crossed)).status).toBe(404);
    expect((await b.c.get(`${crossed}/${s.id}`)).status).toBe(404);
    expect((await b.c.get(`${b.base}/${s.id}`)).status).toBe(404);
    expect((await b.c.get(`${b.base}/${s.id}/hillshade.png`)).status).toBe(404);
    expect((await b.c.delete(`${b.base}/${s.id}`)).status).toBe(404);
    expect((await upload(b.c, crossed, fixture('tiled-deflate-fp.tif'))).status).toBe(404);
    // a's team route is closed to b
    expect((await b.c.get(`${a.base}/${s.id}`)).status).toBe(404);
    expect((await a.c.get(`${a.base}/${s.id}`)).status).toBe(200);
  });
});

describe('uploads into S3-compatible storage (s3rver)', () => {
  let s3: S3rver;
  let s3srv: TestServer;
  let s3Port: number;
  let bucketDir: string;
  beforeAll(async () => {
    bucketDir = path.join(tmpRoot, 's3rver');
    s3 = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory: bucketDir, configureBuckets: [{ name: 'loftline-sites' }] });
    const { port } = (await s3.run()) as { port: number };
    s3Port = port;
    s3srv = await startTestServer({
      web: false,
      env: { STORAGE_DRIVER: 's3', S3_ENDPOINT: `http://127.0.0.1:${port}`, S3_BUCKET: 'loftline-sites', S3_ACCESS_KEY_ID: 'S3RVER', S3_SECRET_ACCESS_KEY: 'S3RVER', UPLOAD_LIMIT_MB: '1' },
    });
  });
  afterAll(async () => {
    await s3srv?.stop();
    await s3?.close();
  });

  it('stores an accepted grid in the bucket and leaves the bucket clean after refusals', async () => {
    const { c, teamId, base } = await ownProject(s3srv, 's3');
    const storage = s3srv.services.storage as { list(prefix: string): Promise<string[]> };
    expect((await upload(c, base, fixture('not-a-tiff.tif'))).status).toBe(422);
    expect((await upload(c, base, demBytes)).status).toBe(413); // 1.5 MB against 1 MB
    expect(await storage.list(`teams/${teamId}/`)).toEqual([]);
    const ok = await upload(c, base, fixture('tiled-deflate-fp.tif'), { surfaceKind: 'bare-earth', verticalDatum: 'EGM96' });
    expect(ok.status).toBe(201);
    expect(await storage.list(`teams/${teamId}/`)).toEqual([`teams/${teamId}/sites/${ok.body.id}/dem.tif`, `teams/${teamId}/sites/${ok.body.id}/hillshade.png`]);
    const png = await c.get(`${base}/${ok.body.id}/hillshade.png`);
    expect(png.status).toBe(200);
  });

  it('analyses a plan over a grid in the bucket, reading it by ranged GETs', { timeout: 120_000 }, async () => {
    const big = await startTestServer({
      web: false,
      env: { STORAGE_DRIVER: 's3', S3_ENDPOINT: `http://127.0.0.1:${s3Port}`, S3_BUCKET: 'loftline-sites', S3_ACCESS_KEY_ID: 'S3RVER', S3_SECRET_ACCESS_KEY: 'S3RVER', WORKERS: '1', ANALYSIS_QUEUE: 'plan-analysis-s3-ranges' },
    });
    try {
      const store = big.services.storage as Storage;
      const ranges: Array<[number, number]> = [];
      const open = store.openRanges!.bind(store);
      // count what the analysis fetches (the store's own ranged GETs underneath)
      store.openRanges = async (key) => {
        const r = await open(key);
        return { byteLength: r.byteLength, read: (o, l) => (ranges.push([o, l]), r.read(o, l)) };
      };
      const { c, teamId, base } = await ownProject(big, 's3-ranges');
      store.getBytes = async (key) => {
        throw new Error(`the upload check or the analysis read ${key} whole`);
      };
      const site = await upload(c, base, demBytes);
      expect(site.status).toBe(201);
      // the upload check read the stored grid by ranged GETs too, block by block, never the whole file at once
      expect(ranges.length).toBeGreaterThan(2);
      expect(Math.max(...ranges.map(([, l]) => l))).toBeLessThan(demBytes.length / 4);
      ranges.length = 0;
      const projectBase = base.replace(/\/sites$/, '');
      const input = {
        area: { type: 'Polygon', coordinates: [[[4.475, 46.768], [4.480, 46.768], [4.480, 46.771], [4.475, 46.771], [4.475, 46.768]]] },
        camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 },
        targetGsdCm: 2.5,
        takeoff: { lon: 4.478, lat: 46.769 },
      };
      const plan = (await c.post(`${projectBase}/plans`, { name: 'From the bucket', siteId: site.body.id, input })).body;
      const run = (await c.post(`/api/teams/${teamId}/plans/${plan.id}/runs`, {})).body;
      let status: { analysisState: string; analysisError: string | null } = { analysisState: 'queued', analysisError: null };
      for (let t0 = Date.now(); Date.now() - t0 < 90_000; ) {
        status = (await c.get(`/api/teams/${teamId}/plans/${plan.id}/versions/${run.id}/status`)).body;
        if (status.analysisState === 'done' || status.analysisState === 'failed') break;
        await new Promise((r) => setTimeout(r, 250));
      }
      expect(status).toMatchObject({ analysisState: 'done' });
      const fetched = ranges.reduce((n, [, l]) => n + l, 0);
      expect(ranges.length).toBeGreaterThan(2); // the header, then blocks one by one
      expect(fetched).toBeLessThan(demBytes.length * 0.6); // the tiles under the area, not the whole 1.47 MB grid
    } finally {
      await big.stop();
    }
  });
});

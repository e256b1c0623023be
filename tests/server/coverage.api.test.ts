/**
 * A version's coverage over real HTTP: the seeded demo's run states the client's spec and attitude envelope, its
 * figures equal the command line's for the same mission and grid, and the downloaded raster is a Cloud-Optimised
 * GeoTIFF whose values GDAL reads as the API reports them (GDAL 3.6.2 from Debian: gdalinfo,
 * gdallocationinfo, the Python bindings with numpy, validate_cloud_optimized_geotiff.py).
 */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pngjs from 'pngjs';
import { complianceReportSchema } from '../../contracts/reports';
import { shareWords } from '../../contracts/coverage-words';
import { pdfText } from '../reports/pdf-text';
import { coverageCellSchema, versionCoverageSchema, type VersionCoverage } from '../../contracts/coverage';
import { run as runCoverageCli } from '../../cli/coverage';
import type { Role } from '../../contracts/roles';
import { demoClients, demoTeamId } from '../support/demo';
import { demoProject } from '../../server/seed/demo-project';
import type { ApiClient } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

let srv: TestServer;
let clients: Record<Role, ApiClient>;
let versionPath: string;
let coverage: Extract<VersionCoverage, { state: 'ready' }>;
let input: Record<string, unknown>;
let projectId: string;
let siteId: string;
let team: string;
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-coverage-api-'));

beforeAll(async () => {
  srv = await startTestServer({ web: false, env: { WORKERS: '1', JOBS_POLL_SECONDS: '0.5' } });
  clients = await demoClients(srv);
  const teamId = await demoTeamId(srv);
  const projects = (await clients.surveyor.get(`/api/teams/${teamId}/projects`)).body.projects;
  // Other suites add projects and plans to the demo team; pick the seeded ones by name.
  projectId = projects.find((p: { name: string }) => p.name === demoProject.name).id as string;
  team = teamId;
  const plan = (await clients.surveyor.get(`/api/teams/${teamId}/projects/${projectId}/plans`)).body.plans.find((p: { name: string }) => p.name === demoProject.planName);
  const versions = (await clients.surveyor.get(`/api/teams/${teamId}/plans/${plan.id}/versions`)).body.versions;
  siteId = plan.siteId as string;
  const first = versions.find((v: { number: number }) => v.number === 1);
  versionPath = `/api/teams/${teamId}/plans/${plan.id}/versions/${first.id}`;
  input = (await clients.surveyor.get(versionPath)).body.input;
  const r = await clients.surveyor.get(`${versionPath}/coverage`);
  expect(r.status).toBe(200);
  const parsed = versionCoverageSchema.parse(r.body);
  if (parsed.state !== 'ready') throw new Error(`The demo version's coverage is not ready: ${JSON.stringify(parsed)}`);
  coverage = parsed;
});
afterAll(async () => srv?.stop());

async function download(c: ApiClient, url: string, file: string): Promise<Response> {
  const res = await fetch(new URL(url, srv.url), { headers: { cookie: c.cookieHeader() } });
  if (res.ok) fs.writeFileSync(path.join(dir, file), Buffer.from(await res.arrayBuffer()));
  return res;
}

describe('coverage of the demo version', () => {
  it('holds the spec and the attitude envelope the demo mission states, with a share per item', () => {
    const d = coverage.document;
    expect(d.spec).toMatchObject({ maxGsdCm: 2.5, minViews: 5 });
    expect(d.spec.basis).toMatch(/^guaranteed/);
    expect(d.envelope).toMatchObject({ rollDeg: 5, windMps: 6, windFromDeg: 250 });
    expect(d.compliance.items.map((i) => i.item)).toEqual(['gsd', 'views']);
    for (const it of d.compliance.items) expect(it.failingAreaM2).toBeCloseTo((1 - it.share) * d.compliance.areaM2, -1);
    expect(d.patchCount).toBeGreaterThan(0);
    expect(coverage.layers.map((l) => l.measure)).toEqual(['gsd', 'views', 'sigma']);
  });

  it('equals the command line\'s document for the same mission and grid', async () => {
    const missionFile = path.join(dir, 'mission.json');
    fs.writeFileSync(missionFile, JSON.stringify(input));
    const cli = (await runCoverageCli(['datasets/harrow-fell-dem.tif', '--mission', missionFile, '--out', path.join(dir, 'cli.tif')])) as Record<string, unknown>;
    const { timingMs: _a, ...api } = coverage.document;
    const { timingMs: _b, cautions: _c, raster: cliRaster, ...rest } = cli as Record<string, unknown> & { raster: Record<string, unknown> };
    const { path: _p, ...cliRasterFields } = cliRaster;
    expect({ ...rest, raster: cliRasterFields }).toEqual(api);
  });

  it('downloads as a Cloud-Optimised GeoTIFF that GDAL validates and reads with the values the API reports', async () => {
    const res = await download(clients.surveyor, coverage.rasterUrl, 'coverage.tif');
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('image/tiff');
    expect(res.headers.get('content-disposition')).toMatch(/attachment; filename=".*-v1-coverage\.tif"/);
    const file = path.join(dir, 'coverage.tif');
    // GDAL 3.6.2 validate_cloud_optimized_geotiff.py (Debian python3-gdal)
    const valid = execFileSync('/usr/bin/python3', ['-m', 'osgeo_utils.samples.validate_cloud_optimized_geotiff', file], { encoding: 'utf8' });
    expect(valid).toContain('is a valid cloud optimized GeoTIFF');
    const info = JSON.parse(execFileSync('gdalinfo', ['-json', file], { encoding: 'utf8' }));
    const d = coverage.document;
    expect(info.size).toEqual([d.raster.width, d.raster.height]);
    expect(info.geoTransform).toEqual(d.raster.geotransform);
    expect(info.bands.map((b: { description: string }) => b.description)).toEqual(d.raster.bands);
    // Shares per item recomputed from the file by GDAL's Python bindings and numpy (cells with data = in the area).
    const script = [
      'import sys, json, numpy as np',
      'from osgeo import gdal',
      'ds = gdal.Open(sys.argv[1])',
      'views = ds.GetRasterBand(1).ReadAsArray(); gsd = ds.GetRasterBand(2).ReadAsArray()',
      'inside = views != ds.GetRasterBand(1).GetNoDataValue()',
      'n = int(inside.sum())',
      'gsd_ok = np.logical_and(inside, np.nan_to_num(gsd, nan=1e9) <= float(sys.argv[2]))',
      'views_ok = np.logical_and(inside, views >= float(sys.argv[3]))',
      'print(json.dumps({"n": n, "gsd": float(gsd_ok.sum()) / n, "views": float(views_ok.sum()) / n}))',
    ].join('\n');
    const gdal = JSON.parse(execFileSync('/usr/bin/python3', ['-c', script, file, String(d.spec.maxGsdCm), String(d.spec.minViews)], { encoding: 'utf8' }));
    expect(gdal.n).toBe(d.compliance.cellsInArea);
    const share = (k: string) => d.compliance.items.find((i) => i.item === k)!.share;
    // The ground of the demo grid is known everywhere in the area, so the file's shares are the items' shares.
    expect(gdal.gsd).toBeCloseTo(share('gsd'), 5);
    expect(gdal.views).toBeCloseTo(share('views'), 5);
  });

  it('answers a tapped point with the cell GDAL reads at that longitude and latitude', async () => {
    await download(clients.surveyor, coverage.rasterUrl, 'coverage.tif');
    const p = coverage.document.patches[0].centroid;
    const points = [p, { lon: 4.4862, lat: 46.7685 }, { lon: 4.4835, lat: 46.7672 }];
    for (const pt of points) {
      const r = await clients.planner.get(`${versionPath}/coverage/cell?lon=${pt.lon}&lat=${pt.lat}`);
      expect(r.status).toBe(200);
      const cell = coverageCellSchema.parse(r.body);
      // gdallocationinfo -wgs84 (GDAL 3.6.2) reads the cell under a WGS 84 point, one band at a time
      const gdal = [1, 2, 4].map((b) => execFileSync('gdallocationinfo', ['-valonly', '-wgs84', '-b', String(b), path.join(dir, 'coverage.tif'), String(pt.lon), String(pt.lat)], { encoding: 'utf8' }).trim());
      expect(cell.inside).toBe(true);
      expect(cell.views).toBe(Number(gdal[0]));
      if (cell.finestGsdCm === null) expect(gdal[1]).toMatch(/nan/i);
      else expect(cell.finestGsdCm).toBeCloseTo(Number(gdal[1]), 4);
      if (cell.maxRayAngleDeg !== null) expect(cell.maxRayAngleDeg).toBeCloseTo(Number(gdal[2]), 3);
      const d = coverage.document.spec;
      expect(cell.fails.some((f) => f.startsWith('fewer than'))).toBe(cell.views! < d.minViews);
    }
    const largest = coverage.document.patches[0];
    expect(largest.reason).toMatch(/gsd|views/);
    const out = clients.planner.get(`${versionPath}/coverage/cell?lon=10&lat=50`);
    expect(coverageCellSchema.parse((await out).body)).toMatchObject({ inside: false, views: null, fails: [] });
    const bad = await clients.planner.get(`${versionPath}/coverage/cell?lon=4.48&lat=95`);
    expect(bad.status).toBe(422);
    expect(JSON.stringify(bad.body)).toContain('lat must be from -90 to 90');
  });

  it('serves the map layers as one pixel per cell, transparent outside the area, failing cells in the mask', async () => {
    const { PNG } = pngjs as unknown as typeof import('pngjs');
    const d = coverage.document;
    for (const l of coverage.layers) {
      const res = await download(clients.surveyor, l.imageUrl, `${l.measure}.png`);
      expect(res.status).toBe(200);
      expect(res.headers.get('content-type')).toBe('image/png');
      const img = PNG.sync.read(fs.readFileSync(path.join(dir, `${l.measure}.png`)));
      expect([img.width, img.height]).toEqual([d.raster.width, d.raster.height]);
      expect(img.data[3]).toBe(0); // the top-left corner of the bounding box is outside the area
      expect(l.stops[0].colour).toMatch(/^#[0-9a-f]{6}$/);
    }
    // viridis end colours #440154 and #fde725: matplotlib's published viridis table (_cm_listed.py, first and last rows)
    const gsd = coverage.layers.find((l) => l.measure === 'gsd')!;
    expect(gsd.stops[0].colour).toBe('#fde725'); // finer is better: the light end
    expect(gsd.stops[gsd.stops.length - 1].colour).toBe('#440154');
    await download(clients.surveyor, coverage.failingImageUrl, 'failing.png');
    const mask = PNG.sync.read(fs.readFileSync(path.join(dir, 'failing.png')));
    let failing = 0;
    for (let i = 3; i < mask.data.length; i += 4) if (mask.data[i] === 255) failing++;
    expect(failing / d.compliance.cellsInArea).toBeCloseTo(1 - d.compliance.shareAll, 5);
  });

  it('puts the ground proof in the compliance report and its PDF, one requirement per item, with the printed map', async () => {
    const report = complianceReportSchema.parse((await clients.surveyor.get(`${versionPath}/report`)).body);
    const d = coverage.document;
    expect(report.coverage.state).toBe('ready');
    expect(report.coverage.items.map((i) => [i.item, i.share])).toEqual(d.compliance.items.map((i) => [i.item, i.share]));
    const cells = report.checks.filter((c) => c.key.startsWith('cells-'));
    expect(cells.map((c) => c.key)).toEqual(d.compliance.items.map((i) => `cells-${i.item}`));
    for (const c of cells) {
      const it = d.compliance.items.find((i) => `cells-${i.item}` === c.key)!;
      expect(c.pass).toBe(it.share >= 1);
      expect(c.achieved).toContain(shareWords(it.share));
    }
    const pdf = await clients.surveyor.getBytes(`${versionPath}/report.pdf`);
    expect(pdf.status).toBe(200);
    const file = path.join(dir, 'report.pdf');
    fs.writeFileSync(file, pdf.bytes);
    // pdftotext and pdfimages from Debian's poppler-utils read the PDF back
    const text = pdfText(pdf.bytes);
    expect(text).toContain('Ground proof: the spec in every ground cell');
    expect(text).toContain(`${shareWords(d.compliance.shareAll)} of the area`);
    const images = execFileSync('pdfimages', ['-list', file], { encoding: 'utf8' }).trim().split('\n').slice(2);
    expect(images.length).toBeGreaterThanOrEqual(1);
  });

  it('lets every role that reads plans see it, and no one outside the team', async () => {
    for (const role of ['owner', 'planner', 'surveyor'] as const) expect((await clients[role].get(`${versionPath}/coverage`)).status).toBe(200);
    expect((await clients.pilot.get(`${versionPath}/coverage`)).status).toBe(403);
    const res = await fetch(new URL(coverage.rasterUrl, srv.url));
    expect(res.status).toBe(401);
  });
});

describe('coverage of a new run', () => {
  it('refuses a spec out of range when the plan is saved, naming the field, and keeps nothing', async () => {
    const before = (await clients.planner.get(`/api/teams/${team}/projects/${projectId}/plans`)).body.plans.length;
    const r = await clients.planner.post(`/api/teams/${team}/projects/${projectId}/plans`, { name: 'Bad spec', siteId, input: { ...input, spec: { maxGsdCm: 2.5, minViews: 0 } } });
    expect(r.status).toBe(422);
    expect(JSON.stringify(r.body)).toContain('spec.minViews must be a number from 1 to 100.');
    expect((await clients.planner.get(`/api/teams/${team}/projects/${projectId}/plans`)).body.plans.length).toBe(before);
  });

  it('keeps the plan\'s analysis when the coverage run is refused, and says why and what to change', async () => {
    const p = await clients.planner.post(`/api/teams/${team}/projects/${projectId}/plans`, { name: 'Tiny raster limit', siteId, input: { ...input, coverage: { maxCells: 1000 } } });
    expect(p.status).toBe(201);
    const plan = `/api/teams/${team}/plans/${p.body.id}`;
    const run = await clients.planner.post(`${plan}/runs`, {});
    expect(run.status).toBe(202);
    const t0 = Date.now();
    let state = '';
    while (Date.now() - t0 < 60_000) {
      state = (await clients.planner.get(`${plan}/versions/${run.body.id}/status`)).body.analysisState;
      if (state === 'done' || state === 'failed') break;
      await new Promise((r) => setTimeout(r, 250));
    }
    expect(state).toBe('done');
    const cov = versionCoverageSchema.parse((await clients.planner.get(`${plan}/versions/${run.body.id}/coverage`)).body);
    expect(cov.state).toBe('refused');
    if (cov.state === 'refused') expect(cov.reason).toMatch(/1,000|cell/);
    const tif = await clients.planner.get(`${plan}/versions/${run.body.id}/coverage.tif`);
    expect(tif.status).toBe(409);
    expect(tif.body.error.code).toBe('coverage_unavailable');
    expect((await clients.planner.delete(plan)).status).toBe(204);
  });
});

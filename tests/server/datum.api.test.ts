import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readDemHeader } from '../../terrain/dem';
import { analysisDatum } from '../../server/analysis/terrain-tasks';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

const demBytes = fs.readFileSync('datasets/harrow-fell-dem.tif');
const mission = {
  area: { type: 'Polygon', coordinates: [[[4.48, 46.766], [4.487, 46.766], [4.487, 46.77], [4.48, 46.77], [4.48, 46.766]]] },
  camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 },
  targetGsdCm: 3,
  headingDeg: 90,
  takeoff: { lon: 4.478, lat: 46.768 },
};

let srv: TestServer;
beforeAll(async () => {
  srv = await startTestServer({ web: false, env: { WORKERS: '1', JOBS_POLL_SECONDS: '0.5' } });
});
afterAll(async () => srv?.stop());

/** A site uploaded with `verticalDatum` (or the file's own when null), a plan over it, one finished run. */
async function analysedOver(tag: string, verticalDatum: string | null) {
  const c = new ApiClient(srv.url);
  const email = uniqueEmail(tag);
  await c.signUp(email, 'datum password', tag);
  await c.signIn(email, 'datum password');
  const teamId = (await c.post('/api/teams', { name: `Team ${tag}` })).body.id as string;
  const projectId = (await c.post(`/api/teams/${teamId}/projects`, { name: `Project ${tag}` })).body.id as string;
  const f = new FormData();
  f.append('surfaceKind', 'bare-earth');
  if (verticalDatum) f.append('verticalDatum', verticalDatum);
  f.append('file', new Blob([new Uint8Array(demBytes)]), 'harrow-fell-dem.tif');
  const site = (await c.request('POST', `/api/teams/${teamId}/projects/${projectId}/sites`, { body: f })).body;
  expect(site.verticalDatum).toBeTruthy();
  const p = await c.post(`/api/teams/${teamId}/projects/${projectId}/plans`, { name: `Plan ${tag}`, siteId: site.id, input: mission });
  const plan = `/api/teams/${teamId}/plans/${p.body.id}`;
  const run = await c.post(`${plan}/runs`, {});
  expect(run.status).toBe(202);
  const t0 = Date.now();
  for (;;) {
    const s = (await c.get(`${plan}/versions/${run.body.id}/status`)).body;
    if (s.analysisState === 'done') break;
    if (s.analysisState === 'failed' || Date.now() - t0 > 90_000) throw new Error(`analysis did not finish: ${JSON.stringify(s)}`);
    await new Promise((r) => setTimeout(r, 250));
  }
  return { c, teamId, site, version: `${plan}/versions/${run.body.id}`, versionId: run.body.id as string };
}

describe('the site\'s vertical datum, end to end', () => {
  it('reaches the stored result, the report, the leg sheet and the exports when the planner states it', { timeout: 180_000 }, async () => {
    const stated = 'EGM2008 height (EPSG:3855)';
    const w = await analysedOver('datum-stated', stated);
    const v = (await w.c.get(w.version)).body;
    expect(v.result.heights.verticalDatum).toEqual({ epsg: 3855, name: stated });
    expect(v.result.heights.datum).toContain(stated);
    expect(v.result.heights.datum).not.toMatch(/not stated/);
    const report = (await w.c.get(`${w.version}/report`)).body;
    expect(report.dem.verticalDatum).toBe(stated);
    const sheet = (await w.c.get(`/api/teams/${w.teamId}/flights/${w.versionId}/leg-sheet`)).body;
    expect(sheet.datum.name).toBe(stated);
    const g = await w.c.get(`${w.version}/export.geojson`);
    expect(g.status).toBe(200);
    const geojson = typeof g.body === 'string' ? JSON.parse(g.body) : g.body;
    expect(geojson.features.length).toBeGreaterThan(0);
    for (const feature of geojson.features) expect(feature.properties.verticalDatum).toBe(stated);
    const csv = await w.c.get(`${w.version}/export.csv`);
    expect(csv.status).toBe(200);
    expect(String(csv.body)).toContain(stated);
  });

  it('names the file\'s own datum, with its EPSG code, when the planner states none', { timeout: 180_000 }, async () => {
    const declared = (await readDemHeader(demBytes)).verticalDatum;
    expect(declared).not.toBeNull();
    const w = await analysedOver('datum-file', null);
    expect(w.site.verticalDatum).toBe(declared!.name);
    const v = (await w.c.get(w.version)).body;
    expect(v.result.heights.verticalDatum).toEqual(declared);
    expect((await w.c.get(`${w.version}/report`)).body.dem.verticalDatum).toBe(declared!.name);
  });

  it('reads an EPSG code only where the stated words give one', () => {
    expect(analysisDatum('Local datum HF-1', null)).toEqual({ epsg: null, name: 'Local datum HF-1' });
    expect(analysisDatum('NAVD88 (epsg: 5703)', { epsg: 5773, name: 'EGM96 height' })).toEqual({ epsg: 5703, name: 'NAVD88 (epsg: 5703)' });
    expect(analysisDatum('EGM96 height', { epsg: 5773, name: 'EGM96 height' })).toEqual({ epsg: 5773, name: 'EGM96 height' });
    expect(analysisDatum(null, { epsg: 5773, name: 'EGM96 height' })).toEqual({ epsg: 5773, name: 'EGM96 height' });
  });
});

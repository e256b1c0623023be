import crypto from 'node:crypto';
import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../contracts/roles';
import { demoClients, demoTeamId } from '../support/demo';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';
import { demoProject } from '../../server/seed/demo-project';

const demBytes = fs.readFileSync('datasets/harrow-fell-dem.tif');

/** A small survey over the demo grid (inside its extent lon 4.4668-4.4960, lat 46.7638-46.7803, see datasets/README.md). */
const mission = () => ({
  area: { type: 'Polygon', coordinates: [[[4.48, 46.766], [4.49, 46.766], [4.49, 46.772], [4.48, 46.772], [4.48, 46.766]]] },
  camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 },
  targetGsdCm: 2.5,
  takeoff: { lon: 4.478, lat: 46.768 },
});

let srv: TestServer;
let demo: Record<Role, ApiClient>;
let demoTeam: string;
beforeAll(async () => {
  srv = await startTestServer({ web: false });
  demo = await demoClients(srv);
  demoTeam = await demoTeamId(srv);
});
afterAll(async () => srv?.stop());

function upload(c: ApiClient, teamId: string, projectId: string) {
  const f = new FormData();
  f.append('surfaceKind', 'bare-earth');
  f.append('file', new Blob([new Uint8Array(demBytes)]), 'harrow-fell-dem.tif');
  return c.request('POST', `/api/teams/${teamId}/projects/${projectId}/sites`, { body: f });
}

/** A person with a team, a project and the demo grid as its site. */
async function workspace(tag: string, c?: ApiClient, teamId?: string) {
  if (!c) {
    c = new ApiClient(srv.url);
    const email = uniqueEmail(tag);
    await c.signUp(email, 'plans password', tag);
    await c.signIn(email, 'plans password');
    teamId = (await c.post('/api/teams', { name: `Team ${tag}` })).body.id;
  }
  const projectId = (await c.post(`/api/teams/${teamId}/projects`, { name: `Project ${tag}` })).body.id;
  const site = await upload(c, teamId!, projectId);
  expect(site.status).toBe(201);
  return { c, teamId: teamId!, projectId, siteId: site.body.id as string, plans: `/api/teams/${teamId}/projects/${projectId}/plans`, plan: (id: string) => `/api/teams/${teamId}/plans/${id}` };
}

const fieldsOf = (r: { body: { error: { fields: Array<{ path: string; message: string }> } } }) => Object.fromEntries(r.body.error.fields.map((f) => [f.path, f.message]));

describe('plans', () => {
  it('creates a plan with every default filled in, reads, lists, renames and deletes it', async () => {
    const w = await workspace('crud');
    const r = await w.c.post(w.plans, { name: 'North benches', siteId: w.siteId, input: mission() });
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ name: 'North benches', siteId: w.siteId, projectId: w.projectId, versionCount: 0, latestVersion: null });
    // the schema's defaults are stored, so a later run snapshots a complete mission
    expect(r.body.input).toMatchObject({ forwardOverlap: 0.8, sideOverlap: 0.7, maxAglM: 120, mode: 'follow', headingDeg: 'advise' });
    expect((await w.c.get(w.plan(r.body.id))).body).toEqual(r.body);
    expect((await w.c.get(w.plans)).body.plans.map((p: { id: string }) => p.id)).toEqual([r.body.id]);
    const renamed = await w.c.patch(w.plan(r.body.id), { name: 'North benches, phase 2' });
    expect(renamed.body.name).toBe('North benches, phase 2');
    const project = (await w.c.get(`/api/teams/${w.teamId}/projects/${w.projectId}`)).body;
    expect(project).toMatchObject({ planCount: 1, siteCount: 1 });
    expect((await w.c.delete(w.plan(r.body.id))).status).toBe(204);
    expect((await w.c.get(w.plan(r.body.id))).status).toBe(404);
  });

  it('refuses out-of-range mission values field by field, saying the range', async () => {
    const w = await workspace('fields');
    const bad = { ...mission(), targetGsdCm: 0, forwardOverlap: 1.2, mode: 'zigzag', speedMps: -3 };
    const r = await w.c.post(w.plans, { name: 'Bad', siteId: w.siteId, input: bad });
    expect(r.status).toBe(422);
    const f = fieldsOf(r);
    expect(Object.keys(f).sort()).toEqual(['input.forwardOverlap', 'input.mode', 'input.speedMps', 'input.targetGsdCm']);
    expect(f['input.targetGsdCm']).toMatch(/0\.1 to 100/);
    expect(f['input.forwardOverlap']).toMatch(/0 to 0\.95/);
    const noCamera = await w.c.post(w.plans, { name: 'No camera', siteId: w.siteId, input: { ...mission(), camera: undefined } });
    expect(Object.keys(fieldsOf(noCamera))).toEqual(['input.camera']);
    const noName = await w.c.post(w.plans, { siteId: w.siteId, input: mission() });
    expect(Object.keys(fieldsOf(noName))).toEqual(['name']);
    expect((await w.c.get(w.plans)).body.plans).toEqual([]);
  });

  it('refuses an area that leaves the grid, naming the corners outside', async () => {
    const w = await workspace('outside');
    const m = mission();
    m.area.coordinates[0][1] = [4.5, 46.766]; // east of the grid's edge at lon 4.4960
    m.area.coordinates[0][2] = [4.5, 46.772];
    const r = await w.c.post(w.plans, { name: 'Too far east', siteId: w.siteId, input: m });
    expect(r.status).toBe(422);
    expect(fieldsOf(r)['input.area']).toMatch(/leaves the elevation grid.*corners 2, 3/);
  });

  it('refuses an area whose edges cross', async () => {
    const w = await workspace('bowtie');
    const m = mission();
    // a bow tie: the second and fourth edges cross in the middle
    m.area.coordinates = [[[4.48, 46.766], [4.49, 46.772], [4.49, 46.766], [4.48, 46.772], [4.48, 46.766]]];
    const r = await w.c.post(w.plans, { name: 'Bow tie', siteId: w.siteId, input: m });
    expect(r.status).toBe(422);
    expect(r.body.error.fields.map((f: { path: string }) => f.path)).toContain('input.area');
    expect(r.body.error.message).toMatch(/crosses itself/);
  });

  it('refuses a takeoff point off the grid', async () => {
    const w = await workspace('takeoff');
    const r = await w.c.post(w.plans, { name: 'Far takeoff', siteId: w.siteId, input: { ...mission(), takeoff: { lon: 4.46, lat: 46.768 } } });
    expect(r.status).toBe(422);
    expect(Object.keys(fieldsOf(r))).toEqual(['input.takeoff']);
  });

  it('checks an edit like a new plan and keeps the saved mission when it is refused', async () => {
    const w = await workspace('edit');
    const p = (await w.c.post(w.plans, { name: 'Edit me', siteId: w.siteId, input: mission() })).body;
    const r = await w.c.patch(w.plan(p.id), { input: { ...mission(), sideOverlap: 0.99 } });
    expect(r.status).toBe(422);
    expect(Object.keys(fieldsOf(r))).toEqual(['input.sideOverlap']);
    expect((await w.c.get(w.plan(p.id))).body.input.sideOverlap).toBe(0.7);
    const ok = await w.c.patch(w.plan(p.id), { input: { ...mission(), sideOverlap: 0.75, mode: 'steps' } });
    expect(ok.body.input).toMatchObject({ sideOverlap: 0.75, mode: 'steps' });
  });

  it('keeps a plan whose versions are in review, and freezes plans of an archived project', async () => {
    const w = await workspace('keep');
    const p = (await w.c.post(w.plans, { name: 'Reviewed', siteId: w.siteId, input: mission() })).body;
    const run = await w.c.post(`${w.plan(p.id)}/runs`, {});
    expect(run.status).toBe(202);
    await srv.db.$client.query(`update plan_version set review_state = 'in_review' where id = $1`, [run.body.id]);
    const del = await w.c.delete(w.plan(p.id));
    expect(del.status).toBe(409);
    expect(del.body.error.code).toBe('plan_reviewed');
    await w.c.patch(`/api/teams/${w.teamId}/projects/${w.projectId}`, { archived: true });
    expect((await w.c.patch(w.plan(p.id), { name: 'Changed' })).status).toBe(409);
    expect((await w.c.post(w.plans, { name: 'New', siteId: w.siteId, input: mission() })).status).toBe(409);
    expect((await w.c.get(w.plan(p.id))).body.name).toBe('Reviewed');
  });

  it('refuses a site that belongs to another project', async () => {
    const w = await workspace('other-site');
    const other = await workspace('other-site-2', w.c, w.teamId);
    const r = await w.c.post(w.plans, { name: 'Wrong site', siteId: other.siteId, input: mission() });
    expect(r.status).toBe(422);
    expect(Object.keys(fieldsOf(r))).toEqual(['siteId']);
  });

  it('lets the planner write, the surveyor read only, and keeps the pilot out', async () => {
    const w = await workspace(`roles-${crypto.randomUUID().slice(0, 6)}`, demo.planner, demoTeam);
    const p = await demo.planner.post(w.plans, { name: 'Role plan', siteId: w.siteId, input: mission() });
    expect(p.status).toBe(201);
    expect((await demo.surveyor.get(w.plan(p.body.id))).status).toBe(200);
    expect((await demo.surveyor.get(w.plans)).status).toBe(200);
    expect((await demo.surveyor.post(w.plans, { name: 'No', siteId: w.siteId, input: mission() })).status).toBe(403);
    expect((await demo.surveyor.patch(w.plan(p.body.id), { name: 'No' })).status).toBe(403);
    expect((await demo.surveyor.post(`${w.plan(p.body.id)}/runs`, {})).status).toBe(403);
    expect((await demo.pilot.get(w.plan(p.body.id))).status).toBe(403);
    expect((await demo.pilot.get(w.plans)).status).toBe(403);
    expect((await demo.pilot.get(`${w.plan(p.body.id)}/versions`)).status).toBe(403);
  });

  it('hides one team\'s plans from another, even with the exact ids', async () => {
    const a = await workspace('iso-a');
    const b = await workspace('iso-b');
    const p = (await a.c.post(a.plans, { name: 'Secret plan', siteId: a.siteId, input: mission() })).body;
    const run = await a.c.post(`${a.plan(p.id)}/runs`, {});
    expect(run.status).toBe(202);
    const asB = `/api/teams/${b.teamId}/plans/${p.id}`;
    expect((await b.c.get(asB)).status).toBe(404);
    expect((await b.c.patch(asB, { name: 'Mine now' })).status).toBe(404);
    expect((await b.c.delete(asB)).status).toBe(404);
    expect((await b.c.post(`${asB}/runs`, {})).status).toBe(404);
    expect((await b.c.get(`${asB}/versions`)).status).toBe(404);
    expect((await b.c.get(`${asB}/versions/${run.body.id}`)).status).toBe(404);
    expect((await b.c.get(`${asB}/versions/${run.body.id}/status`)).status).toBe(404);
    expect((await b.c.get(`/api/teams/${b.teamId}/projects/${a.projectId}/plans`)).status).toBe(404);
    // b's own project cannot take a's site either
    expect((await b.c.post(b.plans, { name: 'Borrowed', siteId: a.siteId, input: mission() })).status).toBe(422);
    expect((await b.c.get(a.plan(p.id))).status).toBe(404);
    expect((await a.c.get(a.plan(p.id))).body.name).toBe('Secret plan');
  });
});

describe('the demo seed', () => {
  it('gives the demo team a project with the demo grid and its example plan already analysed', async () => {
    const projects = (await demo.surveyor.get(`/api/teams/${demoTeam}/projects?q=${encodeURIComponent('Harrow Fell')}`)).body.projects;
    expect(projects).toHaveLength(1);
    const [p] = projects;
    // the example plan and the smaller signed-off one the demo pilot flies
    expect(p).toMatchObject({ client: expect.stringMatching(/fictional/), siteCount: 1, planCount: 2 });
    const [site] = (await demo.surveyor.get(`/api/teams/${demoTeam}/projects/${p.id}/sites`)).body.sites;
    expect(site).toMatchObject({ surfaceKind: 'bare-earth', sizeBytes: demBytes.length, sha256: crypto.createHash('sha256').update(demBytes).digest('hex') });
    const plan = (await demo.surveyor.get(`/api/teams/${demoTeam}/projects/${p.id}/plans`)).body.plans.find((x: { name: string }) => x.name === demoProject.planName);
    const example = JSON.parse(fs.readFileSync('datasets/example-mission.json', 'utf8'));
    expect(plan.input.area).toEqual(example.area);
    // The review state is left open: the browser suite sends this very version through review in the same run.
    expect(plan.latestVersion).toMatchObject({ number: 1, analysisState: 'done' });
    const seeded = await srv.db.$client.query(`select action from audit_event where plan_version_id = $1 order by created_at limit 1`, [plan.latestVersion.id]);
    expect(seeded.rows[0]?.action).toBe('version.created');
    const v = (await demo.surveyor.get(`/api/teams/${demoTeam}/plans/${plan.id}/versions/${plan.latestVersion.id}`)).body;
    expect(v.result.summary.photoCount).toBeGreaterThan(0);
    expect(v.result.lines.length).toBe(v.result.summary.lineCount);
  });
});


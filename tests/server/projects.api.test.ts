import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../contracts/roles';
import { demoClients, demoTeamId } from '../support/demo';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

let srv: TestServer;
let demo: Record<Role, ApiClient>;
let demoTeam: string;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  demo = await demoClients(srv);
  demoTeam = await demoTeamId(srv);
});
afterAll(async () => srv?.stop());

/** A new person with a team of their own. */
async function ownTeam(tag: string) {
  const c = new ApiClient(srv.url);
  const email = uniqueEmail(tag);
  await c.signUp(email, 'projects password', tag);
  await c.signIn(email, 'projects password');
  const team = (await c.post('/api/teams', { name: `Team ${tag}` })).body as { id: string };
  return { c, teamId: team.id, base: `/api/teams/${team.id}/projects` };
}

describe('projects', () => {
  it('creates a project with its client, notes and units, and reads it back', async () => {
    const { c, base } = await ownTeam('create');
    const r = await c.post(base, { name: 'Kestrel Ridge haul road', client: 'Orrin Aggregates', notes: 'Phase 2', units: 'imperial' });
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ name: 'Kestrel Ridge haul road', client: 'Orrin Aggregates', notes: 'Phase 2', units: 'imperial', archivedAt: null, siteCount: 0, planCount: 0 });
    const got = await c.get(`${base}/${r.body.id}`);
    expect(got.body).toEqual(r.body);
  });

  it('defaults the units to metric and the client and notes to empty', async () => {
    const { c, base } = await ownTeam('defaults');
    const r = await c.post(base, { name: 'Plain project' });
    expect(r.body).toMatchObject({ units: 'metric', client: '', notes: '' });
  });

  it('refuses bad fields one by one with the reason', async () => {
    const { c, base } = await ownTeam('invalid');
    const r = await c.post(base, { name: 'x', units: 'cubits' });
    expect(r.status).toBe(422);
    const paths = r.body.error.fields.map((f: { path: string }) => f.path).sort();
    expect(paths).toEqual(['name', 'units']);
    expect(r.body.error.fields.find((f: { path: string }) => f.path === 'name').message).toMatch(/at least 2/);
  });

  it('renames and edits a project and moves it to the top of the "updated" sort', async () => {
    const { c, base } = await ownTeam('rename');
    const a = (await c.post(base, { name: 'Alpha' })).body;
    const b = (await c.post(base, { name: 'Bravo' })).body;
    expect((await c.get(base)).body.projects.map((p: { id: string }) => p.id)).toEqual([b.id, a.id]);
    const e = await c.patch(`${base}/${a.id}`, { name: 'Alpha north', client: 'Tarn Water Board', units: 'imperial' });
    expect(e.status).toBe(200);
    expect(e.body).toMatchObject({ name: 'Alpha north', client: 'Tarn Water Board', units: 'imperial' });
    expect(Date.parse(e.body.updatedAt)).toBeGreaterThan(Date.parse(a.updatedAt));
    expect((await c.get(base)).body.projects.map((p: { id: string }) => p.id)).toEqual([a.id, b.id]);
  });

  it('refuses an empty or unknown edit', async () => {
    const { c, base } = await ownTeam('edit-check');
    const a = (await c.post(base, { name: 'Alpha' })).body;
    expect((await c.patch(`${base}/${a.id}`, {})).status).toBe(422);
    expect((await c.patch(`${base}/${a.id}`, { colour: 'red' })).status).toBe(422);
  });

  it('archives and restores a project, and filters the list by archive state', async () => {
    const { c, base } = await ownTeam('archive');
    const keep = (await c.post(base, { name: 'Keep' })).body;
    const old = (await c.post(base, { name: 'Old job' })).body;
    const archived = await c.patch(`${base}/${old.id}`, { archived: true });
    expect(archived.body.archivedAt).not.toBeNull();
    const ids = async (q: string) => (await c.get(`${base}${q}`)).body.projects.map((p: { id: string }) => p.id);
    expect(await ids('')).toEqual([keep.id]);
    expect(await ids('?archived=archived')).toEqual([old.id]);
    expect((await ids('?archived=all')).sort()).toEqual([keep.id, old.id].sort());
    const restored = await c.patch(`${base}/${old.id}`, { archived: false });
    expect(restored.body.archivedAt).toBeNull();
    expect((await ids('')).sort()).toEqual([keep.id, old.id].sort());
  });

  it('searches name, client and notes case-insensitively, and treats % and _ as plain text', async () => {
    const { c, base } = await ownTeam('search');
    const p1 = (await c.post(base, { name: 'Harrow quarry', client: 'Orrin Aggregates' })).body;
    const p2 = (await c.post(base, { name: 'Weir survey', notes: 'check the QUARRY access first' })).body;
    const p3 = (await c.post(base, { name: '50% cover test' })).body;
    await c.post(base, { name: '50 cover other' });
    const ids = async (q: string) => (await c.get(`${base}?q=${encodeURIComponent(q)}&sort=name`)).body.projects.map((p: { id: string }) => p.id);
    expect(await ids('quarry')).toEqual([p1.id, p2.id]);
    expect(await ids('orrin')).toEqual([p1.id]);
    expect(await ids('50%')).toEqual([p3.id]);
    expect(await ids('zzz')).toEqual([]);
  });

  it('sorts by name, created or updated, in either order', async () => {
    const { c, base } = await ownTeam('sort');
    const names = ['delta', 'Alpha', 'charlie', 'Bravo'];
    for (const name of names) await c.post(base, { name });
    const list = async (q: string) => (await c.get(`${base}?${q}`)).body.projects.map((p: { name: string }) => p.name);
    expect(await list('sort=name')).toEqual(['Alpha', 'Bravo', 'charlie', 'delta']);
    expect(await list('sort=name&order=desc')).toEqual(['delta', 'charlie', 'Bravo', 'Alpha']);
    expect(await list('sort=created&order=asc')).toEqual(names);
    expect(await list('sort=created')).toEqual([...names].reverse());
    expect((await c.get(`${base}?sort=colour`)).status).toBe(422);
  });
});

describe('project roles', () => {
  it('lets the planner create and edit, the surveyor only read, and shuts the pilot out', async () => {
    const base = `/api/teams/${demoTeam}/projects`;
    const made = await demo.planner.post(base, { name: `Role check ${crypto.randomUUID().slice(0, 6)}` });
    expect(made.status).toBe(201);
    expect((await demo.owner.patch(`${base}/${made.body.id}`, { notes: 'owner edit' })).status).toBe(200);
    expect((await demo.surveyor.get(`${base}/${made.body.id}`)).body.notes).toBe('owner edit');
    const surveyorEdit = await demo.surveyor.patch(`${base}/${made.body.id}`, { notes: 'no' });
    expect(surveyorEdit.status).toBe(403);
    expect((await demo.surveyor.post(base, { name: 'Not mine' })).status).toBe(403);
    expect((await demo.pilot.get(base)).status).toBe(403);
    expect((await demo.pilot.get(`${base}/${made.body.id}`)).status).toBe(403);
  });
});

describe('project isolation between teams', () => {
  it('gives 404 for another team\'s project, even with its exact id', async () => {
    const a = await ownTeam('iso-a');
    const b = await ownTeam('iso-b');
    const pa = (await a.c.post(a.base, { name: 'Secret job' })).body;
    // b asks its own team's route with a's project id: the id is real, but not b's
    expect((await b.c.get(`${b.base}/${pa.id}`)).status).toBe(404);
    expect((await b.c.patch(`${b.base}/${pa.id}`, { name: 'Stolen' })).status).toBe(404);
    expect((await b.c.get(b.base)).body.projects).toEqual([]);
    // and a's team route is closed to b
    expect((await b.c.get(`${a.base}/${pa.id}`)).status).toBe(404);
    expect((await a.c.get(`${a.base}/${pa.id}`)).body.name).toBe('Secret job');
  });

  it('answers 404, not a server error, to an id that is not a UUID', async () => {
    const a = await ownTeam('bad-id');
    const r = await a.c.get(`${a.base}/not-a-uuid`);
    expect(r.status).toBe(404);
  });
});

/**
 * Letting Loftline lay the lines out, over real HTTP and the real queue: a plan whose mission says
 * `layoutBy: "solver"` is analysed by the solver; the stored result equals what the command line's
 * `terrain solve` prints for the same grid and stored mission, carries the solver's proof and reasons, and its
 * MAVLink items set each leg's own photo spacing and speed.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { missionItemsSchema } from '../../contracts/mission-items';
import { planResultSchema } from '../../contracts/plan-result';
import { SOLVE_REPORT_KEYS } from '../../contracts/solve';
import { planVersion } from '../../db/schema';
import { runTerrainCli } from '../cli/run-cli';
import { analysedExampleVersion, EXAMPLE_MISSION } from '../support/analysed-version';
import { freshTeam, type FreshTeam } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';

let srv: TestServer;
let team: FreshTeam;
let ids: { projectId: string; planId: string; versionId: string };
let versionPath: string;

beforeAll(async () => {
  srv = await startTestServer({ web: false, env: { WORKERS: '1', JOBS_POLL_SECONDS: '0.5' } });
  team = await freshTeam(srv, 'solver');
  ids = await analysedExampleVersion(team, { plan: 'Solved face and heap', verticalDatum: null }, { layoutBy: 'solver' });
  versionPath = `/api/teams/${team.teamId}/plans/${ids.planId}/versions/${ids.versionId}`;
}, 240_000);
afterAll(async () => srv?.stop());

describe('plans laid out by the solver', () => {
  it('stores what `terrain solve` prints for the same grid and mission: the plan, and the proof and reasons under `solved`', async () => {
    const v = (await team.clients.planner.get(versionPath)).body;
    expect(v.analysisState).toBe('done');
    const result = planResultSchema.parse(v.result);
    expect(result.solved).toBeDefined();
    const missionFile = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-solver-api-')), 'mission.json');
    fs.writeFileSync(missionFile, JSON.stringify(v.input));
    // in a child process, as a user runs it
    const out = await runTerrainCli(['solve', 'datasets/harrow-fell-dem.tif', '--mission', missionFile]);
    expect(out.stderr).toBe('');
    const cli = JSON.parse(out.stdout) as Record<string, unknown>;
    for (const k of SOLVE_REPORT_KEYS) expect(result.solved![k as keyof typeof result.solved]).toEqual(cli[k]);
    expect(result.lines).toEqual(cli.lines);
    expect(result.summary).toEqual(cli.summary);
    // the lines' spacing varies line by line, as the solver chose it
    const spacings = result.solved!.choices.lines.map((l) => l.spacingToNextM).filter((x): x is number => x !== null);
    expect(new Set(spacings.map((x) => x.toFixed(1))).size).toBeGreaterThan(1);
  });

  it('runs the ground proof over the solved plan\'s own photos', async () => {
    const cov = (await team.clients.planner.get(`${versionPath}/coverage`)).body;
    expect(cov.state).toBe('ready');
    const result = planResultSchema.parse((await team.clients.planner.get(versionPath)).body.result);
    expect(cov.document.summary.photoCount).toBe(result.summary.photoCount);
  });

  it('hands the autopilot every leg\'s own photo spacing and speed', async () => {
    await srv.db.update(planVersion).set({ reviewState: 'signed_off', signedOffBy: team.users.surveyor.id, signedOffAt: new Date() }).where(eq(planVersion.id, ids.versionId));
    const r = await team.clients.pilot.get(`/api/teams/${team.teamId}/flights/${ids.versionId}/mission-items`);
    expect(r.status).toBe(200);
    const items = missionItemsSchema.parse(r.body);
    const result = planResultSchema.parse((await team.clients.planner.get(versionPath)).body.result);
    const byIndex = [...result.lines].sort((a, b) => a.index - b.index);
    // MAV_CMD_DO_SET_CAM_TRIGG_DIST (206): each leg's own tightest photo spacing is set on it (param1)
    const triggers = new Set(items.items.filter((it) => it.command === 206 && it.param1 !== 0).map((it) => it.param1));
    const legTriggers = new Set(byIndex.flatMap((l) => l.legs.flatMap((g) => (g.triggerDistanceM ? [g.triggerDistanceM.min] : []))));
    expect(legTriggers.size).toBeGreaterThan(1);
    for (const t of legTriggers) expect(triggers).toContain(t);
    // MAV_CMD_DO_CHANGE_SPEED (178): one per leg whose speed the solver set, with that speed (param2)
    const speeds = items.items.filter((it) => it.command === 178).map((it) => it.param2);
    const legSpeeds = byIndex.flatMap((l) => l.legs.map((g) => g.speedMps)).filter((x): x is number => x !== undefined);
    expect(speeds.length).toBeGreaterThanOrEqual(byIndex.length);
    for (const sp of speeds) expect(legSpeeds).toContain(sp);
  });

  it('refuses a pattern it does not know, naming the ones it does', async () => {
    const input = { ...JSON.parse(fs.readFileSync(EXAMPLE_MISSION, 'utf8')), layoutBy: 'solver', solve: { pattern: 'spiral' } };
    const site = (await team.clients.planner.get(`/api/teams/${team.teamId}/projects/${ids.projectId}/sites`)).body.sites[0];
    const r = await team.clients.planner.post(`/api/teams/${team.teamId}/projects/${ids.projectId}/plans`, { name: 'Spiral', siteId: site.id, input });
    expect(r.status).toBe(422);
    expect(r.body.error.fields.map((f: { path: string }) => f.path)).toEqual(['input.solve.pattern']);
    expect(r.body.error.message).toContain('solve.pattern must be "furrow" (one set of parallel lines), "lattice" (a second set across the first) or "slant" (a lattice with the camera tilted)');
  });
});

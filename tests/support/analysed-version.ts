/** A version of the example mission over the demo grid, analysed through the API by the planner of a fixture team. */
import fs from 'node:fs';
import { expect } from 'vitest';
import type { FreshTeam } from './fixtures';

export const EXAMPLE_MISSION = 'datasets/example-mission.json';

/** Upload the demo grid, plan the example mission (with `change` laid over it) and run it as `t`'s planner; waits for the analysis. */
export async function analysedExampleVersion(t: FreshTeam, names: { project?: string; plan?: string; verticalDatum?: string | null } = {}, change: Record<string, unknown> = {}): Promise<{ projectId: string; planId: string; versionId: string }> {
  const c = t.clients.planner;
  const projectId = (await c.post(`/api/teams/${t.teamId}/projects`, { name: names.project ?? 'Harrow Fell as flown' })).body.id as string;
  const f = new FormData();
  f.append('surfaceKind', 'bare-earth');
  // the planner's words for the datum; null leaves the file's own (as the command line reads it)
  const datum = names.verticalDatum === undefined ? 'EGM96 (EPSG:5773)' : names.verticalDatum;
  if (datum !== null) f.append('verticalDatum', datum);
  f.append('file', new Blob([new Uint8Array(fs.readFileSync('datasets/harrow-fell-dem.tif'))]), 'harrow-fell-dem.tif');
  const site = await c.request('POST', `/api/teams/${t.teamId}/projects/${projectId}/sites`, { body: f });
  expect(site.status).toBe(201);
  const input = { ...JSON.parse(fs.readFileSync(EXAMPLE_MISSION, 'utf8')), ...change };
  const p = await c.post(`/api/teams/${t.teamId}/projects/${projectId}/plans`, { name: names.plan ?? 'Face and heap', siteId: site.body.id, input });
  expect(p.status).toBe(201);
  const plan = `/api/teams/${t.teamId}/plans/${p.body.id}`;
  const run = await c.post(`${plan}/runs`, {});
  expect(run.status).toBe(202);
  const t0 = Date.now();
  for (;;) {
    const s = await c.get(`${plan}/versions/${run.body.id}/status`);
    if (s.body.analysisState === 'done') break;
    if (s.body.analysisState === 'failed' || Date.now() - t0 > 120_000) throw new Error(`analysis did not finish: ${JSON.stringify(s.body)}`);
    await new Promise((r) => setTimeout(r, 300));
  }
  return { projectId, planId: p.body.id as string, versionId: run.body.id as string };
}

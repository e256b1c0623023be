/**
 * Demo seed step: one project for an invented client with the synthetic Harrow Fell grid as its site and the
 * example plan already analysed (run inline here, not through the queue, so the demo is complete at once).
 * Everything is fictional; see datasets/README.md.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Db } from '../../db/client';
import { createAnalysisUsecases } from '../analysis/analysis.usecases';
import { createInlineTerrainRunner } from '../analysis/terrain-pool';
import type { Jobs } from '../jobs/jobs.service';
import { createPlansRepository } from '../plans/plans.repository';
import { createPlansUsecases } from '../plans/plans.usecases';
import { createProjectsRepository } from '../projects/projects.repository';
import { createSitesRepository } from '../sites/sites.repository';
import { createSitesUsecases, siteKeys } from '../sites/sites.usecases';
import type { Storage } from '../storage/storage';
import type { SeedStep } from './seed';
import { requirementChecks } from '../reports/report.build';
import { createReviewsRepository } from '../reviews/reviews.repository';
import { createVersionsRepository } from '../versions/versions.repository';

const datasets = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', 'datasets');

/** The invented demo project (no real client, place or person). */
export const demoProject = {
  name: 'Harrow Fell quarry — face and spoil heap survey',
  client: 'Greyscar Aggregates (fictional)',
  notes: 'Demo project: invented client, invented site, synthetic elevation grid (datasets/README.md). Quarterly volume survey of the working face and the spoil heap.',
  units: 'metric',
  siteName: 'Harrow Fell quarry, 2 m bare-earth grid',
  demFile: 'harrow-fell-dem.tif',
  planName: 'Face and spoil heap, 2.5 cm GSD',
  /** A second, smaller plan, reviewed and signed off, so the demo pilot has a flight from the first sign-in. */
  flightPlanName: 'Spoil heap top-up check, 3 cm GSD',
} as const;

/** The spoil heap's west end (inside the survey area of datasets/example-mission.json; invented like the rest). */
const spoilHeapArea = { type: 'Polygon', coordinates: [[[4.4802, 46.7657], [4.486, 46.7658], [4.4862, 46.769], [4.4801, 46.769], [4.4802, 46.7657]]] };

/** The demo DEM's bytes, made by the committed generator if the file is missing. */
async function demoDemBytes(): Promise<Buffer> {
  const file = path.join(datasets, demoProject.demFile);
  if (!fs.existsSync(file)) {
    const gen = await import('../../datasets/make-demo-dem');
    fs.writeFileSync(file, gen.writeGeoTiff(gen.demoGrid(), gen.DEMO_DEM.width, gen.DEMO_DEM.height, { ...gen.DEMO_DEM, tile: 256 }));
  }
  return fs.readFileSync(file);
}

/** Seed the demo project into the demo team (the team is new, so nothing is there yet). */
async function seedDemoProject(ctx: { db: Db; storage: Storage; teamId: string; plannerId: string; surveyorId?: string }): Promise<{ projectId: string; siteId: string; planId: string; versionId: string }> {
  const { db, storage, teamId, plannerId } = ctx;
  const terrain = createInlineTerrainRunner();
  const projects = createProjectsRepository({ db });
  const sites = createSitesRepository({ db });
  const plans = createPlansRepository({ db });

  const project = await projects.create(teamId, plannerId, { name: demoProject.name, client: demoProject.client, notes: demoProject.notes, units: demoProject.units });

  // the same path as an upload: store, then the checks, metadata and hillshade of finishUpload
  const siteId = crypto.randomUUID();
  const key = siteKeys.dem(teamId, siteId);
  const stored = await storage.put(key, await demoDemBytes(), { contentType: 'image/tiff' });
  const outcome = await createSitesUsecases({ sites, storage, terrain }).finishUpload({
    teamId,
    projectId: project.id,
    siteId,
    userId: plannerId,
    file: { originalname: demoProject.demFile, storageKey: key, size: stored.sizeBytes, sha256: stored.sha256 },
    body: { name: demoProject.siteName, surfaceKind: 'bare-earth', verticalDatum: 'EGM96 (EPSG:5773)' },
  });
  if (!('site' in outcome)) throw new Error('The demo grid was refused as a duplicate in a new project.');

  // the run snapshots the plan into version 1; its job is not queued, the analysis runs right here instead
  const noQueue = { queueAnalysis: async () => null } as unknown as Jobs;
  const usecases = createPlansUsecases({ db, plans, projects, sites, jobs: noQueue });
  const mission = JSON.parse(fs.readFileSync(path.join(datasets, 'example-mission.json'), 'utf8'));
  const actor = { teamId, userId: plannerId };
  const plan = await usecases.create(actor, project.id, { name: demoProject.planName, siteId, input: mission });
  const version = await usecases.run(actor, plan.id);
  const analysed = await createAnalysisUsecases({ db, storage, terrain }).analyseVersion(version.id);
  if (analysed !== 'done') {
    const failed = await plans.status(teamId, plan.id, version.id);
    throw new Error(`The demo plan did not analyse: ${failed?.analysisError ?? analysed}`);
  }
  if (ctx.surveyorId) await seedSignedOffPlan({ db, storage, terrain, teamId, plannerId, surveyorId: ctx.surveyorId, projectId: project.id, siteId, mission, usecases });
  return { projectId: project.id, siteId, planId: plan.id, versionId: version.id };
}

/**
 * The demo's flight: a smaller plan over the spoil heap, analysed, sent for review by the planner and signed off by
 * the surveyor through the same review transitions the API uses (no mail is queued at seed time). It misses part
 * of its spec, as real plans do, so each unmet requirement carries the surveyor's reason, printed in its report.
 */
async function seedSignedOffPlan(q: {
  db: Db; storage: Storage; terrain: ReturnType<typeof createInlineTerrainRunner>; teamId: string; plannerId: string; surveyorId: string;
  projectId: string; siteId: string; mission: Record<string, unknown>; usecases: ReturnType<typeof createPlansUsecases>;
}): Promise<void> {
  const input = { ...q.mission, name: undefined, area: spoilHeapArea, targetGsdCm: 3, spec: { maxGsdCm: 3.3, minViews: 4 } };
  const actor = { teamId: q.teamId, userId: q.plannerId };
  const plan = await q.usecases.create(actor, q.projectId, { name: demoProject.flightPlanName, siteId: q.siteId, input });
  const version = await q.usecases.run(actor, plan.id);
  if ((await createAnalysisUsecases({ db: q.db, storage: q.storage, terrain: q.terrain }).analyseVersion(version.id)) !== 'done') throw new Error('The demo flight plan did not analyse.');
  const reviews = createReviewsRepository({ db: q.db });
  const submitted = await reviews.transition({ teamId: q.teamId, versionId: version.id, action: 'submit', actorId: q.plannerId, comment: 'Top-up check of the spoil heap before the quarterly volume survey.' });
  if (!submitted.ok) throw new Error(`The demo flight plan could not be sent for review: ${submitted.refusal.reason}`);
  const v = await createVersionsRepository({ db: q.db }).find({ teamId: q.teamId, versionId: version.id, role: 'surveyor' });
  if (!v) throw new Error('The demo flight plan vanished before its sign-off.');
  const reasons = requirementChecks(v)
    .filter((c) => !c.pass)
    .map((c) => ({ key: c.key, reason: `Demo: accepted for the top-up check only; ${c.label.toLowerCase()} is short on the heap's steep flank, which the quarterly survey covers.` }));
  const signed = await reviews.transition({ teamId: q.teamId, versionId: version.id, action: 'sign-off', actorId: q.surveyorId, comment: 'Fit to fly for the top-up check (demo).', reasons });
  if (!signed.ok) throw new Error(`The demo flight plan could not be signed off: ${signed.refusal.reason}`);
}

/** The seed step for seedDemo's `steps`. */
export function demoProjectStep(deps: { storage: Storage }): SeedStep {
  return async ({ db, teamId, userIds }) => {
    await seedDemoProject({ db, storage: deps.storage, teamId, plannerId: userIds.planner, surveyorId: userIds.surveyor });
  };
}

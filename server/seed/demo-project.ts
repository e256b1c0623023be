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
} as const;

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
export async function seedDemoProject(ctx: { db: Db; storage: Storage; teamId: string; plannerId: string }): Promise<{ projectId: string; siteId: string; planId: string; versionId: string }> {
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
  return { projectId: project.id, siteId, planId: plan.id, versionId: version.id };
}

/** The seed step for seedDemo's `steps`. */
export function demoProjectStep(deps: { storage: Storage }): SeedStep {
  return async ({ db, teamId, userIds }) => {
    await seedDemoProject({ db, storage: deps.storage, teamId, plannerId: userIds.planner });
  };
}

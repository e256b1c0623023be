/** Plans: save with every check (mission schema, then the geometry over the site), delete, and run an analysis. */
import type { CreatePlan, Plan, UpdatePlan, VersionSummary } from '../../contracts/plans';
import { createPlanSchema, updatePlanSchema } from '../../contracts/plans';
import type { Db } from '../../db/client';
import { errors, type AppError } from '../http/errors';
import { projectErrors } from '../projects/projects.errors';
import { planErrors } from './plans.errors';
import { parseInput } from '../http/validate';
import type { Jobs } from '../jobs/jobs.service';
import type { ProjectsRepository } from '../projects/projects.repository';
import type { SitesRepository } from '../sites/sites.repository';
import type { StoredSiteMetadata } from '../sites/sites.repository';
import { checkPlanOverSite } from './plan-geometry';
import type { PlansRepository } from './plans.repository';

interface Actor {
  teamId: string;
  userId: string;
}

function archived(): AppError {
  return projectErrors.project_archived('changing or running its plans');
}

export function createPlansUsecases(deps: { db: Db; plans: PlansRepository; projects: ProjectsRepository; sites: SitesRepository; jobs: Jobs }) {
  const { db, plans, projects, sites, jobs } = deps;

  /** The site must belong to the project; the mission must fit on its grid. */
  async function checkOverSite(teamId: string, projectId: string, siteId: string, input: Parameters<typeof checkPlanOverSite>[0]) {
    const s = await sites.get(teamId, siteId, projectId);
    if (!s) throw errors.invalid('The chosen elevation grid is not a site of this project.', [{ path: 'siteId', message: 'Choose one of this project\'s elevation grids.' }]);
    const problems = checkPlanOverSite(input, s.metadata as StoredSiteMetadata, s.name);
    if (problems.length) throw errors.invalid(problems[0].message, problems);
  }

  async function openProject(teamId: string, projectId: string) {
    const p = await projects.get(teamId, projectId);
    if (!p) throw errors.not_found('Project');
    if (p.archivedAt) throw archived();
    return p;
  }

  return {
    async create(a: Actor, projectId: string, body: CreatePlan | unknown): Promise<Plan> {
      await openProject(a.teamId, projectId);
      const input = parseInput(createPlanSchema, body);
      await checkOverSite(a.teamId, projectId, input.siteId, input.input);
      const created = await plans.insert({ teamId: a.teamId, projectId, siteId: input.siteId, name: input.name, input: input.input, createdBy: a.userId });
      await projects.touch(a.teamId, projectId);
      return created;
    },

    async update(a: Actor, planId: string, body: UpdatePlan | unknown): Promise<Plan> {
      const current = await plans.get(a.teamId, planId);
      if (!current) throw errors.not_found('Plan');
      const change = parseInput(updatePlanSchema, body);
      await openProject(a.teamId, current.projectId);
      if (change.siteId !== undefined || change.input !== undefined) {
        await checkOverSite(a.teamId, current.projectId, change.siteId ?? current.siteId, change.input ?? current.input);
      }
      const updated = await plans.update(a.teamId, planId, change);
      if (!updated) throw errors.not_found('Plan');
      await projects.touch(a.teamId, current.projectId);
      return updated;
    },

    async remove(a: Actor, planId: string): Promise<void> {
      const current = await plans.get(a.teamId, planId);
      if (!current) throw errors.not_found('Plan');
      if ((await plans.reviewedVersionCount(a.teamId, planId)) > 0) {
        throw planErrors.plan_reviewed();
      }
      await plans.remove(a.teamId, planId);
      await projects.touch(a.teamId, current.projectId);
    },

    /**
     * Snapshot the saved plan into the next immutable version, record 'version.created' and queue its analysis,
     * all in one transaction: a version never exists without its job, nor a job without its version.
     */
    async run(a: Actor, planId: string): Promise<VersionSummary> {
      const current = await plans.get(a.teamId, planId);
      if (!current) throw errors.not_found('Plan');
      await openProject(a.teamId, current.projectId);
      const client = await db.$client.connect();
      let versionId: string;
      try {
        await client.query('begin');
        // the plan row lock serialises concurrent runs, so version numbers never collide
        const locked = await client.query<{ site_id: string; input: unknown }>('select site_id, input from plan where id = $1 and team_id = $2 for update', [planId, a.teamId]);
        if (locked.rowCount === 0) throw errors.not_found('Plan');
        const { site_id: siteId, input } = locked.rows[0];
        const inserted = await client.query<{ id: string; number: number }>(
          `insert into plan_version (team_id, plan_id, number, site_id, input, created_by)
           values ($1, $2, (select coalesce(max(number), 0) + 1 from plan_version where plan_id = $2), $3, $4, $5)
           returning id, number`,
          [a.teamId, planId, siteId, JSON.stringify(input), a.userId],
        );
        versionId = inserted.rows[0].id;
        await client.query(
          `insert into audit_event (team_id, plan_id, plan_version_id, actor_id, action, to_state, comment)
           values ($1, $2, $3, $4, 'version.created', 'draft', $5)`,
          [a.teamId, planId, versionId, a.userId, `Version ${inserted.rows[0].number} created and queued for analysis.`],
        );
        await jobs.queueAnalysis({ versionId, teamId: a.teamId }, { executeSql: (text, values) => client.query(text, values) });
        await client.query('commit');
      } catch (err) {
        await client.query('rollback').catch(() => undefined);
        throw err;
      } finally {
        client.release();
      }
      const versions = await plans.versions(a.teamId, planId);
      return versions.find((v) => v.id === versionId)!;
    },
  };
}

export type PlansUsecases = ReturnType<typeof createPlansUsecases>;

/**
 * Plans and their versions. A project's plans: /api/teams/:teamId/projects/:projectId/plans (list, create).
 * One plan: /api/teams/:teamId/plans/:planId (read, edit, delete, runs, versions, version status), the same
 * plan-level prefix that reviews, reports and exports use.
 */
import type { Request, Router } from 'express';
import { planListSchema, planSchema, planVersionSchema, runPlanSchema, versionListSchema, versionStatusSchema, versionSummarySchema } from '../../contracts/plans';
import { errors } from '../http/errors';
import { requireTeam, type Guards } from '../http/guard';
import { parseInput, sendJson } from '../http/validate';
import { createProjectsRepository, type ProjectsRepository } from '../projects/projects.repository';
import { idParam } from '../http/ids';
import type { BodyCache } from '../http/body-cache';
import type { RouteGroup } from '../route-group';
import { createSitesRepository } from '../sites/sites.repository';
import { createPlansRepository, type PlansRepository } from './plans.repository';
import { createPlansUsecases, type PlansUsecases } from './plans.usecases';

function registerPlanRoutes(api: Router, deps: { guards: Guards; plans: PlansRepository; projects: ProjectsRepository; usecases: PlansUsecases; bodyCache: BodyCache }) {
  const { guards, plans, projects, usecases, bodyCache } = deps;
  const projectPlans = '/teams/:teamId/projects/:projectId/plans';
  const onePlan = '/teams/:teamId/plans/:planId';
  const oneVersion = `${onePlan}/versions/:versionId`;

  const actor = (req: Request) => {
    const { teamId, user } = requireTeam(req);
    return { teamId, userId: user.id };
  };

  api.get(projectPlans, guards.permission('plan:read'), async (req, res) => {
    const { teamId } = requireTeam(req);
    const projectId = idParam(req, 'projectId', 'Project');
    if (!(await projects.get(teamId, projectId))) throw errors.not_found('Project');
    sendJson(res, planListSchema, { plans: await plans.list(teamId, projectId) });
  });

  api.post(projectPlans, guards.permission('plan:write'), async (req, res) => {
    sendJson(res, planSchema, await usecases.create(actor(req), idParam(req, 'projectId', 'Project'), req.body), 201);
  });

  api.get(onePlan, guards.permission('plan:read'), async (req, res) => {
    const found = await plans.get(requireTeam(req).teamId, idParam(req, 'planId', 'Plan'));
    if (!found) throw errors.not_found('Plan');
    sendJson(res, planSchema, found);
  });

  api.patch(onePlan, guards.permission('plan:write'), async (req, res) => {
    sendJson(res, planSchema, await usecases.update(actor(req), idParam(req, 'planId', 'Plan'), req.body));
  });

  api.delete(onePlan, guards.permission('plan:write'), async (req, res) => {
    await usecases.remove(actor(req), idParam(req, 'planId', 'Plan'));
    res.status(204).end();
  });

  api.post(`${onePlan}/runs`, guards.permission('plan:run'), async (req, res) => {
    parseInput(runPlanSchema, req.body ?? {});
    const v = await usecases.run(actor(req), idParam(req, 'planId', 'Plan'));
    res.setHeader('Location', `/api/teams/${requireTeam(req).teamId}/plans/${v.planId}/versions/${v.id}/status`);
    sendJson(res, versionSummarySchema, v, 202);
  });

  api.get(`${onePlan}/versions`, guards.permission('plan:read'), async (req, res) => {
    const { teamId } = requireTeam(req);
    const planId = idParam(req, 'planId', 'Plan');
    if (!(await plans.get(teamId, planId))) throw errors.not_found('Plan');
    sendJson(res, versionListSchema, { versions: await plans.versions(teamId, planId) });
  });

  api.get(oneVersion, guards.permission('plan:read'), async (req, res) => {
    const { teamId } = requireTeam(req);
    const planId = idParam(req, 'planId', 'Plan');
    const versionId = idParam(req, 'versionId', 'Version');
    const summary = await plans.versionSummary(teamId, planId, versionId);
    if (!summary) throw errors.not_found('Version');
    const load = async () => {
      const v = await plans.version(teamId, planId, versionId);
      if (!v) throw errors.not_found('Version');
      return v;
    };
    if (summary.analysisState !== 'done' && summary.analysisState !== 'failed') {
      sendJson(res, planVersionSchema, await load());
      return;
    }
    // A settled version's input and result never change (the result was checked against its schema when the
    // analysis stored it); only its summary does (review state), and the summary is part of the key.
    await bodyCache.send(req, res, `version:${versionId}:${JSON.stringify(summary)}`, async () => {
      const { result, ...rest } = await load();
      return { ...planVersionSchema.omit({ result: true }).parse(rest), result };
    });
  });

  api.get(`${oneVersion}/status`, guards.permission('plan:read'), async (req, res) => {
    const s = await plans.status(requireTeam(req).teamId, idParam(req, 'planId', 'Plan'), idParam(req, 'versionId', 'Version'));
    if (!s) throw errors.not_found('Version');
    res.setHeader('Cache-Control', 'no-store');
    sendJson(res, versionStatusSchema, s);
  });
}

/** The plans route group for server/routes.ts. */
export const planRouteGroup: RouteGroup = (api, { guards, services }) => {
  const { db } = services;
  const plans = createPlansRepository({ db });
  const projects = createProjectsRepository({ db });
  registerPlanRoutes(api, { guards, plans, projects, bodyCache: services.bodyCache, usecases: createPlansUsecases({ db, plans, projects, sites: createSitesRepository({ db }), jobs: services.jobs }) });
};

/**
 * Plans and their versions. A project's plans: /api/teams/:teamId/projects/:projectId/plans (list, create).
 * One plan: /api/teams/:teamId/plans/:planId (read, edit, delete, runs, versions, version status), the same
 * plan-level prefix that reviews, reports and exports use.
 */
import type { Request, Router } from 'express';
import { planListSchema, planSchema, planVersionOverviewSchema, planVersionSchema, runPlanSchema, versionListSchema, versionStatusSchema, versionSummarySchema } from '../../contracts/plans';
import { errors } from '../http/errors';
import { requireTeam, type Guards } from '../http/guard';
import { parseInput, sendJson } from '../http/validate';
import { createProjectsRepository, type ProjectsRepository } from '../projects/projects.repository';
import { idParam } from '../http/ids';
import { resultLineSchema, resultOverview } from '../../contracts/result-parts';
import { versionErrors } from '../versions/versions.errors';
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

  /** `?part=overview`: the result without stations (each line's figures and station marks); else the whole version. */
  const versionPart = (req: Request): 'whole' | 'overview' => {
    const part = req.query.part;
    if (part === undefined) return 'whole';
    if (part === 'overview') return 'overview';
    throw errors.invalid(`Unknown part ${JSON.stringify(String(part)).slice(0, 60)}: ask for part=overview (the result without its stations), or leave part out for the whole version.`);
  };

  api.get(oneVersion, guards.permission('plan:read'), async (req, res) => {
    const { teamId } = requireTeam(req);
    const planId = idParam(req, 'planId', 'Plan');
    const versionId = idParam(req, 'versionId', 'Version');
    const part = versionPart(req);
    const summary = await plans.versionSummary(teamId, planId, versionId);
    if (!summary) throw errors.not_found('Version');
    const load = async () => {
      const v = await plans.version(teamId, planId, versionId);
      if (!v) throw errors.not_found('Version');
      return v;
    };
    if (summary.analysisState !== 'done' && summary.analysisState !== 'failed') {
      const v = await load();
      if (part === 'overview') sendJson(res, planVersionOverviewSchema, { ...v, result: v.result && resultOverview(v.result) });
      else sendJson(res, planVersionSchema, v);
      return;
    }
    // A settled version's input and result never change (the result was checked against its schema when the
    // analysis stored it); only its summary does (review state), and the summary is part of the key.
    await bodyCache.send(req, res, `version:${part}:${versionId}:${JSON.stringify(summary)}`, async () => {
      const { result, ...rest } = await load();
      const head = planVersionSchema.omit({ result: true }).parse(rest);
      return { ...head, result: part === 'overview' && result ? resultOverview(result) : result };
    });
  });

  // One line of a settled version with its stations: what a chart of that line reads, without the rest.
  api.get(`${oneVersion}/lines/:lineIndex`, guards.permission('plan:read'), async (req, res) => {
    const { teamId } = requireTeam(req);
    const planId = idParam(req, 'planId', 'Plan');
    const versionId = idParam(req, 'versionId', 'Version');
    const raw = String(req.params.lineIndex);
    if (!/^\d{1,6}$/.test(raw)) throw errors.invalid(`Line index ${JSON.stringify(raw.slice(0, 20))} is not a whole number: lines are numbered from 0 in flying order (line 1 is index 0).`);
    const lineIndex = Number(raw);
    const summary = await plans.versionSummary(teamId, planId, versionId);
    if (!summary) throw errors.not_found('Version');
    if (summary.analysisState !== 'done') throw versionErrors.analysis_not_done('This version has no result yet: its lines can be read once its analysis is done.');
    await bodyCache.send(req, res, `version-line:${versionId}:${lineIndex}`, async () => {
      const line = await plans.versionLine(teamId, planId, versionId, lineIndex);
      if (!line) throw errors.not_found('Line');
      return resultLineSchema.parse({ versionId, line });
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

/** /api/teams/:teamId/projects: list with search and sort, create, read, edit, archive and restore. */
import type { Router } from 'express';
import { createProjectSchema, projectListQuerySchema, projectListSchema, projectSchema, updateProjectSchema } from '../../contracts/projects';
import { errors } from '../http/errors';
import { requireTeam, type Guards } from '../http/guard';
import { parseInput, sendJson } from '../http/validate';
import type { RouteGroup } from '../route-group';
import { createProjectsRepository, type ProjectsRepository } from './projects.repository';
import { idParam } from '../http/ids';

function registerProjectRoutes(api: Router, deps: { guards: Guards; projects: ProjectsRepository }) {
  const { guards, projects } = deps;
  const base = '/teams/:teamId/projects';

  api.get(base, guards.permission('project:read'), async (req, res) => {
    const { teamId } = requireTeam(req);
    const query = parseInput(projectListQuerySchema, req.query);
    sendJson(res, projectListSchema, { projects: await projects.list(teamId, query) });
  });

  api.post(base, guards.permission('project:write'), async (req, res) => {
    const { teamId, user } = requireTeam(req);
    const body = parseInput(createProjectSchema, req.body);
    sendJson(res, projectSchema, await projects.create(teamId, user.id, body), 201);
  });

  api.get(`${base}/:projectId`, guards.permission('project:read'), async (req, res) => {
    const { teamId } = requireTeam(req);
    const found = await projects.get(teamId, idParam(req, 'projectId', 'Project'));
    if (!found) throw errors.not_found('Project');
    sendJson(res, projectSchema, found);
  });

  api.patch(`${base}/:projectId`, guards.permission('project:write'), async (req, res) => {
    const { teamId } = requireTeam(req);
    const projectId = idParam(req, 'projectId', 'Project');
    const body = parseInput(updateProjectSchema, req.body);
    const updated = await projects.update(teamId, projectId, body);
    if (!updated) throw errors.not_found('Project');
    sendJson(res, projectSchema, updated);
  });
}

/** The projects route group for server/routes.ts. */
export const projectRouteGroup: RouteGroup = (api, { guards, services }) =>
  registerProjectRoutes(api, { guards, projects: createProjectsRepository({ db: services.db }) });

/** GET /teams/:teamId/work: the lists of versions waiting for the caller's role (see contracts/work.ts). */
import type { Router } from 'express';
import { workKindsByRole, workListSchema } from '../../contracts/work';
import { requireTeam } from '../http/guard';
import { sendJson } from '../http/validate';
import type { RouteGroup } from '../route-group';
import { createWorkRepository } from './work.repository';

/** Route group: every member has a work list; the role picks which lists, so a pilot still sees signed-off versions only. */
export const registerWorkRoutes: RouteGroup = (api: Router, { guards, services }) => {
  const work = createWorkRepository({ db: services.db });

  api.get('/teams/:teamId/work', guards.permission('team:read'), async (req, res) => {
    const { teamId, role } = requireTeam(req);
    const sections = [];
    for (const kind of workKindsByRole[role]) sections.push({ kind, items: await work.list(teamId, kind) });
    sendJson(res, workListSchema, { sections });
  });
};

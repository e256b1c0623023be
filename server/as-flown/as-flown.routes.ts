/**
 * As-flown checks of a version: POST /teams/:teamId/flights/:versionId/as-flown-checks (a photo log: metadata read
 * from the photos on the device, or a CSV log), GET …/as-flown-checks (newest first), GET …/as-flown-checks/:checkId
 * (the whole document). Planners and owners check any analysed version, pilots the signed-off ones they fly
 * (others are 404 to them, as for the leg sheet); surveyors read. The POST's body limit is in http/body-limits.ts.
 */
import type { Router } from 'express';
import { asFlownCheckListSchema, asFlownCheckSchema, newAsFlownCheckSchema } from '../../contracts/as-flown';
import { errors } from '../http/errors';
import { requireTeam } from '../http/guard';
import { parseInput, sendJson } from '../http/validate';
import type { RouteGroup } from '../route-group';
import { createVersionsRepository } from '../versions/versions.repository';
import { createAsFlownRepository } from './as-flown.repository';
import { createAsFlownUsecases } from './as-flown.usecases';

export const registerAsFlownRoutes: RouteGroup = (api: Router, { guards, services }) => {
  const versions = createVersionsRepository({ db: services.db });
  const repo = createAsFlownRepository({ db: services.db });
  const base = '/teams/:teamId/flights/:versionId/as-flown-checks';

  async function versionOf(teamId: string, role: Parameters<typeof versions.find>[0]['role'], versionId: string) {
    const v = await versions.find({ teamId, role, versionId });
    if (!v) throw errors.not_found('Flight');
    return v;
  }

  api.post(base, guards.permission('flight:check'), async (req, res) => {
    const { teamId, role, user } = requireTeam(req);
    const input = parseInput(newAsFlownCheckSchema, req.body);
    const v = await versionOf(teamId, role, String(req.params.versionId));
    const usecases = createAsFlownUsecases({ db: services.db, storage: services.storage, terrain: services.terrain, repo });
    const id = await usecases.check(v, user.id, input);
    const stored = await repo.find(teamId, v.id, id);
    sendJson(res, asFlownCheckSchema, stored!, 201);
  });

  api.get(base, guards.permission('flight:read'), async (req, res) => {
    const { teamId, role } = requireTeam(req);
    const v = await versionOf(teamId, role, String(req.params.versionId));
    res.setHeader('Cache-Control', 'private, no-cache');
    sendJson(res, asFlownCheckListSchema, { checks: await repo.list(teamId, v.id) });
  });

  api.get(`${base}/:checkId`, guards.permission('flight:read'), async (req, res) => {
    const { teamId, role } = requireTeam(req);
    const v = await versionOf(teamId, role, String(req.params.versionId));
    const check = await repo.find(teamId, v.id, String(req.params.checkId));
    if (!check) throw errors.not_found('As-flown check');
    // a check never changes once written
    res.setHeader('Cache-Control', 'private, max-age=3600');
    sendJson(res, asFlownCheckSchema, check);
  });
};

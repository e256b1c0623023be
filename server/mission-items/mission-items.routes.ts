/**
 * GET/POST .../flights/:versionId/triggers: photos as flown. GET /teams/:teamId/flights/:versionId/mission-items: the MAVLink mission items of a signed-off version as JSON
 * (`?download=1` answers it as a file). Pilots reach signed-off versions only (404 otherwise, as for the leg sheet);
 * other roles get 409 `not_signed_off` for a version not signed off.
 */
import type { Router } from 'express';
import { recordedTriggersSchema, recordTriggersSchema, triggerListSchema } from '../../contracts/flight-triggers';
import { missionItemsSchema } from '../../contracts/mission-items';
import { errors } from '../http/errors';
import { requireTeam } from '../http/guard';
import { parseInput, sendJson } from '../http/validate';
import type { RouteGroup } from '../routes';
import { createVersionsRepository } from '../reviews/versions.repository';
import { createFlightTriggersRepository } from './flight-triggers.repository';
import { missionItemsOf, requireSignedOff } from './mission-items.view';

/** Route group: mission items for the link and the pilot. */
export const registerMissionItemRoutes: RouteGroup = (api: Router, { guards, services }) => {
  const versions = createVersionsRepository({ db: services.db });
  api.get('/teams/:teamId/flights/:versionId/mission-items', guards.permission('flight:read'), async (req, res) => {
    const { teamId, role } = requireTeam(req);
    const v = await versions.find({ teamId, role, versionId: String(req.params.versionId) });
    if (!v) throw errors.notFound('Flight');
    const doc = missionItemsOf(v);
    res.setHeader('Cache-Control', 'private, no-store');
    if (req.query.download === '1') {
      const slug = v.planName.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'plan';
      res.setHeader('Content-Disposition', `attachment; filename="${slug}-v${v.number}-mission-items.json"`);
    }
    sendJson(res, missionItemsSchema, doc);
  });

  const triggers = createFlightTriggersRepository({ db: services.db });

  /** POST: photos as flown, forwarded by the link while the aircraft flies a signed-off version (batches of up to 1000). */
  api.post('/teams/:teamId/flights/:versionId/triggers', guards.permission('flight:record'), async (req, res) => {
    const { teamId, role, user } = requireTeam(req);
    const body = parseInput(recordTriggersSchema, req.body);
    const v = await versions.find({ teamId, role, versionId: String(req.params.versionId) });
    if (!v) throw errors.notFound('Flight');
    requireSignedOff(v);
    sendJson(res, recordedTriggersSchema, await triggers.record({ teamId, versionId: v.id, sortie: body.sortie, userId: user.id, triggers: body.triggers }), 201);
  });

  api.get('/teams/:teamId/flights/:versionId/triggers', guards.permission('flight:read'), async (req, res) => {
    const { teamId, role } = requireTeam(req);
    const v = await versions.find({ teamId, role, versionId: String(req.params.versionId) });
    if (!v) throw errors.notFound('Flight');
    res.setHeader('Cache-Control', 'private, no-store');
    sendJson(res, triggerListSchema, { triggers: await triggers.list(teamId, v.id) });
  });
};

/** GET /teams/:teamId/flights (signed-off versions) and GET /teams/:teamId/flights/:versionId/leg-sheet. */
import type { Router } from 'express';
import { flightListSchema, legSheetSchema } from '../../contracts/flights';
import { errors } from '../http/errors';
import { requireTeam } from '../http/guard';
import { sendJson } from '../http/validate';
import { requireAnalysed } from '../versions/result-view';
import type { RouteGroup } from '../route-group';
import { createVersionsRepository } from '../versions/versions.repository';
import { createFlightsRepository } from './flights.repository';
import { buildLegSheet } from './leg-sheet.build';

/** Route group: the pilot's flights. A pilot reaches signed-off versions only (the version query says so). */
export const registerFlightRoutes: RouteGroup = (api: Router, { guards, services }) => {
  const flights = createFlightsRepository({ db: services.db });
  const versions = createVersionsRepository({ db: services.db });
  const bodyCache = services.bodyCache;

  api.get('/teams/:teamId/flights', guards.permission('flight:read'), async (req, res) => {
    const { teamId } = requireTeam(req);
    const rows = await flights.signedOff(teamId);
    sendJson(res, flightListSchema, {
      flights: rows.map((r) => ({ ...r, signedOffBy: r.signedOffBy ?? null, signedOffAt: r.signedOffAt ? r.signedOffAt.toISOString() : null, flightTimeS: r.flightTimeS === null ? null : Number(r.flightTimeS) })),
    });
  });

  api.get('/teams/:teamId/flights/:versionId/leg-sheet', guards.permission('flight:read'), async (req, res) => {
    const { teamId, role } = requireTeam(req);
    const q = { teamId, versionId: String(req.params.versionId), role };
    const stamp = await versions.stamp(q);
    if (!stamp) throw errors.not_found('Flight');
    // Sheets change only with the version (the stamp); a short private cache lets a phone keep it when the network drops.
    await bodyCache.send(req, res, `leg-sheet:${stamp}`, async () => {
      const v = await versions.find(q);
      if (!v) throw errors.not_found('Flight');
      requireAnalysed(v);
      return legSheetSchema.parse(buildLegSheet(v));
    }, 'private, max-age=300');
  });
};

/**
 * GET/POST .../flights/:versionId/triggers: photos as flown. GET /teams/:teamId/flights/:versionId/mission-items (and
 * .../plans/:planId/versions/:versionId/mission-items beside the exports): the MAVLink mission items of a signed-off version as JSON
 * (`?download=1` answers it as a file). Pilots reach signed-off versions only (404 otherwise, as for the leg sheet);
 * other roles get 409 `not_signed_off` for a version not signed off.
 */
import type { Router } from 'express';
import { recordedTriggersSchema, recordTriggersSchema, triggerListSchema } from '../../contracts/flight-triggers';
import { linkStateSchema, reportLinkStateSchema } from '../../contracts/link-state';
import { liveCoverageSchema } from '../../contracts/live-coverage';
import { missionItemsSchema } from '../../contracts/mission-items';
import { errors } from '../http/errors';
import { requireTeam } from '../http/guard';
import { parseInput, sendJson } from '../http/validate';
import type { RouteGroup } from '../route-group';
import { createVersionsRepository } from '../versions/versions.repository';
import { createFlightTriggersRepository } from './flight-triggers.repository';
import { createLiveCoverageHub } from './live-coverage.service';
import { missionItemsOf, requireSignedOff } from './mission-items.view';

/** Route group: mission items for the link and the pilot. */
export const registerMissionItemRoutes: RouteGroup = (api: Router, { guards, services }) => {
  const versions = createVersionsRepository({ db: services.db });
  // The same list beside the flight exports (.../plans/:planId/versions/:versionId/export.*), found the same way.
  for (const path of ['/teams/:teamId/flights/:versionId/mission-items', '/teams/:teamId/plans/:planId/versions/:versionId/mission-items']) {
    api.get(path, guards.permission('flight:read'), async (req, res) => {
      const { teamId, role } = requireTeam(req);
      const planId = req.params.planId === undefined ? undefined : String(req.params.planId);
      const v = await versions.find({ teamId, role, planId, versionId: String(req.params.versionId) });
      if (!v) throw errors.not_found(planId === undefined ? 'Flight' : 'Plan version');
      const doc = missionItemsOf(v);
      res.setHeader('Cache-Control', 'private, no-store');
      if (req.query.download === '1') {
        const slug = v.planName.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'plan';
        res.setHeader('Content-Disposition', `attachment; filename="${slug}-v${v.number}-mission-items.json"`);
      }
      sendJson(res, missionItemsSchema, doc);
    });
  }

  const triggers = createFlightTriggersRepository({ db: services.db });
  const live = createLiveCoverageHub({
    db: services.db,
    storage: services.storage,
    terrain: services.terrain,
    throttleMs: services.config.env.LIVE_COVERAGE_SECONDS * 1000,
    log: (m) => console.error(m),
  });

  /** POST: photos as flown, forwarded by the link while the aircraft flies a signed-off version (batches of up to 1000). */
  api.post('/teams/:teamId/flights/:versionId/triggers', guards.permission('flight:record'), async (req, res) => {
    const { teamId, role, user } = requireTeam(req);
    const body = parseInput(recordTriggersSchema, req.body);
    const v = await versions.find({ teamId, role, versionId: String(req.params.versionId) });
    if (!v) throw errors.not_found('Flight');
    requireSignedOff(v);
    const recorded = await triggers.record({ teamId, versionId: v.id, sortie: body.sortie, userId: user.id, triggers: body.triggers });
    if (recorded.stored > 0) live.notify(v.id);
    sendJson(res, recordedTriggersSchema, recorded, 201);
  });

  /** POST .../flights/:versionId/link-state: the link says which step it is at (shown on the leg sheet over the live stream). */
  api.post('/teams/:teamId/flights/:versionId/link-state', guards.permission('flight:record'), async (req, res) => {
    const { teamId, role, user } = requireTeam(req);
    const body = parseInput(reportLinkStateSchema, req.body);
    const v = await versions.find({ teamId, role, versionId: String(req.params.versionId) });
    if (!v) throw errors.not_found('Flight');
    requireSignedOff(v);
    const state = { ...body, reportedAt: new Date().toISOString(), reportedBy: user.name ?? user.email };
    live.reportLink(v.id, state);
    sendJson(res, linkStateSchema, state, 201);
  });

  /**
   * GET .../flights/:versionId/live: server-sent events, one `coverage` event (a LiveCoverage document) at once and
   * after every recomputation while photos arrive (its map images only with `?map=1`), and a `link` event (the link's latest step) at once when there is
   * one and at each report; a comment every 15 s keeps proxies from closing the stream.
   */
  api.get('/teams/:teamId/flights/:versionId/live', guards.permission('flight:read'), async (req, res) => {
    const { teamId, role } = requireTeam(req);
    const v = await versions.find({ teamId, role, versionId: String(req.params.versionId) });
    if (!v) throw errors.not_found('Flight');
    requireSignedOff(v);
    // no-transform: the compression middleware leaves the stream alone, so each event leaves at once.
    res.writeHead(200, { 'Content-Type': 'text/event-stream; charset=utf-8', 'Cache-Control': 'private, no-cache, no-transform', Connection: 'keep-alive', 'X-Accel-Buffering': 'no' });
    res.write('retry: 5000\n\n');
    // The map images (a few hundred kB on a large site) go only to those who draw the map: `?map=1`.
    const withMap = req.query.map === '1';
    const unsubscribe = live.subscribe(teamId, v.id, {
      coverage: (doc) => res.write(`event: coverage\ndata: ${JSON.stringify(liveCoverageSchema.parse(withMap ? doc : { ...doc, map: null }))}\n\n`),
      link: (state) => res.write(`event: link\ndata: ${JSON.stringify(linkStateSchema.parse(state))}\n\n`),
    });
    const beat = setInterval(() => res.write(': still here\n\n'), 15_000);
    const streams = services.openStreams;
    streams.add(res);
    req.on('close', () => {
      clearInterval(beat);
      unsubscribe();
      streams.delete(res);
    });
  });

  api.get('/teams/:teamId/flights/:versionId/triggers', guards.permission('flight:read'), async (req, res) => {
    const { teamId, role } = requireTeam(req);
    const v = await versions.find({ teamId, role, versionId: String(req.params.versionId) });
    if (!v) throw errors.not_found('Flight');
    res.setHeader('Cache-Control', 'private, no-store');
    sendJson(res, triggerListSchema, { triggers: await triggers.list(teamId, v.id) });
  });
};

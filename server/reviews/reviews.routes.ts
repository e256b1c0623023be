/** Review transitions of a plan version (submit, sign-off, return), its review status, and the plan's audit trail. */
import type { Request, Router } from 'express';
import { auditTrailSchema, returnSchema, reviewActions, reviewNoteSchema, reviewTransitions, signOffSchema, versionReviewSchema } from '../../contracts/reviews';
import { requireTeam } from '../http/guard';
import { parseInput, sendJson } from '../http/validate';
import { createReportService } from '../reports/reports.service';
import type { RouteGroup } from '../route-group';
import { createReviewNotifier } from './reviews.notify';
import { createReviewsRepository } from './reviews.repository';
import { createReviewsUsecases } from './reviews.usecases';
import { createVersionsRepository } from '../versions/versions.repository';
import { createAsFlownRepository } from '../as-flown/as-flown.repository';
import { confirmFlownSchema, flownConfirmationSchema } from '../../contracts/flown-confirmation';
import { createTeamSettingsRepository } from '../teams/team-settings.repository';
import { createFlownConfirmation } from './flown-confirmation';

const plans = '/teams/:teamId/plans/:planId';
const version = `${plans}/versions/:versionId`;

/** Route group: review states and the audit trail. */
export const registerReviewRoutes: RouteGroup = (api: Router, { guards, services }) => {
  const { db, config } = services;
  const versions = createVersionsRepository({ db });
  const reviews = createReviewsRepository({ db });
  const reports = createReportService({ versions, storage: () => services.storage, asFlown: createAsFlownRepository({ db: services.db }), settings: createTeamSettingsRepository({ db: services.db }) });
  const usecases = createReviewsUsecases({
    versions,
    reviews,
    notify: (q) => createReviewNotifier({ mailer: services.mail, reviews, config })(q),
    mailer: () => services.mail,
  });

  const flown = createFlownConfirmation({ db, versions, checks: createAsFlownRepository({ db }), settings: createTeamSettingsRepository({ db }) });

  const target = (req: Request) => {
    const { teamId, role, user } = requireTeam(req);
    return { teamId, role, actor: user, planId: String(req.params.planId), versionId: String(req.params.versionId) };
  };

  api.get(`${version}/review`, guards.permission('plan:read'), async (req, res) => {
    sendJson(res, versionReviewSchema, await usecases.status(target(req)));
  });

  for (const action of reviewActions) {
    const { permission } = reviewTransitions[action];
    api.post(`${version}/${action}`, guards.permission(permission), async (req, res) => {
      if (action === 'sign-off') {
        const body = parseInput(signOffSchema, req.body ?? {});
        sendJson(res, versionReviewSchema, await usecases.transition({ ...target(req), action, comment: body.comment || null, reasons: body.reasons }));
        return;
      }
      const body = parseInput(action === 'return' ? returnSchema : reviewNoteSchema, req.body ?? {});
      const out = await usecases.transition({ ...target(req), action, comment: body.comment || null });
      sendJson(res, versionReviewSchema, out);
    });
  }

  // after the flight: the as-flown confirmation of a signed-off version (read by all who read plans; made by reviewers)
  api.get(`${version}/flown-confirmation`, guards.permission('plan:read'), async (req, res) => {
    const t = target(req);
    sendJson(res, flownConfirmationSchema, await flown.status(t));
  });
  api.post(`${version}/confirm-flown`, guards.permission('plan:review'), async (req, res) => {
    const t = target(req);
    const body = parseInput(confirmFlownSchema, req.body ?? {});
    sendJson(res, flownConfirmationSchema, await flown.confirm({ ...t, actorId: t.actor.id, comment: body.comment || null, reasons: body.reasons ?? [] }));
  });

  api.get(`${plans}/audit`, guards.permission('plan:read'), async (req, res) => {
    const { teamId } = requireTeam(req);
    sendJson(res, auditTrailSchema, await usecases.audit({ teamId, planId: String(req.params.planId) }));
  });
};

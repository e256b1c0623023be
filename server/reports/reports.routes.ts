/** GET .../versions/:versionId/report (JSON) and .../report.pdf: the compliance report of an analysed version. */
import type { Request, Router } from 'express';
import { complianceReportSchema } from '../../contracts/reports';
import { requireTeam } from '../http/guard';
import { sendJson } from '../http/validate';
import type { RouteGroup } from '../route-group';
import { createVersionsRepository } from '../versions/versions.repository';
import { createReportService } from './reports.service';
import { createTeamSettingsRepository } from '../teams/team-settings.repository';
import { createAsFlownRepository } from '../as-flown/as-flown.repository';

const base = '/teams/:teamId/plans/:planId/versions/:versionId';

/** Route group: compliance reports (report:read; pilots read leg sheets instead). */
export const registerReportRoutes: RouteGroup = (api: Router, { guards, services }) => {
  const reports = createReportService({ versions: createVersionsRepository({ db: services.db }), storage: () => services.storage, asFlown: createAsFlownRepository({ db: services.db }), settings: createTeamSettingsRepository({ db: services.db }) });
  const ids = (req: Request) => {
    const { teamId, role } = requireTeam(req);
    return { teamId, role, planId: String(req.params.planId), versionId: String(req.params.versionId) };
  };

  api.get(`${base}/report`, guards.permission('report:read'), async (req, res) => {
    sendJson(res, complianceReportSchema, await reports.report(ids(req)));
  });

  api.get(`${base}/report.pdf`, guards.permission('report:read'), async (req, res) => {
    const { pdf, fileName } = await reports.pdf(ids(req));
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
    res.setHeader('Cache-Control', 'private, no-store');
    res.end(pdf);
  });
};

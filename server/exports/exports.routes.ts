/** GET .../versions/:versionId/export.{geojson,kml,gpx,csv}: open-format exports (pilots: signed-off versions only). */
import type { Router } from 'express';
import { exportFormats, exportMedia, type ExportFormat } from '../../contracts/exports';
import { errors } from '../http/errors';
import { requireTeam } from '../http/guard';
import { requireAnalysed } from '../versions/result-view';
import type { RouteGroup } from '../route-group';
import { createVersionsRepository } from '../versions/versions.repository';
import { toCsv } from './csv';
import { exportContext, type ExportContext } from './export-context';
import { toGeoJson } from './geojson';
import { toGpx } from './gpx';
import { toKml } from './kml';

const writers: Record<ExportFormat, (ctx: ExportContext) => string> = {
  geojson: (ctx) => JSON.stringify(toGeoJson(ctx)),
  kml: toKml,
  gpx: toGpx,
  csv: toCsv,
};

/** Route group: exports. */
export const registerExportRoutes: RouteGroup = (api: Router, { guards, services }) => {
  const versions = createVersionsRepository({ db: services.db });
  for (const format of exportFormats) {
    api.get(`/teams/:teamId/plans/:planId/versions/:versionId/export.${format}`, guards.permission('flight:read'), async (req, res) => {
      const { teamId, role } = requireTeam(req);
      const v = await versions.find({ teamId, role, planId: String(req.params.planId), versionId: String(req.params.versionId) });
      if (!v) throw errors.not_found('Plan version');
      requireAnalysed(v);
      const ctx = exportContext(v);
      const media = exportMedia[format];
      res.setHeader('Content-Type', media.mime);
      res.setHeader('Content-Disposition', `attachment; filename="${ctx.slug}.${media.ext}"`);
      res.setHeader('Cache-Control', 'private, no-store');
      res.send(writers[format](ctx));
    });
  }
};

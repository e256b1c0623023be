/** /api/teams/:teamId/projects/:projectId/sites: upload a DEM, list, read, hillshade preview, rename, delete. */
import crypto from 'node:crypto';
import type { NextFunction, Request, Response, Router } from 'express';
import { duplicateSiteErrorSchema, siteListSchema, siteSchema, siteUpdateSchema, type DuplicateSiteError, type Site, type UnreadableSite } from '../../contracts/sites';
import { errors } from '../http/errors';
import { projectErrors } from '../projects/projects.errors';
import { siteErrors } from './sites.errors';
import { requireTeam, type Guards } from '../http/guard';
import { parseInput, sendJson } from '../http/validate';
import { createProjectsRepository, type ProjectsRepository } from '../projects/projects.repository';
import { idParam } from '../http/ids';
import type { RouteGroup } from '../route-group';
import { StorageNotFoundError, type Storage } from '../storage/storage';
import { receiveDemUpload, receivedFile, setUploadKey } from './site-upload';
import { createSitesRepository, toSite, type SitesRepository } from './sites.repository';
import { createSitesUsecases, siteKeys, type SitesUsecases } from './sites.usecases';

interface SiteRouteDeps {
  guards: Guards;
  projects: ProjectsRepository;
  sites: SitesRepository;
  usecases: SitesUsecases;
  storage: Storage;
  uploadLimitBytes: number;
}

function registerSiteRoutes(api: Router, deps: SiteRouteDeps) {
  const { guards, projects, sites, usecases, storage } = deps;
  const log = (err: unknown) => console.error(err);
  const base = '/teams/:teamId/projects/:projectId/sites';

  /** The project named by the route, in the caller's team. */
  async function projectOf(req: Request) {
    const { teamId } = requireTeam(req);
    const found = await projects.get(teamId, idParam(req, 'projectId', 'Project'));
    if (!found) throw errors.not_found('Project');
    return found;
  }

  /** Before the body is read: the project must exist and be open; then fix where the file goes. */
  async function prepareUpload(req: Request, _res: Response, next: NextFunction) {
    const p = await projectOf(req);
    if (p.archivedAt) throw projectErrors.project_archived('adding elevation grids');
    const siteId = crypto.randomUUID();
    req.params.siteId = siteId;
    setUploadKey(req, siteKeys.dem(p.teamId, siteId));
    next();
  }

  api.post(base, guards.permission('site:write'), prepareUpload, receiveDemUpload(storage, deps.uploadLimitBytes), async (req, res) => {
    const { teamId, user } = requireTeam(req);
    const file = receivedFile(req);
    if (!file) {
      throw errors.invalid('Attach the DEM (a GeoTIFF) in the form part named "file".', [{ path: 'file', message: 'Choose a GeoTIFF DEM to upload.' }]);
    }
    const out = await usecases.finishUpload({ teamId, projectId: String(req.params.projectId), siteId: String(req.params.siteId), userId: user.id, file, body: req.body });
    if ('duplicateOf' in out) {
      // the one error body with more than code and message: the client opens the existing site
      const e = siteErrors.duplicate_site();
      const body: DuplicateSiteError = { error: { code: 'duplicate_site', message: e.message, existingSiteId: out.duplicateOf } };
      res.status(e.status).json(duplicateSiteErrorSchema.parse(body));
      return;
    }
    await projects.touch(teamId, out.site.projectId);
    sendJson(res, siteSchema, out.site, 201);
  });

  api.get(base, guards.permission('site:read'), async (req, res) => {
    const p = await projectOf(req);
    const rows = await sites.list(p.teamId, p.id);
    // one damaged record must not take the whole list down: it is listed apart, with the reason, for deletion
    const good: Site[] = [];
    const unreadable: UnreadableSite[] = [];
    for (const row of rows) {
      const parsed = (() => {
        try {
          return siteSchema.safeParse(toSite(row));
        } catch (err) {
          return { success: false as const, error: err as Error };
        }
      })();
      if (parsed.success) good.push(parsed.data);
      else {
        log(new Error(`Site ${row.id} does not read as a site: ${parsed.error.message}`));
        unreadable.push({ id: row.id, name: row.name, fileName: row.fileName, createdAt: row.createdAt.toISOString(), problem: 'Its stored description cannot be read; delete it and upload the file again.' });
      }
    }
    sendJson(res, siteListSchema, { sites: good, unreadable });
  });

  async function siteOf(req: Request) {
    const p = await projectOf(req);
    const row = await sites.get(p.teamId, idParam(req, 'siteId', 'Site'), p.id);
    if (!row) throw errors.not_found('Site');
    return row;
  }

  api.get(`${base}/:siteId`, guards.permission('site:read'), async (req, res) => {
    sendJson(res, siteSchema, toSite(await siteOf(req)));
  });

  /** Stream a stored object; the keys of a site never change, so browsers may keep it. */
  async function sendObject(res: Response, key: string, type: string, disposition?: string) {
    let stream;
    try {
      stream = await storage.getStream(key);
    } catch (err) {
      if (err instanceof StorageNotFoundError) throw errors.not_found('The stored file');
      throw err;
    }
    res.setHeader('Content-Type', type);
    res.setHeader('Cache-Control', 'private, max-age=86400, immutable');
    if (disposition) res.setHeader('Content-Disposition', disposition);
    await new Promise<void>((resolve, reject) => {
      stream.on('error', reject);
      res.on('close', resolve);
      stream.pipe(res);
    });
  }

  api.get(`${base}/:siteId/hillshade.png`, guards.permission('site:read'), async (req, res) => {
    const row = await siteOf(req);
    await sendObject(res, row.hillshadeKey, 'image/png');
  });

  api.get(`${base}/:siteId/dem.tif`, guards.permission('site:read'), async (req, res) => {
    const row = await siteOf(req);
    const name = row.fileName.replace(/[^A-Za-z0-9._-]/g, '_');
    await sendObject(res, row.storageKey, 'image/tiff', `attachment; filename="${name}"`);
  });

  api.patch(`${base}/:siteId`, guards.permission('site:write'), async (req, res) => {
    const row = await siteOf(req);
    const change = parseInput(siteUpdateSchema, req.body);
    if (change.surfaceKind !== undefined || change.verticalDatum !== undefined) {
      // what the heights mean is part of every analysed version over this site: fixed once one exists
      const use = await sites.usage(row.teamId, row.id);
      if (use.versions > 0 && ((change.surfaceKind ?? row.surfaceKind) !== row.surfaceKind || (change.verticalDatum ?? row.verticalDatum) !== row.verticalDatum)) {
        throw siteErrors.site_in_use(null);
      }
    }
    const updated = await sites.update(row.teamId, row.id, change);
    sendJson(res, siteSchema, toSite(updated!));
  });

  api.delete(`${base}/:siteId`, guards.permission('site:write'), async (req, res) => {
    const p = await projectOf(req);
    await usecases.remove(p.teamId, p.id, idParam(req, 'siteId', 'Site'));
    await projects.touch(p.teamId, p.id);
    res.status(204).end();
  });
}

/** The sites route group for server/routes.ts. */
export const siteRouteGroup: RouteGroup = (api, { guards, services }) => {
  const storage = services.storage;
  const sites = createSitesRepository({ db: services.db });
  registerSiteRoutes(api, {
    guards,
    projects: createProjectsRepository({ db: services.db }),
    sites,
    usecases: createSitesUsecases({ sites, storage, terrain: services.terrain, maxPixels: services.config.env.DEM_MAX_PIXELS }),
    storage,
    uploadLimitBytes: services.config.uploadLimitBytes,
  });
};

/**
 * A version's coverage run: GET …/versions/:versionId/coverage (the compliance document, the layers' legends and
 * the addresses of the files), …/coverage.tif (the raster as a Cloud-Optimised GeoTIFF), …/coverage-layers/:measure.png
 * and …/coverage-failing.png (map images, one pixel per cell), …/coverage/cell?lon=&lat= (one cell's figures).
 */
import type { Request, Response, Router } from 'express';
import { z } from 'zod';
import { coverageCellSchema, coverageMeasureSchema, storedCoverageSchema, versionCoverageSchema, type VersionCoverage } from '../../contracts/coverage';
import { coverageMeasures } from '../../terrain/coverage-measures';
import { errors } from '../http/errors';
import { coverageErrors } from './coverage.errors';
import { requireTeam } from '../http/guard';
import { idParam } from '../http/ids';
import { parseInput, sendJson } from '../http/validate';
import type { RouteGroup } from '../route-group';
import { StorageNotFoundError, type Storage } from '../storage/storage';
import { coverageCellAt } from './coverage-cell';
import { coverageKeys } from './coverage-keys';
import { createCoverageRepository } from './coverage.repository';

const cellQuerySchema = z.object({
  lon: z.coerce.number({ error: 'lon must be a longitude in degrees.' }).gte(-180, { error: 'lon must be from -180 to 180.' }).lte(180, { error: 'lon must be from -180 to 180.' }),
  lat: z.coerce.number({ error: 'lat must be a latitude in degrees.' }).gte(-90, { error: 'lat must be from -90 to 90.' }).lte(90, { error: 'lat must be from -90 to 90.' }),
});

export const registerCoverageRoutes: RouteGroup = (api: Router, { guards, services }) => {
  const repo = createCoverageRepository({ db: services.db });
  const storage = (): Storage => services.storage;
  const oneVersion = '/teams/:teamId/plans/:planId/versions/:versionId';

  /** The version named by the route and its stored coverage (null while none is stored). */
  async function versionOf(req: Request) {
    const { teamId } = requireTeam(req);
    const planId = idParam(req, 'planId', 'Plan');
    const versionId = idParam(req, 'versionId', 'Version');
    const v = await repo.find(teamId, planId, versionId);
    if (!v) throw errors.not_found('Version');
    const stored = v.coverage === null ? null : storedCoverageSchema.parse(v.coverage);
    return { teamId, planId, versionId, v, stored, base: `/api/teams/${teamId}/plans/${planId}/versions/${versionId}` };
  }

  /** The ready coverage of the version, or 409 saying why there is none. */
  async function readyOf(req: Request) {
    const found = await versionOf(req);
    if (found.stored?.state !== 'ready') throw coverageErrors.coverage_unavailable(noneReason(found.v.analysisState, found.stored));
    return { ...found, stored: found.stored };
  }

  async function sendObject(res: Response, key: string, type: string, disposition?: string) {
    let stream;
    try {
      stream = await storage().getStream(key);
    } catch (err) {
      if (err instanceof StorageNotFoundError) throw errors.not_found('The stored coverage file');
      throw err;
    }
    res.setHeader('Content-Type', type);
    // a version's coverage never changes once stored
    res.setHeader('Cache-Control', 'private, max-age=86400, immutable');
    if (disposition) res.setHeader('Content-Disposition', disposition);
    await new Promise<void>((resolve, reject) => {
      stream.on('error', reject);
      res.on('close', resolve);
      stream.pipe(res);
    });
  }

  api.get(`${oneVersion}/coverage`, guards.permission('plan:read'), async (req, res) => {
    const { v, stored, base } = await versionOf(req);
    let body: VersionCoverage;
    if (stored?.state === 'ready') {
      body = {
        state: 'ready', document: stored.document,
        layers: stored.layers.map((l) => ({ ...l, imageUrl: `${base}/coverage-layers/${l.measure}.png` })),
        failingImageUrl: `${base}/coverage-failing.png`, rasterUrl: `${base}/coverage.tif`,
      };
    } else if (stored?.state === 'refused') body = stored;
    else body = { state: 'none', reason: noneReason(v.analysisState, null) };
    res.setHeader('Cache-Control', 'private, no-cache');
    sendJson(res, versionCoverageSchema, body);
  });

  api.get(`${oneVersion}/coverage.tif`, guards.permission('plan:read'), async (req, res) => {
    const { teamId, versionId, v } = await readyOf(req);
    const slug = v.planName.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'plan';
    await sendObject(res, coverageKeys.raster(teamId, versionId), 'image/tiff', `attachment; filename="${slug}-v${v.number}-coverage.tif"`);
  });

  api.get(`${oneVersion}/coverage-layers/:measure.png`, guards.permission('plan:read'), async (req, res) => {
    const measure = coverageMeasureSchema.safeParse(String(req.params.measure));
    if (!measure.success) throw errors.not_found(`The coverage layer (one of ${coverageMeasures.join(', ')})`);
    const { teamId, versionId } = await readyOf(req);
    await sendObject(res, coverageKeys.layer(teamId, versionId, measure.data), 'image/png');
  });

  api.get(`${oneVersion}/coverage-failing.png`, guards.permission('plan:read'), async (req, res) => {
    const { teamId, versionId } = await readyOf(req);
    await sendObject(res, coverageKeys.failing(teamId, versionId), 'image/png');
  });

  api.get(`${oneVersion}/coverage/cell`, guards.permission('plan:read'), async (req, res) => {
    const q = parseInput(cellQuerySchema, req.query);
    const { teamId, versionId, stored } = await readyOf(req);
    const key = coverageKeys.raster(teamId, versionId);
    const cell = await coverageCellAt(key, () => storage().getBytes(key), stored.document, q.lon, q.lat);
    res.setHeader('Cache-Control', 'private, max-age=86400, immutable');
    sendJson(res, coverageCellSchema, cell);
  });
};

/** Why a version has no coverage to show. */
function noneReason(analysisState: string, stored: { state: string; reason?: string } | null): string {
  if (stored?.state === 'refused' && stored.reason) return `The coverage run was refused: ${stored.reason}`;
  if (analysisState === 'queued' || analysisState === 'running') return 'The analysis has not finished; the coverage follows it.';
  if (analysisState === 'failed') return 'The analysis failed, so there is no coverage; see the version\'s error.';
  return 'This version was analysed before Loftline computed coverage per ground cell; run the plan again for a new version with its coverage.';
}

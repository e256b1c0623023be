/** Build the Express app (no listening): auth, JSON API, the web build with SPA fallback, one error middleware. */
import fs from 'node:fs';
import path from 'node:path';
import compression from 'compression';
import express, { type RequestHandler } from 'express';
import expressStaticGzip from 'express-static-gzip';
import type { ServerResponse } from 'node:http';
import type { Db } from '../db/client';
import type { Auth } from './auth/auth';
import { authHttpHandler } from './auth/auth-http';
import type { Config } from './config';
import { registerHealthRoutes } from './health/health.routes';
import { dataPreloader } from './http/data-preload';
import { logServerError } from './http/error-log';
import { apiNotFound, errorMiddleware, errors } from './http/errors';
import { createGuards, type Guards } from './http/guard';
import { requireSameOrigin, trustedOriginsOf } from './http/origin';
import { screenPreloader } from './http/screen-preload';
import { securityHeaders } from './http/security-headers';
import { refuseNulInBody, refuseNulInPath } from './http/text-guard';
import type { RouteGroup } from './route-group';
import type { Services } from './services';
import { asFlownChecksPath, PHOTO_LOG_JSON_LIMIT } from './http/body-limits';
import { createTeamsRepository } from './teams/teams.repository';
import { registerTeamRoutes } from './teams/teams.routes';
import { createTeamSettingsRepository } from './teams/team-settings.repository';

/** For an app built without services (a test of the HTTP layer): a route group that reaches for one is told so. */
function servicesNotGiven(base: Pick<Services, 'db' | 'auth' | 'config'>): Services {
  return new Proxy(base as Services, {
    get(target, key) {
      if (key in target) return target[key as keyof Services];
      throw new Error(`createApp was given no services, so "${String(key)}" is not set up: pass the services of createServices().`);
    },
  });
}

export interface AppDeps {
  db: Db;
  auth: Auth;
  config: Config;
  /** Route groups of the domains, given the shared guards and services. */
  routes?: RouteGroup[];
  services?: Services;
  log?: (err: unknown) => void;
}

/** Browsers and clients must say they send JSON; multipart is accepted only by upload routes (multer checks). */
const requireJsonBody: RequestHandler = (req, _res, next) => {
  const hasBody = Number(req.headers['content-length'] ?? 0) > 0 || req.headers['transfer-encoding'] !== undefined;
  if (!hasBody || !['POST', 'PUT', 'PATCH', 'DELETE'].includes(req.method)) return next();
  if (req.is('application/json') || req.is('multipart/form-data')) return next();
  next(errors.unsupported_media_type());
};

/** The client address, set from the socket so that sign-in rate limits cannot be dodged with a forged header. */
const clientAddress: RequestHandler = (req, _res, next) => {
  req.headers['x-forwarded-for'] = req.socket.remoteAddress ?? '127.0.0.1';
  next();
};

/**
 * Files whose names carry a content hash (the bundler's scripts, hashed assets) never change under that name:
 * cache them for a year as immutable. Everything else is revalidated (ETag) so a new build is picked up at once.
 */
export function staticCacheHeaders(res: ServerResponse, filePath: string): void {
  const name = path.basename(filePath).replace(/\.(br|gz)$/, ''); // a precompressed copy is cached as its original
  const hashed = /[.-][0-9a-f]{16,}(?:@\dx)?\.[a-z0-9]+$/i.test(name) || filePath.includes(`${path.sep}_expo${path.sep}static${path.sep}`);
  res.setHeader('Cache-Control', hashed ? 'public, max-age=31536000, immutable' : 'no-cache');
}

export function createApp(deps: AppDeps) {
  const { db, auth, config } = deps;
  const app = express();
  app.disable('x-powered-by');
  app.use(securityHeaders({ publicUrl: config.publicUrl, webDist: config.webDist }));
  // Text answers (API JSON, the app's scripts and styles) go compressed; bodies the body cache already gzipped are
  // left alone (compression skips a response that has a Content-Encoding).
  app.use(compression({ threshold: 1024 }));
  const guards = createGuards({ auth, db });
  app.use('/api/auth', clientAddress);
  // A signed-out session must not live on in the guards' short session cache.
  app.post('/api/auth/sign-out', (req, _res, next) => {
    guards.sessions.forget(req.headers.cookie ?? '');
    next();
  });
  // Before express.json(): better-auth reads the raw body.
  app.all('/api/auth/{*any}', authHttpHandler(auth, { failuresPerAccount: config.signInFailuresPerAccount, windowS: 15 * 60 }));

  const api = express.Router();
  api.use(requireSameOrigin(trustedOriginsOf(config.publicUrl))); // first: a cross-site request is refused unread
  api.use(refuseNulInPath);
  api.use(requireJsonBody);
  // Photo logs (metadata of thousands of photos, never the photos) get a larger body limit than other requests.
  const json = express.json({ limit: config.jsonLimit });
  const photoLogJson = express.json({ limit: PHOTO_LOG_JSON_LIMIT });
  api.use((req, res, next) => (req.method === 'POST' && asFlownChecksPath.test(req.path) ? photoLogJson : json)(req, res, next));
  api.use(refuseNulInBody);
  registerHealthRoutes(api, { guards, db });
  registerTeamRoutes(api, { guards, teams: createTeamsRepository({ db }), settings: createTeamSettingsRepository({ db }) });
  const services = deps.services ?? servicesNotGiven({ db, auth, config });
  for (const register of deps.routes ?? []) register(api, { guards, services });
  app.use('/api', api);
  app.use('/api', apiNotFound);

  if (config.webDist && fs.existsSync(path.join(config.webDist, 'index.html'))) {
    const dist = config.webDist;
    // The build's brotli and gzip copies (scripts/lib/precompress.ts), the smallest the browser accepts; files
    // without a copy (images, fonts) as they are.
    app.use(expressStaticGzip(dist, { index: false, enableBrotli: true, orderPreference: ['br', 'gz'], serveStatic: { index: false, setHeaders: staticCacheHeaders } }));
    // Single-page app: any other GET gets the shell and the router picks the screen.
    const preload = screenPreloader(dist);
    const preloadData = dataPreloader({ db, guards });
    app.get('/{*any}', async (req, res) => {
      // The shell goes out whatever happens to the hints: a failed lookup only costs the early answers.
      const data = await preloadData(req).catch(() => []);
      const link = [preload(req.path), ...data].filter(Boolean).join(', ');
      // The Link header depends on the caller's session: no shared cache may hand one caller's hints to another.
      res.sendFile(path.join(dist, 'index.html'), {
        cacheControl: false,
        headers: { 'Cache-Control': 'no-cache', ...(data.length ? { Vary: 'Cookie' } : {}), ...(link ? { Link: link } : {}) },
      });
    });
  }
  app.use(errorMiddleware(deps.log ?? logServerError));
  return { app, api, guards };
}

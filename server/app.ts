/** Build the Express app (no listening): auth, JSON API, the web build with SPA fallback, one error middleware. */
import fs from 'node:fs';
import path from 'node:path';
import express, { type RequestHandler } from 'express';
import type { Db } from '../db/client';
import type { Auth } from './auth/auth';
import { authHttpHandler } from './auth/auth-http';
import type { Config } from './config';
import { registerHealthRoutes } from './health/health.routes';
import { logServerError } from './http/error-log';
import { AppError, apiNotFound, errorMiddleware } from './http/errors';
import { createGuards, type Guards } from './http/guard';
import { requireSameOrigin, trustedOriginsOf } from './http/origin';
import { securityHeaders } from './http/security-headers';
import type { RouteGroup } from './routes';
import type { Services } from './services';
import { createTeamsRepository } from './teams/teams.repository';
import { registerTeamRoutes } from './teams/teams.routes';

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
  next(new AppError(415, 'unsupported_media_type', 'Send the request body as JSON (Content-Type: application/json).'));
};

/** The client address, set from the socket so that sign-in rate limits cannot be dodged with a forged header. */
const clientAddress: RequestHandler = (req, _res, next) => {
  req.headers['x-forwarded-for'] = req.socket.remoteAddress ?? '127.0.0.1';
  next();
};

export function createApp(deps: AppDeps) {
  const { db, auth, config } = deps;
  const app = express();
  app.disable('x-powered-by');
  app.use(securityHeaders({ publicUrl: config.publicUrl, webDist: config.webDist }));
  app.use('/api/auth', clientAddress);
  // Before express.json(): better-auth reads the raw body.
  app.all('/api/auth/{*any}', authHttpHandler(auth, { failuresPerAccount: config.signInFailuresPerAccount, windowS: 15 * 60 }));

  const guards = createGuards({ auth, db });
  const api = express.Router();
  api.use(requireSameOrigin(trustedOriginsOf(config.publicUrl))); // first: a cross-site request is refused unread
  api.use(requireJsonBody);
  api.use(express.json({ limit: config.jsonLimit }));
  registerHealthRoutes(api, { guards, db });
  registerTeamRoutes(api, { guards, teams: createTeamsRepository({ db }) });
  const services: Services = deps.services ?? { db, auth, config };
  for (const register of deps.routes ?? []) register(api, { guards, services });
  app.use('/api', api);
  app.use('/api', apiNotFound);

  if (config.webDist && fs.existsSync(path.join(config.webDist, 'index.html'))) {
    const dist = config.webDist;
    app.use(express.static(dist, { index: false, maxAge: '1h' }));
    // Single-page app: any other GET gets the shell and the router picks the screen.
    app.get('/{*any}', (_req, res) => res.sendFile(path.join(dist, 'index.html'), { maxAge: 0 }));
  }
  app.use(errorMiddleware(deps.log ?? logServerError));
  return { app, api, guards };
}

/** The shape of a route group: what server/routes.ts lists and server/app.ts mounts, apart from both so neither is imported back. */
import type { Router } from 'express';
import type { Guards } from './http/guard';
import type { Services } from './services';

export type RouteGroup = (api: Router, ctx: { guards: Guards; services: Services }) => void;

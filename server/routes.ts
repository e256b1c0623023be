/** Every route group beyond the core ones, in one list so start-up and tests mount the same API. */
import type { RouteGroup } from './route-group';
import { projectRouteGroup } from './projects/projects.routes';
import { siteRouteGroup } from './sites/sites.routes';
import { planRouteGroup } from './plans/plans.routes';
import { registerExportRoutes } from './exports/exports.routes';
import { registerFlightRoutes } from './flights/flights.routes';
import { registerMissionItemRoutes } from './mission-items/mission-items.routes';
import { registerAsFlownRoutes } from './as-flown/as-flown.routes';
import { registerCoverageRoutes } from './coverage/coverage.routes';
import { registerInvitationRoutes } from './invitations/invitations.routes';
import { registerOutboxRoutes } from './mail/outbox.routes';
import { registerReportRoutes } from './reports/reports.routes';
import { registerReviewRoutes } from './reviews/reviews.routes';
import { registerWorkRoutes } from './work/work.routes';

/** Route groups of the domains (projects, sites, plans, reviews…), in mount order. */
export const routeGroups: RouteGroup[] = [
  projectRouteGroup,
  siteRouteGroup,
  planRouteGroup,
  registerReviewRoutes,
  registerReportRoutes,
  registerOutboxRoutes,
  registerInvitationRoutes,
  registerFlightRoutes,
  registerExportRoutes,
  registerMissionItemRoutes,
  registerAsFlownRoutes,
  registerCoverageRoutes,
  registerWorkRoutes,
];

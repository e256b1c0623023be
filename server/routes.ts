/** Every route group beyond the core ones, in one list so start-up and tests mount the same API. */
import type { AppDeps } from './app';

/** Route groups of the domains (projects, sites, plans, reviews…), given shared services. */
export function domainRoutes(): NonNullable<AppDeps['routes']> {
  return [];
}

/** The signed-in user and their teams (GET /api/me): the app's session check. */
import { useQuery } from '@tanstack/react-query';
import { meSchema } from '../../contracts/teams';
import { apiFetch } from './api-fetch';
import { apiPaths } from '../../contracts/api-paths';

/** Query keys for the signed-in user. */
export const meKeys = {
  all: ['me'] as const,
};

/** Fetches the signed-in user; a 401 ApiError means "no session". */
function fetchMe(signal?: AbortSignal) {
  return apiFetch(apiPaths.me, { schema: meSchema, signal });
}

/**
 * The signed-in user and teams; the query errors with status 401 when nobody is signed in. A known "no session"
 * is not asked again each time another gate mounts: signing in refetches it explicitly.
 */
export function useMe() {
  return useQuery({ queryKey: meKeys.all, queryFn: ({ signal }) => fetchMe(signal), retryOnMount: false });
}

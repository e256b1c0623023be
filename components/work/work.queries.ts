/** The signed-in person's work list in the current team (GET /api/teams/:teamId/work). */
import { useQuery } from '@tanstack/react-query';
import { workListSchema } from '../../contracts/work';
import { apiFetch } from '../api/api-fetch';
import { apiPaths } from '../../contracts/api-paths';

/** Query keys for work lists, per team (review changes invalidate the whole team prefix). */
const workKeys = {
  all: ['work'] as const,
  team: (teamId: string) => [...workKeys.all, teamId] as const,
};

/** The lists for the caller's role; asked again whenever the screen opens, since others move versions between them. */
export function useWorkList(teamId: string | undefined) {
  return useQuery({
    queryKey: workKeys.team(teamId ?? ''),
    queryFn: ({ signal }) => apiFetch(apiPaths.work(teamId!), { schema: workListSchema, signal }),
    enabled: Boolean(teamId),
    staleTime: 0,
  });
}

/** As-flown checks of a version (GET/POST /api/teams/:teamId/flights/:versionId/as-flown-checks, GET …/:checkId). */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { asFlownCheckListSchema, asFlownCheckSchema, type AsFlownCheck, type NewAsFlownCheck } from '../../contracts/as-flown';
import { apiFetch } from '../api/api-fetch';
import { flightKeys } from '../flights/flights.queries';

const checksPath = (teamId: string, versionId: string) => `/api/teams/${encodeURIComponent(teamId)}/flights/${encodeURIComponent(versionId)}/as-flown-checks`;
const keys = {
  list: (teamId: string, versionId: string) => [...flightKeys.team(teamId), 'as-flown', versionId] as const,
  one: (teamId: string, versionId: string, checkId: string) => [...flightKeys.team(teamId), 'as-flown', versionId, checkId] as const,
};

export function useAsFlownChecksQuery(teamId: string | undefined, versionId: string, enabled: boolean) {
  return useQuery({
    queryKey: keys.list(teamId ?? '', versionId),
    queryFn: ({ signal }) => apiFetch(checksPath(teamId!, versionId), { schema: asFlownCheckListSchema, signal }),
    enabled: Boolean(teamId) && enabled,
  });
}

export function useAsFlownCheckQuery(teamId: string | undefined, versionId: string, checkId: string | null) {
  return useQuery({
    queryKey: keys.one(teamId ?? '', versionId, checkId ?? ''),
    queryFn: ({ signal }) => apiFetch(`${checksPath(teamId!, versionId)}/${encodeURIComponent(checkId!)}`, { schema: asFlownCheckSchema, signal }),
    enabled: Boolean(teamId) && checkId !== null,
    // a check never changes once written
    staleTime: Infinity,
  });
}

/** Sends a photo log (metadata only) to be checked; the new check goes straight into the cache. */
export function useCreateAsFlownCheck(teamId: string | undefined, versionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: NewAsFlownCheck) => apiFetch(checksPath(teamId!, versionId), { method: 'POST', body, schema: asFlownCheckSchema }),
    onSuccess: (check: AsFlownCheck) => {
      queryClient.setQueryData(keys.one(teamId ?? '', versionId, check.id), check);
      return queryClient.invalidateQueries({ queryKey: keys.list(teamId ?? '', versionId) });
    },
  });
}

/** A signed-off version's MAVLink mission items (GET /api/teams/:teamId/flights/:versionId/mission-items). */
import { useQuery } from '@tanstack/react-query';
import { triggerListSchema } from '../../contracts/flight-triggers';
import { missionItemsSchema } from '../../contracts/mission-items';
import { apiFetch } from '../api/api-fetch';
import { flightKeys } from './flights.queries';

/** API path of the item list; `download` asks for it as a file. */
export const missionItemsPath = (teamId: string, versionId: string, download = false) =>
  `/api/teams/${encodeURIComponent(teamId)}/flights/${encodeURIComponent(versionId)}/mission-items${download ? '?download=1' : ''}`;

/** The item list; only asked for when `enabled` (a signed-off version, online). */
export function useMissionItemsQuery(teamId: string | undefined, versionId: string, enabled: boolean) {
  return useQuery({
    queryKey: [...flightKeys.team(teamId ?? ''), 'mission-items', versionId] as const,
    queryFn: ({ signal }) => apiFetch(missionItemsPath(teamId!, versionId), { schema: missionItemsSchema, signal }),
    enabled: Boolean(teamId) && enabled,
    // Items change only with their version.
    staleTime: Infinity,
  });
}

/** Photos recorded as flown (the link's --follow), asked for again every 15 s while the sheet is open and online. */
export function useFlightTriggersQuery(teamId: string | undefined, versionId: string, enabled: boolean) {
  return useQuery({
    queryKey: [...flightKeys.team(teamId ?? ''), 'triggers', versionId] as const,
    queryFn: ({ signal }) => apiFetch(`/api/teams/${encodeURIComponent(teamId!)}/flights/${encodeURIComponent(versionId)}/triggers`, { schema: triggerListSchema, signal }),
    enabled: Boolean(teamId) && enabled,
    refetchInterval: enabled ? 15_000 : false,
  });
}

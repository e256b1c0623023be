/** The team's signed-off flights (GET /api/teams/:teamId/flights) and one version's leg sheet. */
import { useQuery } from '@tanstack/react-query';
import { flightListSchema, legSheetSchema } from '../../contracts/flights';
import type { ExportFormat } from '../../contracts/exports';
import { apiFetch } from '../api/api-fetch';
import { apiPaths } from '../../contracts/api-paths';

/** Query keys for flights, per team. */
export const flightKeys = {
  all: ['flights'] as const,
  team: (teamId: string) => [...flightKeys.all, teamId] as const,
  list: (teamId: string) => [...flightKeys.team(teamId), 'list'] as const,
  sheet: (teamId: string, versionId: string) => [...flightKeys.team(teamId), 'sheet', versionId] as const,
};

/** API path of one export of a version (GeoJSON, KML, GPX, CSV). */
export const exportPath = (teamId: string, planId: string, versionId: string, format: ExportFormat) =>
  `${apiPaths.version(teamId, planId, versionId)}/export.${format}`;

/** Signed-off versions of the team, newest sign-off first. */
export function useFlights(teamId: string | undefined) {
  return useQuery({
    queryKey: flightKeys.list(teamId ?? ''),
    queryFn: ({ signal }) => apiFetch(apiPaths.flights(teamId!), { schema: flightListSchema, signal }),
    enabled: Boolean(teamId),
    select: (d) => d.flights,
  });
}

/** The leg sheet of one version (pilots: signed-off versions only). */
export function useLegSheetQuery(teamId: string | undefined, versionId: string | undefined) {
  return useQuery({
    queryKey: flightKeys.sheet(teamId ?? '', versionId ?? ''),
    queryFn: ({ signal }) => apiFetch(apiPaths.legSheet(teamId!, versionId!), { schema: legSheetSchema, signal }),
    enabled: Boolean(teamId && versionId),
    // A sheet changes only with its version; no need to ask again while the page stays open.
    staleTime: Infinity,
  });
}

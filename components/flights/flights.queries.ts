/** The team's signed-off flights (GET /api/teams/:teamId/flights) and one version's leg sheet. */
import { useQuery } from '@tanstack/react-query';
import { flightListSchema, legSheetSchema } from '../../contracts/flights';
import type { ExportFormat } from '../../contracts/exports';
import { apiFetch } from '../api/api-fetch';

/** Query keys for flights, per team. */
export const flightKeys = {
  all: ['flights'] as const,
  team: (teamId: string) => [...flightKeys.all, teamId] as const,
  list: (teamId: string) => [...flightKeys.team(teamId), 'list'] as const,
  sheet: (teamId: string, versionId: string) => [...flightKeys.team(teamId), 'sheet', versionId] as const,
};

const teamPath = (teamId: string) => `/api/teams/${encodeURIComponent(teamId)}`;

/** API path of a version's leg sheet. */
const legSheetPath = (teamId: string, versionId: string) => `${teamPath(teamId)}/flights/${encodeURIComponent(versionId)}/leg-sheet`;

/** API path of one export of a version (GeoJSON, KML, GPX, CSV). */
export const exportPath = (teamId: string, planId: string, versionId: string, format: ExportFormat) =>
  `${teamPath(teamId)}/plans/${encodeURIComponent(planId)}/versions/${encodeURIComponent(versionId)}/export.${format}`;

/** Signed-off versions of the team, newest sign-off first. */
export function useFlights(teamId: string | undefined) {
  return useQuery({
    queryKey: flightKeys.list(teamId ?? ''),
    queryFn: ({ signal }) => apiFetch(`${teamPath(teamId!)}/flights`, { schema: flightListSchema, signal }),
    enabled: Boolean(teamId),
    select: (d) => d.flights,
  });
}

/** The leg sheet of one version (pilots: signed-off versions only). */
export function useLegSheetQuery(teamId: string | undefined, versionId: string | undefined) {
  return useQuery({
    queryKey: flightKeys.sheet(teamId ?? '', versionId ?? ''),
    queryFn: ({ signal }) => apiFetch(legSheetPath(teamId!, versionId!), { schema: legSheetSchema, signal }),
    enabled: Boolean(teamId && versionId),
    // A sheet changes only with its version; no need to ask again while the page stays open.
    staleTime: Infinity,
  });
}

/** The coverage run of a version and the figures of a tapped cell (react-query). */
import { useQuery } from '@tanstack/react-query';
import { coverageCellSchema, versionCoverageSchema } from '../../contracts/coverage';
import { apiFetch } from '../api/api-fetch';
import { planKeys, planPath } from '../plans/plans.queries';

const coveragePath = (teamId: string, planId: string, versionId: string) => `${planPath(teamId, planId)}/versions/${encodeURIComponent(versionId)}/coverage`;

export function useVersionCoverage(teamId: string | undefined, planId: string | undefined, versionId: string | undefined, ready: boolean) {
  return useQuery({
    queryKey: [...planKeys.version(teamId ?? '', planId ?? '', versionId ?? ''), 'coverage'],
    queryFn: ({ signal }) => apiFetch(coveragePath(teamId as string, planId as string, versionId as string), { schema: versionCoverageSchema, signal }),
    enabled: Boolean(teamId && planId && versionId) && ready,
    staleTime: Infinity, // a settled version's coverage never changes
  });
}

export function useCoverageCell(teamId: string | undefined, planId: string | undefined, versionId: string | undefined, at: { lon: number; lat: number } | null) {
  const lon = at ? at.lon.toFixed(7) : '';
  const lat = at ? at.lat.toFixed(7) : '';
  return useQuery({
    queryKey: [...planKeys.version(teamId ?? '', planId ?? '', versionId ?? ''), 'coverage-cell', lon, lat],
    queryFn: ({ signal }) => apiFetch(`${coveragePath(teamId as string, planId as string, versionId as string)}/cell?lon=${lon}&lat=${lat}`, { schema: coverageCellSchema, signal }),
    enabled: Boolean(teamId && planId && versionId && at),
    staleTime: Infinity,
  });
}

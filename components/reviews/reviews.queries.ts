/** Review status of a plan version, the plan's audit trail, and the review actions (submit, sign off, return). */
import { apiPaths } from '../../contracts/api-paths';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { auditTrailSchema, versionReviewSchema, type ReviewAction, type VersionReview, type SignOffReason } from '../../contracts/reviews';
import { apiFetch } from '../api/api-fetch';

/** Query keys for reviews, per team. */
export const reviewKeys = {
  all: ['reviews'] as const,
  team: (teamId: string) => [...reviewKeys.all, teamId] as const,
  status: (teamId: string, planId: string, versionId: string) => [...reviewKeys.team(teamId), 'status', planId, versionId] as const,
  audit: (teamId: string, planId: string) => [...reviewKeys.team(teamId), 'audit', planId] as const,
};

/** API path of one version: /api/teams/:teamId/plans/:planId/versions/:versionId. */
export const versionApiPath = apiPaths.version;

/** The version's review state and the actions the caller's role may take next. */
export function useVersionReview(teamId: string | undefined, planId: string | undefined, versionId: string | undefined) {
  return useQuery({
    queryKey: reviewKeys.status(teamId ?? '', planId ?? '', versionId ?? ''),
    queryFn: ({ signal }) => apiFetch(`${versionApiPath(teamId!, planId!, versionId!)}/review`, { schema: versionReviewSchema, signal }),
    enabled: Boolean(teamId && planId && versionId),
  });
}

/** Every state change of the plan's versions (and the mail they sent). */
export function useAuditTrail(teamId: string | undefined, planId: string | undefined) {
  return useQuery({
    queryKey: reviewKeys.audit(teamId ?? '', planId ?? ''),
    queryFn: ({ signal }) => apiFetch(`${apiPaths.plan(teamId!, planId!)}/audit`, { schema: auditTrailSchema, signal }),
    enabled: Boolean(teamId && planId),
    select: (d) => d.events,
  });
}

/** Runs one review action; afterwards the status, the trail, the plan's versions and the flights list are read again. */
export function useReviewAction(teamId: string, planId: string, versionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ action, comment, reasons }: { action: ReviewAction; comment?: string; reasons?: SignOffReason[] }) =>
      apiFetch(`${versionApiPath(teamId, planId, versionId)}/${action}`, {
        method: 'POST',
        body: { ...(comment ? { comment } : {}), ...(reasons?.length ? { reasons } : {}) },
        schema: versionReviewSchema,
      }),
    onSuccess: (review: VersionReview) => {
      queryClient.setQueryData(reviewKeys.status(teamId, planId, versionId), review);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: reviewKeys.audit(teamId, planId) }),
        // Key prefixes of the plans queries (components/plans) and the flights list (components/flights): both show the state.
        queryClient.invalidateQueries({ queryKey: ['plans', teamId] }),
        queryClient.invalidateQueries({ queryKey: ['flights', teamId] }),
        queryClient.invalidateQueries({ queryKey: ['reports', teamId] }),
        queryClient.invalidateQueries({ queryKey: ['work', teamId] }),
      ]);
    },
  });
}

/** Teams (POST /api/teams): creating a team; the list of a user's teams comes with GET /api/me. */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { teamSummarySchema, type CreateTeam } from '../../contracts/teams';
import { apiFetch } from './api-fetch';
import { meKeys } from './me.queries';

/** Query keys for teams (the list itself lives under meKeys). */
const teamKeys = {
  all: ['teams'] as const,
};

/** Creates a team with the caller as its owner, then refreshes the user's team list. */
export function useCreateTeam() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...teamKeys.all, 'create'],
    mutationFn: (input: CreateTeam) => apiFetch('/api/teams', { method: 'POST', body: input, schema: teamSummarySchema }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: meKeys.all }),
  });
}

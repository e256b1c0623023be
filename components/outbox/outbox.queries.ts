/** The development outbox (GET /api/teams/:teamId/dev/outbox): mail the in-process fake SMTP server received. */
import { useQuery } from '@tanstack/react-query';
import { outboxSchema } from '../../contracts/outbox';
import { ApiError } from '../api/api-error';
import { apiFetch } from '../api/api-fetch';

/** Query keys for the outbox, per team. */
const outboxKeys = {
  all: ['outbox'] as const,
  team: (teamId: string) => [...outboxKeys.all, teamId] as const,
};

/** True when the server said the outbox is off (real SMTP or no mail): a 404, not a failure. */
export function isOutboxOff(error: unknown): boolean {
  return error instanceof ApiError && error.status === 404;
}

/** The team's received mail, newest first; `enabled` false for roles without outbox:read. */
export function useOutbox(teamId: string | undefined, enabled: boolean) {
  return useQuery({
    queryKey: outboxKeys.team(teamId ?? ''),
    queryFn: ({ signal }) => apiFetch(`/api/teams/${encodeURIComponent(teamId!)}/dev/outbox`, { schema: outboxSchema, signal }),
    enabled: Boolean(teamId) && enabled,
    retry: false,
    select: (d) => d.messages,
  });
}

/** Team members (GET/PATCH/DELETE /api/teams/:teamId/members): listing, role changes and removal. */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Role } from '../../contracts/roles';
import { membersSchema } from '../../contracts/teams';
import { apiFetch } from './api-fetch';
import { meKeys } from './me.queries';

/** Query keys for members, one list per team. */
const memberKeys = {
  all: ['members'] as const,
  list: (teamId: string) => [...memberKeys.all, teamId] as const,
};

const membersPath = (teamId: string) => `/api/teams/${encodeURIComponent(teamId)}/members`;
const memberPath = (teamId: string, memberId: string) => `${membersPath(teamId)}/${encodeURIComponent(memberId)}`;

/** The members of `teamId`; idle while no team is chosen or the role may not read members. */
export function useMembers(teamId: string | undefined, enabled = true) {
  return useQuery({
    queryKey: memberKeys.list(teamId ?? ''),
    queryFn: ({ signal }) => apiFetch(membersPath(teamId as string), { schema: membersSchema, signal }),
    enabled: Boolean(teamId) && enabled,
    select: (data) => data.members,
  });
}

/** Sets one member's role (owners only; the server refuses to demote the last owner). */
export function useUpdateMemberRole(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ memberId, role }: { memberId: string; role: Role }) =>
      apiFetch(memberPath(teamId, memberId), { method: 'PATCH', body: { role } }),
    onSettled: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: memberKeys.list(teamId) }),
        // The caller may have changed their own role, which changes their menus.
        queryClient.invalidateQueries({ queryKey: meKeys.all }),
      ]),
  });
}

/** Removes a member from the team (owners only; the server refuses to remove the last owner). */
export function useRemoveMember(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ memberId }: { memberId: string }) => apiFetch(memberPath(teamId, memberId), { method: 'DELETE' }),
    onSettled: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: memberKeys.list(teamId) }),
        queryClient.invalidateQueries({ queryKey: meKeys.all }),
      ]),
  });
}

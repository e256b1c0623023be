/** Invitations: the owner's list, invite and revoke (per team); the invited person's preview and accept (per token). */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  acceptedInvitationSchema,
  createdInvitationSchema,
  invitationListSchema,
  invitationPreviewSchema,
  invitationSchema,
  type CreateInvitation,
} from '../../contracts/invitations';
import { apiFetch } from '../api/api-fetch';
import { meKeys } from '../api/me.queries';

/** Query keys for invitations. */
const invitationKeys = {
  all: ['invitations'] as const,
  list: (teamId: string) => [...invitationKeys.all, 'team', teamId] as const,
  preview: (token: string) => [...invitationKeys.all, 'token', token] as const,
};

const listPath = (teamId: string) => `/api/teams/${encodeURIComponent(teamId)}/invitations`;
const tokenPath = (token: string) => `/api/invitations/${encodeURIComponent(token)}`;

/** The team's invitations, every status (owners only: invitation:manage). */
export function useInvitations(teamId: string | undefined, enabled = true) {
  return useQuery({
    queryKey: invitationKeys.list(teamId ?? ''),
    queryFn: ({ signal }) => apiFetch(listPath(teamId!), { schema: invitationListSchema, signal }),
    enabled: Boolean(teamId) && enabled,
    select: (d) => d.invitations,
  });
}

/** Invites an address with a role; the server mails the link (or says why it did not). */
export function useCreateInvitation(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateInvitation) => apiFetch(listPath(teamId), { method: 'POST', body: input, schema: createdInvitationSchema }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: invitationKeys.list(teamId) }),
  });
}

/** Revokes a pending invitation: its link stops working at once. */
export function useRevokeInvitation(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ invitationId }: { invitationId: string }) =>
      apiFetch(`${listPath(teamId)}/${encodeURIComponent(invitationId)}`, { method: 'DELETE', schema: invitationSchema }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: invitationKeys.list(teamId) }),
  });
}

/** What the link offers; the server answers only to the invited address (403 for anyone else). */
export function useInvitationPreview(token: string | undefined, enabled: boolean) {
  return useQuery({
    queryKey: invitationKeys.preview(token ?? ''),
    queryFn: ({ signal }) => apiFetch(tokenPath(token!), { schema: invitationPreviewSchema, signal }),
    enabled: Boolean(token) && enabled,
    retry: false,
  });
}

/** Accepts the invitation; the user's team list is read again so the new team is there at once. */
export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiFetch(`${tokenPath(token)}/accept`, { method: 'POST', body: {}, schema: acceptedInvitationSchema }),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: invitationKeys.preview(token) }),
        queryClient.refetchQueries({ queryKey: meKeys.all }),
      ]),
  });
}

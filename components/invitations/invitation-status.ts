/** Invitation statuses in words, and which invitations the owner's list shows first. */
import type { Invitation, InvitationStatus } from '../../contracts/invitations';
import type { BadgeTone } from '../ui/badge';

export const invitationStatusLabels: Record<InvitationStatus, { label: string; tone: BadgeTone }> = {
  pending: { label: 'Pending', tone: 'info' },
  accepted: { label: 'Accepted', tone: 'success' },
  revoked: { label: 'Revoked', tone: 'neutral' },
  expired: { label: 'Expired', tone: 'caution' },
};

/** Pending first (soonest expiry first), then the rest newest first: what the owner can still act on comes on top. */
export function orderInvitations(list: readonly Invitation[]): Invitation[] {
  const pending = list.filter((i) => i.status === 'pending').sort((a, b) => Date.parse(a.expiresAt) - Date.parse(b.expiresAt));
  const rest = list.filter((i) => i.status !== 'pending').sort((a, b) => Date.parse(b.createdAt) - Date.parse(a.createdAt));
  return [...pending, ...rest];
}

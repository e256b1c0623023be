/** Error codes of invitations, as data (status and message template); see defineErrors. */
import { defineErrors } from '../http/errors';

export const invitationErrors = defineErrors('invitations', {
  invitation_other_address: { status: 403, message: () => 'This invitation was sent to another e-mail address. Sign in with the address it was sent to.' },
  invitation_used: { status: 409, message: () => 'This invitation has already been used. Ask the team owner for a new one if you need it.' },
  invitation_revoked: { status: 410, message: () => 'This invitation was revoked by the team owner.' },
  invitation_expired: { status: 410, message: () => 'This invitation has expired. Ask the team owner to send a new one.' },
  /** `who` is "You are" for the invitee, or the address for the owner inviting; `role` the member's role label. */
  already_member: {
    status: 409,
    message: (who: 'you' | string, roleLabel?: string) =>
      who === 'you'
        ? `You are already a member of this team${roleLabel ? ` (as ${roleLabel})` : ''}; ask the owner to change your role instead.`
        : `${who} is already a member of this team (as ${roleLabel}).`,
  },
  already_invited: { status: 409, message: (email: string, untilDay: string) => `${email} already has a pending invitation (until ${untilDay}); revoke it to send a new one.` },
  invitation_not_pending: { status: 409, message: (state: string) => `This invitation is ${state}; only a pending invitation can be revoked.` },
  mail_queue_unavailable: { status: 503, message: () => 'The invitation e-mail could not be queued, so the invitation was not made. Nothing was saved: try again in a moment.' },
});

/** Team invitations: an owner invites an address with a role; the link works once, for that address, until it expires. */
import { z } from 'zod';
import { userText } from './text';
import { roleSchema } from './roles';

export const createInvitationSchema = z.object({
  email: userText().trim().toLowerCase().min(1, 'Enter the e-mail address to invite.').email('Enter an e-mail address like name@example.com.'),
  role: roleSchema,
});
export type CreateInvitation = z.infer<typeof createInvitationSchema>;

const invitationStatuses = ['pending', 'accepted', 'revoked', 'expired'] as const;
const invitationStatusSchema = z.enum(invitationStatuses);
export type InvitationStatus = z.infer<typeof invitationStatusSchema>;

/** One invitation as the owner sees it. */
export const invitationSchema = z.object({
  id: z.string(),
  email: z.string(),
  role: roleSchema,
  status: invitationStatusSchema,
  expiresAt: z.string(),
  createdAt: z.string(),
  invitedBy: z.string().nullable(),
  /** The link to send, while the invitation is pending. */
  link: z.string().nullable(),
});
export type Invitation = z.infer<typeof invitationSchema>;

export const invitationListSchema = z.object({ invitations: z.array(invitationSchema) });

export const createdInvitationSchema = invitationSchema.extend({
  notification: z.object({ status: z.enum(['queued', 'skipped']), reason: z.string().optional(), recipients: z.array(z.string()) }),
});

/** What the invited person sees behind the link (only when signed in with the invited address). */
export const invitationPreviewSchema = z.object({
  teamId: z.string(),
  teamName: z.string(),
  role: roleSchema,
  email: z.string(),
  invitedBy: z.string().nullable(),
  status: invitationStatusSchema,
  expiresAt: z.string(),
});

/** Answer of POST /api/invitations/:token/accept. */
export const acceptedInvitationSchema = z.object({ teamId: z.string(), teamName: z.string(), role: roleSchema });

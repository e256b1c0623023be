/**
 * Owner: POST/GET /teams/:teamId/invitations, DELETE .../:invitationId (revoke).
 * Invited person (signed in): GET /invitations/:token (what it offers) and POST /invitations/:token/accept.
 */
import type { Router } from 'express';
import {
  acceptedInvitationSchema,
  createdInvitationSchema,
  createInvitationSchema,
  invitationListSchema,
  invitationPreviewSchema,
  invitationSchema,
  type InvitationStatus,
} from '../../contracts/invitations';
import { roleLabels, roleSchema } from '../../contracts/roles';
import { errorForLog } from '../http/error-log';
import { AppError, errors } from '../http/errors';
import { requireAuth, requireTeam } from '../http/guard';
import { parseInput, sendJson } from '../http/validate';
import { invitationMail, links } from '../mail/templates';
import type { RouteGroup } from '../route-group';
import { createReviewsRepository } from '../reviews/reviews.repository';
import { createInvitationsRepository, type AcceptOutcome } from './invitations.repository';

/** Our status of a stored row: better-auth's 'canceled'/'rejected' read as revoked; pending past its date as expired. */
export function statusOf(row: { status: string; expiresAt: Date }, now: Date): InvitationStatus {
  if (row.status === 'accepted') return 'accepted';
  if (row.status !== 'pending') return 'revoked';
  return row.expiresAt.getTime() <= now.getTime() ? 'expired' : 'pending';
}

const refusals: Record<Exclude<AcceptOutcome, { ok: true }>['reason'], (role?: string) => AppError> = {
  not_found: () => errors.notFound('Invitation'),
  other_address: () =>
    new AppError(403, 'invitation_other_address', 'This invitation was sent to another e-mail address. Sign in with the address it was sent to.'),
  used: () => new AppError(409, 'invitation_used', 'This invitation has already been used. Ask the team owner for a new one if you need it.'),
  revoked: () => new AppError(410, 'invitation_revoked', 'This invitation was revoked by the team owner.'),
  expired: () => new AppError(410, 'invitation_expired', 'This invitation has expired. Ask the team owner to send a new one.'),
  already_member: (role) =>
    new AppError(409, 'already_member', `You are already a member of this team${role ? ` (as ${roleLabels[roleSchema.parse(role)]})` : ''}; ask the owner to change your role instead.`),
};

/** Route group: invitations. */
export const registerInvitationRoutes: RouteGroup = (api: Router, { guards, services }) => {
  const { db, config } = services;
  const invitations = createInvitationsRepository({ db });
  const reviews = createReviewsRepository({ db });
  const days = config.env.INVITATION_DAYS;

  const view = (row: Awaited<ReturnType<typeof invitations.list>>[number], now: Date) => {
    const status = statusOf(row, now);
    return {
      id: row.id,
      email: row.email,
      role: roleSchema.parse(row.role),
      status,
      expiresAt: row.expiresAt.toISOString(),
      createdAt: row.createdAt.toISOString(),
      invitedBy: row.invitedBy ?? null,
      link: status === 'pending' ? links.invitation(config.publicUrl, row.id) : null,
    };
  };

  api.get('/teams/:teamId/invitations', guards.permission('invitation:manage'), async (req, res) => {
    const { teamId } = requireTeam(req);
    const now = new Date();
    sendJson(res, invitationListSchema, { invitations: (await invitations.list(teamId)).map((r) => view(r, now)) });
  });

  api.post('/teams/:teamId/invitations', guards.permission('invitation:manage'), async (req, res) => {
    const { teamId, user } = requireTeam(req);
    const body = parseInput(createInvitationSchema, req.body);
    const now = new Date();
    const role = await invitations.memberRole(teamId, body.email);
    if (role) throw new AppError(409, 'already_member', `${body.email} is already a member of this team (as ${roleLabels[roleSchema.parse(role)]}).`);
    const open = await invitations.openInvitation(teamId, body.email, now);
    if (open) {
      throw new AppError(409, 'already_invited', `${body.email} already has a pending invitation (until ${open.expiresAt.toISOString().slice(0, 10)}); revoke it to send a new one.`);
    }
    const expiresAt = new Date(now.getTime() + days * 24 * 3600 * 1000);
    const mailer = services.mail;
    const teamName = await reviews.teamName(teamId);
    // The mail job is queued in the invitation's own transaction (as a review's mail is): a crash after the commit
    // loses no mail, and when the queue refuses the job nothing is stored and the owner is told to try again.
    let queueFailure: unknown = null;
    const row = await invitations
      .create({ teamId, email: body.email, role: body.role, inviterId: user.id, expiresAt }, async (db, stored) => {
        const mail = invitationMail({ to: body.email, teamName, inviterName: user.name, role: body.role, link: links.invitation(config.publicUrl, stored.id), expiresAt });
        await mailer.enqueue({ ctx: { kind: 'invitation', teamId, actorId: user.id }, mail }, db).catch((err: unknown) => {
          queueFailure = err;
          throw err;
        });
      })
      .catch((err: unknown) => {
        if (queueFailure !== err) throw err;
        console.error(`loftline: queueing an invitation mail failed: ${errorForLog(err)}`); // no query values (the address) in the log
        throw new AppError(503, 'mail_queue_unavailable', 'The invitation e-mail could not be queued, so the invitation was not made. Nothing was saved: try again in a moment.');
      });
    const notification =
      mailer.mode === 'off'
        ? { status: 'skipped' as const, reason: 'Mail is switched off on this server: send the link yourself.', recipients: [body.email] }
        : { status: 'queued' as const, recipients: [body.email] };
    sendJson(res, createdInvitationSchema, { ...view({ ...row, invitedBy: user.name }, now), notification }, 201);
  });

  api.delete('/teams/:teamId/invitations/:invitationId', guards.permission('invitation:manage'), async (req, res) => {
    const { teamId, user } = requireTeam(req);
    const row = await invitations.revoke({ teamId, id: String(req.params.invitationId), actorId: user.id });
    if (!row) throw errors.notFound('Invitation');
    const now = new Date();
    const was = statusOf(row, now);
    if (was !== 'pending') throw new AppError(409, 'invitation_not_pending', `This invitation is ${was}; only a pending invitation can be revoked.`);
    sendJson(res, invitationSchema, view({ ...row, status: 'canceled', invitedBy: null }, now));
  });

  api.get('/invitations/:token', guards.session(), async (req, res) => {
    const { user } = requireAuth(req);
    const row = await invitations.byToken(String(req.params.token));
    if (!row) throw errors.notFound('Invitation');
    // Only the invited address learns which team and role the link offers.
    if (row.email.toLowerCase() !== user.email.toLowerCase()) throw refusals.other_address();
    sendJson(res, invitationPreviewSchema, {
      teamId: row.teamId,
      teamName: row.teamName,
      role: roleSchema.parse(row.role),
      email: row.email,
      invitedBy: row.invitedBy ?? null,
      status: statusOf(row, new Date()),
      expiresAt: row.expiresAt.toISOString(),
    });
  });

  api.post('/invitations/:token/accept', guards.session(), async (req, res) => {
    const { user } = requireAuth(req);
    const out = await invitations.accept({ token: String(req.params.token), userId: user.id, email: user.email, now: new Date() });
    if (!out.ok) throw refusals[out.reason](out.role);
    sendJson(res, acceptedInvitationSchema, { teamId: out.teamId, teamName: out.teamName, role: out.role });
  });
};

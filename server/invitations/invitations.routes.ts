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
import { errors, type AppError } from '../http/errors';
import { invitationErrors } from './invitations.errors';
import { requireAuth, requireTeam } from '../http/guard';
import { parseInput, sendJson } from '../http/validate';
import { invitationMail, links } from '../mail/templates';
import type { RouteGroup } from '../route-group';
import { createReviewsRepository } from '../reviews/reviews.repository';
import { createInvitationsRepository, type AcceptOutcome } from './invitations.repository';

/** Our status of a stored row: better-auth's 'canceled'/'rejected' read as revoked; pending past its date as expired. */
function statusOf(row: { status: string; expiresAt: Date }, now: Date): InvitationStatus {
  if (row.status === 'accepted') return 'accepted';
  if (row.status !== 'pending') return 'revoked';
  return row.expiresAt.getTime() <= now.getTime() ? 'expired' : 'pending';
}

const refusals: Record<Exclude<AcceptOutcome, { ok: true }>['reason'], (role?: string) => AppError> = {
  not_found: () => errors.not_found('Invitation'),
  other_address: () => invitationErrors.invitation_other_address(),
  used: () => invitationErrors.invitation_used(),
  revoked: () => invitationErrors.invitation_revoked(),
  expired: () => invitationErrors.invitation_expired(),
  already_member: (role) => invitationErrors.already_member('you', role ? roleLabels[roleSchema.parse(role)] : undefined),
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
    if (role) throw invitationErrors.already_member(body.email, roleLabels[roleSchema.parse(role)]);
    const open = await invitations.openInvitation(teamId, body.email, now);
    if (open) {
      throw invitationErrors.already_invited(body.email, open.expiresAt.toISOString().slice(0, 10));
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
        throw invitationErrors.mail_queue_unavailable();
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
    if (!row) throw errors.not_found('Invitation');
    const now = new Date();
    const was = statusOf(row, now);
    if (was !== 'pending') throw invitationErrors.invitation_not_pending(was);
    sendJson(res, invitationSchema, view({ ...row, status: 'canceled', invitedBy: null }, now));
  });

  api.get('/invitations/:token', guards.session(), async (req, res) => {
    const { user } = requireAuth(req);
    const row = await invitations.byToken(String(req.params.token));
    if (!row) throw errors.not_found('Invitation');
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

/** GET /api/teams/:teamId/dev/outbox: the owner reads what the development SMTP server received for the team. */
import { desc, eq } from 'drizzle-orm';
import type { Router } from 'express';
import { outboxSchema } from '../../contracts/outbox';
import { devMail } from '../../db/schema';
import { errors } from '../http/errors';
import { requireTeam } from '../http/guard';
import { sendJson } from '../http/validate';
import type { RouteGroup } from '../route-group';

type Attachment = { filename: string; contentType: string; size: number; sha256?: string };

/** Route group: the development outbox (404 whenever real SMTP or no mail is configured). */
export const registerOutboxRoutes: RouteGroup = (api: Router, { guards, services }) => {
  api.get('/teams/:teamId/dev/outbox', guards.permission('outbox:read'), async (req, res) => {
    const { teamId } = requireTeam(req);
    if (services.mail.mode !== 'fake') {
      throw errors.not_found(undefined, 'The development outbox is off: this server sends mail through SMTP_HOST (or not at all).');
    }
    const rows = await services.db
      .select()
      .from(devMail)
      .where(eq(devMail.teamId, teamId))
      .orderBy(desc(devMail.receivedAt))
      .limit(200);
    sendJson(res, outboxSchema, {
      fake: true,
      messages: rows.map((m) => ({
        id: m.id,
        to: m.toAddresses.split(',').map((s) => s.trim()).filter(Boolean),
        from: m.fromAddress,
        subject: m.subject,
        text: m.text,
        attachments: m.attachments as Attachment[],
        receivedAt: m.receivedAt.toISOString(),
      })),
    });
  });
};

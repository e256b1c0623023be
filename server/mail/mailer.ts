/**
 * The mail service: nodemailer over SMTP (SMTP_HOST...) or, with no host configured, over the in-process fake.
 * Sending runs in the background: a failure is logged and recorded in the audit trail, never thrown at the caller.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import type { Db } from '../../db/client';
import { auditEvent } from '../../db/schema';
import type { Config } from '../config';
import { startFakeSmtp, teamHeader, type FakeSmtp } from './fake-smtp';

export type MailMode = 'smtp' | 'fake' | 'off';

/** A message ready to send. */
export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
  attachments?: Array<{ filename: string; content: Buffer; contentType: string }>;
}

/** Where the outcome of a send is recorded. */
export interface MailContext {
  /** What the mail is about, e.g. 'review.signed_off' or 'invitation'. */
  kind: string;
  teamId: string;
  planId?: string | null;
  versionId?: string | null;
  actorId?: string | null;
}

export interface Mailer {
  mode: MailMode;
  from: string;
  /** Present in 'fake' mode: what the development server received. */
  fake: FakeSmtp | null;
  /**
   * Build (e.g. render a PDF) and send in the background. `build` may return null when there is nothing to send.
   * The outcome lands in audit_event as 'mail.sent' or 'mail.failed'.
   */
  enqueue: (ctx: MailContext, build: () => Promise<OutgoingMail | null>) => void;
  /** Resolves when every queued send has finished (tests, graceful shutdown). */
  idle: () => Promise<void>;
  close: () => Promise<void>;
}

/** Choose the mode from the configuration: a host means real SMTP; otherwise the fake, unless DEV_OUTBOX=0. */
export function mailModeOf(config: Config): MailMode {
  if (config.env.SMTP_HOST) return 'smtp';
  return config.env.DEV_OUTBOX === false ? 'off' : 'fake';
}

/** Create the mail service of one server process. */
export async function createMailer(deps: { db: Db; config: Config; log?: (msg: string, err?: unknown) => void }): Promise<Mailer> {
  const { db, config } = deps;
  // One line per failure: the reason is what an operator needs; the full record is in the audit trail.
  const log = deps.log ?? ((msg: string, err?: unknown) => console.error(`loftline: ${msg}${err ? `: ${err instanceof Error ? err.message : String(err)}` : ''}`));
  const mode = mailModeOf(config);
  const env = config.env;
  let fake: FakeSmtp | null = null;
  let transport: Transporter | null = null;
  const timeouts = { connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000 };

  if (mode === 'fake') {
    fake = await startFakeSmtp({ db, log: (err) => log('fake SMTP server error', err) });
    transport = nodemailer.createTransport({ host: fake.host, port: fake.port, secure: false, ignoreTLS: true, ...timeouts });
  } else if (mode === 'smtp') {
    const port = env.SMTP_PORT ?? 587;
    transport = nodemailer.createTransport({
      host: env.SMTP_HOST,
      port,
      secure: port === 465, // implicit TLS on 465; STARTTLS is negotiated on the others
      auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASS ?? '' } : undefined,
      ...timeouts,
    });
  }

  const pending = new Set<Promise<void>>();

  async function record(ctx: MailContext, action: 'mail.sent' | 'mail.failed', comment: string) {
    await db.insert(auditEvent).values({
      teamId: ctx.teamId,
      planId: ctx.planId ?? null,
      planVersionId: ctx.versionId ?? null,
      actorId: ctx.actorId ?? null,
      action,
      comment: comment.slice(0, 2000),
    });
  }

  async function run(ctx: MailContext, build: () => Promise<OutgoingMail | null>) {
    let mail: OutgoingMail | null = null;
    try {
      mail = await build();
      if (!mail || mail.to.length === 0) return;
      if (!transport) {
        await record(ctx, 'mail.failed', `${ctx.kind}: not sent to ${mail.to.join(', ')}: mail is switched off (DEV_OUTBOX=0 and no SMTP_HOST).`);
        return;
      }
      await transport.sendMail({
        from: env.MAIL_FROM,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        attachments: mail.attachments,
        headers: { [teamHeader]: ctx.teamId },
      });
      const files = mail.attachments?.length ? ` (attached: ${mail.attachments.map((a) => a.filename).join(', ')})` : '';
      await record(ctx, 'mail.sent', `${ctx.kind}: "${mail.subject}" to ${mail.to.join(', ')}${files}`);
    } catch (err) {
      log(`sending ${ctx.kind} mail failed`, err);
      const why = err instanceof Error ? err.message : String(err);
      const to = mail ? ` to ${mail.to.join(', ')}` : '';
      await record(ctx, 'mail.failed', `${ctx.kind}${to}: ${why}`).catch((e) => log('recording a mail failure failed', e));
    }
  }

  async function idle() {
    while (pending.size > 0) await Promise.allSettled([...pending]);
  }

  return {
    mode,
    from: env.MAIL_FROM,
    fake,
    enqueue(ctx, build) {
      const p = run(ctx, build).finally(() => pending.delete(p));
      pending.add(p);
    },
    idle,
    async close() {
      await idle();
      transport?.close();
      await fake?.close();
    },
  };
}

/**
 * The mail service: nodemailer over SMTP (SMTP_HOST...) or, with no host configured, over the in-process fake.
 * Mail goes through the PostgreSQL job queue (pg-boss, queue MAIL_QUEUE): a review enqueues its mail in the same
 * transaction as the state change, so a crash after the commit loses nothing: any server process on the database
 * sends it. A failed send is logged, recorded in the audit trail and retried by the queue; it never fails the caller.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import type PgBoss from 'pg-boss';
import type { Db } from '../../db/client';
import { auditEvent } from '../../db/schema';
import type { Config } from '../config';
import type { JobsDb } from '../jobs/jobs.service';
import { startFakeSmtp, teamHeader, type FakeSmtp } from './fake-smtp';

/** The kinds of mail the code sends, as people read them in the audit trail. */
const mailKindWords: Record<string, string> = {
  'review.submit': 'Review request',
  'review.sign-off': 'Sign-off notice',
  'review.return': 'Returned-version notice',
  invitation: 'Invitation',
};

type MailMode = 'smtp' | 'fake' | 'off';

/** A message ready to send. */
export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
  attachments?: Array<{ filename: string; content: Buffer; contentType: string }>;
}

/** Where the outcome of a send is recorded. */
interface MailContext {
  /** What the mail is about, e.g. 'review.signed_off' or 'invitation'. */
  kind: string;
  teamId: string;
  planId?: string | null;
  versionId?: string | null;
  actorId?: string | null;
}

/** What the queue stores for one mail: plain JSON; a report attachment is rendered when the mail is sent. */
export interface MailJob {
  ctx: MailContext;
  mail: { to: string[]; subject: string; text: string };
  /** Attach the compliance report PDF of this version. */
  attachReportOf?: { teamId: string; versionId: string };
}

/** Renders the compliance report PDF of a version for a mail attachment (provided by the reports domain). */
export type ReportAttachment = (ref: { teamId: string; versionId: string }) => Promise<{ filename: string; content: Buffer; contentType: string }>;

export interface Mailer {
  mode: MailMode;
  from: string;
  /** Present in 'fake' mode: what the development server received. */
  fake: FakeSmtp | null;
  /**
   * Queue a mail. With `db` (a transaction's connection) the job commits or rolls back with the caller's change.
   * The outcome lands in audit_event as 'mail.sent' or 'mail.failed'.
   */
  enqueue: (job: MailJob, db?: JobsDb) => Promise<void>;
  /** Resolves when no mail of this queue waits for a first attempt or is being sent (tests, graceful shutdown). */
  idle: () => Promise<void>;
  close: () => Promise<void>;
}

/** Choose the mode from the configuration: a host means real SMTP; otherwise the fake, unless DEV_OUTBOX=0. */
function mailModeOf(config: Config): MailMode {
  if (config.env.SMTP_HOST) return 'smtp';
  return config.env.DEV_OUTBOX === false ? 'off' : 'fake';
}

/** Create the mail service of one server process: its queue, and (unless MAIL_SEND=0) the worker that sends. */
export async function createMailer(deps: {
  db: Db;
  config: Config;
  boss: PgBoss;
  attachReport?: ReportAttachment;
  log?: (msg: string, err?: unknown) => void;
}): Promise<Mailer> {
  const { db, config, boss } = deps;
  // One line per failure: the reason is what an operator needs; the full record is in the audit trail.
  const log = deps.log ?? ((msg: string, err?: unknown) => console.error(`loftline: ${msg}${err ? `: ${err instanceof Error ? err.message : String(err)}` : ''}`));
  const mode = mailModeOf(config);
  const env = config.env;
  const queue = env.MAIL_QUEUE;
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

  // Retries with backoff from 30 s: a mail server that is down for a while still gets the mail later.
  const retry = { retryLimit: env.MAIL_RETRY_LIMIT, retryDelay: 30, retryBackoff: true, expireInSeconds: 300 };
  await boss.createQueue(queue, { name: queue, ...retry });

  /** What a mail was, in the audit trail's words (the job's kind is a code). */
  const kindWords = (kind: string) => mailKindWords[kind] ?? 'Mail';

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

  /** One attempt; throws (after recording why) so the queue retries. */
  async function deliver(job: MailJob) {
    const { ctx, mail } = job;
    if (mail.to.length === 0) return;
    if (!transport) {
      await record(ctx, 'mail.failed', `${kindWords(ctx.kind)}: not sent to ${mail.to.join(', ')}: mail is switched off (DEV_OUTBOX=0 and no SMTP_HOST).`);
      return;
    }
    try {
      const attachments = job.attachReportOf && deps.attachReport ? [await deps.attachReport(job.attachReportOf)] : [];
      await transport.sendMail({
        from: env.MAIL_FROM,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        attachments,
        headers: { [teamHeader]: ctx.teamId },
      });
      const files = attachments.length ? ` (attached: ${attachments.map((a) => a.filename).join(', ')})` : '';
      await record(ctx, 'mail.sent', `${kindWords(ctx.kind)}: "${mail.subject}" to ${mail.to.join(', ')}${files}`);
    } catch (err) {
      log(`sending ${ctx.kind} mail failed`, err);
      const why = err instanceof Error ? err.message : String(err);
      await record(ctx, 'mail.failed', `${kindWords(ctx.kind)} to ${mail.to.join(', ')}: ${why}`).catch((e) => log('recording a mail failure failed', e));
      throw err;
    }
  }

  let workerId: string | null = null;
  if (env.MAIL_SEND !== false) {
    workerId = await boss.work<MailJob>(queue, { batchSize: 1, pollingIntervalSeconds: env.JOBS_POLL_SECONDS }, async ([job]) => deliver(job.data));
  }
  const wake = () => {
    if (workerId) boss.notifyWorker(workerId);
  };

  async function waiting(): Promise<number> {
    const r = await db.$client.query<{ n: number }>(`select count(*)::int as n from pgboss.job where name = $1 and state in ('created', 'active')`, [queue]);
    return r.rows[0].n;
  }

  async function idle() {
    while ((await waiting()) > 0) {
      wake();
      await new Promise((r) => setTimeout(r, 50));
    }
  }

  return {
    mode,
    from: env.MAIL_FROM,
    fake,
    async enqueue(job, txDb) {
      await boss.send(queue, job, { ...retry, ...(txDb ? { db: txDb } : {}) });
      if (!txDb) wake(); // inside a transaction the job is not visible until the commit; the worker's poll finds it
    },
    idle,
    async close() {
      if (workerId) {
        await boss.offWork(queue);
        // A send in progress finishes before its transport closes (at most 10 s; an unfinished one is retried).
        const until = Date.now() + 10_000;
        while (Date.now() < until && (await db.$client.query(`select 1 from pgboss.job where name = $1 and state = 'active'`, [queue])).rowCount) {
          await new Promise((r) => setTimeout(r, 50));
        }
      }
      transport?.close();
      await fake?.close();
    },
  };
}

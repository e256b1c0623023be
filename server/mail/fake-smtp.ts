/**
 * A development SMTP server inside the API process: used when no SMTP_HOST is configured, it accepts every message on
 * a loopback port, parses it and keeps it in the dev_mail table (the owner's outbox) and in a short in-memory list.
 */
import crypto from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { Db } from '../../db/client';
import { devMail } from '../../db/schema';

/** Header the mailer sets so the outbox can show each team only its own mail. */
export const teamHeader = 'x-loftline-team';

/** One message as the fake server received it, attachments included byte for byte. */
interface ReceivedMail {
  id: string;
  teamId: string | null;
  /** Envelope recipients (what the server was asked to deliver to). */
  to: string[];
  from: string;
  subject: string;
  text: string;
  attachments: Array<{ filename: string; contentType: string; size: number; sha256: string; content: Buffer }>;
  receivedAt: Date;
}

export interface FakeSmtp {
  host: string;
  port: number;
  /** The newest messages received by this process, oldest first (at most `keep`). */
  messages: ReceivedMail[];
  close: () => Promise<void>;
}

function addressText(a: AddressObject | AddressObject[] | undefined): string {
  if (!a) return '';
  return (Array.isArray(a) ? a : [a]).map((x) => x.text).join(', ');
}

/** Start the fake on a free loopback port. Messages are stored before the server answers 250, so a sent mail is readable. */
export async function startFakeSmtp(opts: { db: Db; keep?: number; log?: (err: unknown) => void }): Promise<FakeSmtp> {
  const keep = opts.keep ?? 50;
  const log = opts.log ?? ((err: unknown) => console.error('loftline: fake SMTP:', err));
  const messages: ReceivedMail[] = [];

  const server = new SMTPServer({
    name: 'loftline-dev-outbox',
    banner: 'Loftline development outbox (nothing leaves this machine)',
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    size: 30 * 1024 * 1024,
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const rawTeam = parsed.headers.get(teamHeader);
          const teamId = typeof rawTeam === 'string' && rawTeam.length > 0 ? rawTeam : null;
          const to = session.envelope.rcptTo.map((r) => r.address);
          const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : addressText(parsed.from);
          const attachments = parsed.attachments.map((a) => ({
            filename: a.filename ?? 'attachment',
            contentType: a.contentType,
            size: a.content.length,
            sha256: crypto.createHash('sha256').update(a.content).digest('hex'),
            content: a.content,
          }));
          const [row] = await opts.db
            .insert(devMail)
            .values({
              teamId,
              toAddresses: to.join(', '),
              fromAddress: from || addressText(parsed.from),
              subject: parsed.subject ?? '',
              text: parsed.text ?? '',
              attachments: attachments.map(({ content: _c, ...meta }) => meta),
            })
            .returning({ id: devMail.id, receivedAt: devMail.receivedAt });
          messages.push({ id: row.id, teamId, to, from, subject: parsed.subject ?? '', text: parsed.text ?? '', attachments, receivedAt: row.receivedAt });
          if (messages.length > keep) messages.splice(0, messages.length - keep);
          callback();
        })
        .catch((err: Error) => {
          log(err);
          callback(err);
        });
    },
  });
  server.on('error', log);

  const host = '127.0.0.1';
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  const { port } = (server as unknown as { server: { address: () => AddressInfo } }).server.address();
  return {
    host,
    port,
    messages,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

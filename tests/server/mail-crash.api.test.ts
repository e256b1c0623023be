/**
 * Mail survives a crash: a review's mail is a job in the PostgreSQL queue, committed with the state change, so a
 * server killed with SIGKILL after the commit and before the send loses nothing: another process sends it, once.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Mailer } from '../../server/mail/mailer';
import { pdfText } from '../reports/pdf-text';
import { createVersion, eventually, freshTeam } from '../support/fixtures';
import { freePort, startTestServer, type TestServer } from '../support/test-server';
import { signOffBody } from '../support/review-helpers';

const queue = 'mail-crash-test';
let srv: TestServer;
let child: ChildProcess | null = null;
let receiver: TestServer | null = null;

beforeAll(async () => {
  // This process's own server only reads the database; its mail queue is another one.
  srv = await startTestServer({ web: false });
});
afterAll(async () => {
  if (child && child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  await receiver?.stop();
  await srv?.stop();
});

/**
 * The server that makes the change, as its own process. MAIL_SEND=0 keeps it from sending, so the kill lands
 * exactly between the commit and the send (a kill timed against a real send could land on either side).
 */
async function startChild(): Promise<{ url: string; output: () => string }> {
  const port = await freePort();
  child = spawn(process.execPath, ['--import', 'tsx', 'tests/support/server-process.ts'], {
    env: { ...process.env, PORT: String(port), MAIL_QUEUE: queue, MAIL_SEND: '0', WORKERS: '0', NODE_ENV: 'test', AUTH_SIGNIN_PER_MINUTE: '1000' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  child.stdout!.on('data', (d) => (out += d));
  child.stderr!.on('data', (d) => (out += d));
  await eventually(async () => /ready http/.test(out) || (child!.exitCode !== null && Promise.reject(new Error(out))), 60_000, `the child server to start:\n${out}`);
  return { url: `http://127.0.0.1:${port}`, output: () => out };
}

describe('mail through the job queue', () => {
  it('is sent once by another process after the server that queued it was killed with SIGKILL', { timeout: 120_000 }, async () => {
    const a = await startChild();
    const team = await freshTeam({ ...srv, url: a.url } as TestServer, 'mail-crash');
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review', planName: 'Crash bench' });

    const res = await team.clients.surveyor.post(`${v.path}/sign-off`, await signOffBody(team.clients.surveyor, v.path, { comment: 'Fine.' }));
    expect(res.status, a.output()).toBe(200);
    expect(res.body.notification).toEqual({ status: 'queued', recipients: [team.users.planner.email] });
    // Committed together: the version is signed off and its mail waits in the queue.
    const jobs = async () =>
      (await srv.db.$client.query<{ state: string }>(`select state from pgboss.job where name = $1 and data->'ctx'->>'versionId' = $2`, [queue, v.versionId])).rows;
    expect(await jobs()).toEqual([{ state: 'created' }]);

    child!.kill('SIGKILL');
    await eventually(async () => child!.signalCode === 'SIGKILL', 10_000, 'the child to die');

    receiver = await startTestServer({ web: false, env: { MAIL_QUEUE: queue } });
    const mailer = receiver.services.mail as Mailer;
    await mailer.idle();
    const got = await eventually(async () => mailer.fake!.messages.find((m) => m.subject === 'Signed off: Crash bench v1'), 30_000, 'the mail');
    expect(got.to).toEqual([team.users.planner.email]);
    expect(got.text).toContain('Fine.');
    expect(got.attachments).toHaveLength(1);
    expect(pdfText(got.attachments[0].content).replace(/\s+/g, ' ')).toContain('Crash bench');

    // Exactly once: one job, completed; one message in the outbox; one mail.sent in the audit trail.
    expect(await eventually(async () => ((await jobs())[0]?.state === 'completed' ? jobs() : null), 10_000, 'the job to complete')).toEqual([{ state: 'completed' }]);
    const sent = await srv.db.$client.query(`select 1 from dev_mail where subject = $1 and team_id = $2`, ['Signed off: Crash bench v1', team.teamId]);
    expect(sent.rowCount).toBe(1);
    const audit = await srv.db.$client.query(`select 1 from audit_event where plan_version_id = $1 and action = 'mail.sent'`, [v.versionId]);
    expect(audit.rowCount).toBe(1);
  });

  it('is not queued when the change is refused', async () => {
    const team = await freshTeam(srv, 'mail-rollback');
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off' });
    const res = await team.clients.surveyor.post(`${v.path}/return`, { comment: 'Too late.' });
    expect(res.status).toBe(409);
    const rows = await srv.db.$client.query(`select 1 from pgboss.job where data->'ctx'->>'versionId' = $1`, [v.versionId]);
    expect(rows.rowCount).toBe(0);
  });
});

import crypto from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvent, devMail } from '../../db/schema';
import type { Mailer } from '../../server/mail/mailer';
import { pdfText } from '../reports/pdf-text';
import { createVersion, freshTeam, type FreshTeam } from '../support/fixtures';
import { freePort, startTestServer, type TestServer } from '../support/test-server';
import { signOffBody } from '../support/review-helpers';

let srv: TestServer;
let team: FreshTeam;
const mailer = () => srv.services.mail as Mailer;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  team = await freshTeam(srv, 'mail');
});
afterAll(async () => srv?.stop());

describe('e-mail through the fake SMTP server', () => {
  it('runs the fake when no SMTP host is configured', () => {
    expect(mailer().mode).toBe('fake');
    expect(mailer().fake?.port).toBeGreaterThan(0);
  });

  it('delivers the sign-off to the planner with the compliance PDF attached', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review', planName: 'East terrace' });
    const res = await team.clients.surveyor.post(`${v.path}/sign-off`, await signOffBody(team.clients.surveyor, v.path, { comment: 'Good to fly.' }));
    expect(res.status).toBe(200);
    expect(res.body.notification).toEqual({ status: 'queued', recipients: [team.users.planner.email] });
    await mailer().idle();

    const got = mailer().fake!.messages.find((m) => m.to.includes(team.users.planner.email) && m.subject.startsWith('Signed off'));
    expect(got, 'the fake received the sign-off mail').toBeDefined();
    expect(got!.subject).toBe('Signed off: East terrace v1');
    expect(got!.text).toContain(`${team.users.surveyor.name} signed off East terrace, version 1`);
    expect(got!.text).toContain('Good to fly.');
    expect(got!.attachments).toHaveLength(1);
    const pdf = got!.attachments[0];
    expect(pdf).toMatchObject({ filename: 'east-terrace-v1-compliance.pdf', contentType: 'application/pdf' });
    expect(pdf.content.subarray(0, 5).toString()).toBe('%PDF-');
    const text = pdfText(pdf.content).replace(/\s+/g, ' ');
    expect(text).toContain(`Signed off by ${team.users.surveyor.name}`);
    expect(text).toContain('East terrace');

    // The same message is in the dev_mail table for the owner's outbox, with the attachment's digest.
    const [row] = await srv.db.select().from(devMail).where(eq(devMail.id, got!.id));
    expect(row.teamId).toBe(team.teamId);
    expect(row.attachments).toEqual([{ filename: pdf.filename, contentType: 'application/pdf', size: pdf.content.length, sha256: crypto.createHash('sha256').update(pdf.content).digest('hex') }]);
    const sent = await srv.db.select().from(auditEvent).where(and(eq(auditEvent.planVersionId, v.versionId), eq(auditEvent.action, 'mail.sent')));
    expect(sent).toHaveLength(1);
    expect(sent[0].comment).toContain(team.users.planner.email);
  });

  it('asks every surveyor of the team when a version is sent for review', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, planName: 'West gully' });
    const res = await team.clients.planner.post(`${v.path}/submit`, { comment: 'Steps mode this time.' });
    expect(res.body.notification.recipients).toEqual([team.users.surveyor.email]);
    await mailer().idle();
    const got = mailer().fake!.messages.find((m) => m.subject === 'Review requested: West gully v1' && m.to.includes(team.users.surveyor.email));
    expect(got?.text).toContain('Steps mode this time.');
    expect(got?.text).toContain(`/plans/${v.planId}/versions/${v.versionId}`);
  });

  it('tells the planner a version was returned, with the comment', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review', planName: 'South scarp' });
    await team.clients.surveyor.post(`${v.path}/return`, { comment: 'Line 4 runs below the clearance near the mast.' });
    await mailer().idle();
    const got = mailer().fake!.messages.find((m) => m.subject === 'Returned with comments: South scarp v1');
    expect(got?.to).toEqual([team.users.planner.email]);
    expect(got?.text).toContain('Line 4 runs below the clearance near the mast.');
    expect(got?.attachments).toHaveLength(0);
  });

  it('shows the owner only their own team\'s mail in the development outbox', async () => {
    const other = await freshTeam(srv, 'mail-other');
    const v = await createVersion(srv, { teamId: other.teamId, createdBy: other.users.planner.id, reviewState: 'in_review', planName: 'Other team plan' });
    await other.clients.surveyor.post(`${v.path}/sign-off`, await signOffBody(other.clients.surveyor, v.path, {}));
    await mailer().idle();
    const mine = await team.clients.owner.get(`/api/teams/${team.teamId}/dev/outbox`);
    expect(mine.status).toBe(200);
    expect(mine.body.fake).toBe(true);
    const subjects = mine.body.messages.map((m: { subject: string }) => m.subject);
    expect(subjects).toContain('Signed off: East terrace v1');
    expect(subjects).not.toContain('Signed off: Other team plan v1');
    const signed = mine.body.messages.find((m: { subject: string }) => m.subject === 'Signed off: East terrace v1');
    expect(signed.attachments[0]).toMatchObject({ filename: 'east-terrace-v1-compliance.pdf', contentType: 'application/pdf' });
    expect((await other.clients.owner.get(`/api/teams/${other.teamId}/dev/outbox`)).body.messages.map((m: { subject: string }) => m.subject)).toContain('Signed off: Other team plan v1');
    expect((await team.clients.planner.get(`/api/teams/${team.teamId}/dev/outbox`)).status).toBe(403);
  });
});

describe('when mail cannot be sent', () => {
  let broken: TestServer;
  beforeAll(async () => {
    // A real SMTP host that refuses connections: nothing listens on this freshly freed port.
    broken = await startTestServer({ web: false, env: { SMTP_HOST: '127.0.0.1', SMTP_PORT: String(await freePort()) } });
  });
  afterAll(async () => broken?.stop());

  it('still changes the state, logs the failure and records it in the audit trail', async () => {
    const t = await freshTeam(broken, 'mail-broken');
    const v = await createVersion(broken, { teamId: t.teamId, createdBy: t.users.planner.id, reviewState: 'in_review' });
    const res = await t.clients.surveyor.post(`${v.path}/return`, { comment: 'Please lower line 1.' });
    expect(res.status).toBe(200);
    expect(res.body.reviewState).toBe('returned');
    await (broken.services.mail as Mailer).idle();
    const trail = await t.clients.planner.get(`/api/teams/${t.teamId}/plans/${v.planId}/audit`);
    const failed = trail.body.events.find((e: { action: string }) => e.action === 'mail.failed');
    expect(failed, JSON.stringify(trail.body.events)).toBeDefined();
    expect(failed.comment).toMatch(/^Returned-version notice to .*ECONNREFUSED/);
  });

  it('has no development outbox', async () => {
    const t = await freshTeam(broken, 'mail-broken-outbox');
    const res = await t.clients.owner.get(`/api/teams/${t.teamId}/dev/outbox`);
    expect(res.status).toBe(404);
    expect(res.body.error.message).toMatch(/outbox is off/);
  });
});

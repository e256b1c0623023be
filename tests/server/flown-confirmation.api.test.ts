/**
 * Confirming a signed-off version as flown, over real HTTP against the real database: the team's rule (owners set
 * it, everyone reads it), the refusals in order (not signed off, no check of the photos, a reason missing for an
 * item the flight lost), the confirmation kept once with its audit entry, and the report and its PDF (read back
 * with pdftotext, Debian poppler-utils) saying that it is owed or who confirmed it and why.
 */
import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { asFlownCheckSchema, type AsFlownCheck } from '../../contracts/as-flown';
import { flownConfirmationSchema, teamSettingsSchema } from '../../contracts/flown-confirmation';
import { complianceReportSchema } from '../../contracts/reports';
import { auditTrailSchema } from '../../contracts/reviews';
import { parsePhotoLogCsv } from '../../contracts/photo-log';
import { planVersion } from '../../db/schema';
import { pdfText } from '../reports/pdf-text';
import { freshTeam, type FreshTeam } from '../support/fixtures';
import { analysedExampleVersion } from '../support/analysed-version';
import { startTestServer, type TestServer } from '../support/test-server';

let srv: TestServer;
let team: FreshTeam;
let versionId: string;
let planId: string;
let versionPath: string;
let check: AsFlownCheck;

beforeAll(async () => {
  srv = await startTestServer({ web: false, env: { WORKERS: '1', JOBS_POLL_SECONDS: '0.5' } });
  team = await freshTeam(srv, 'flown-confirmation');
  ({ versionId, planId } = await analysedExampleVersion(team));
  versionPath = `/api/teams/${team.teamId}/plans/${planId}/versions/${versionId}`;
}, 240_000);
afterAll(async () => srv?.stop());

describe('confirming a version as flown', () => {
  it('keeps the team rule: off by default, read by every role, changed by owners only', async () => {
    const settings = `/api/teams/${team.teamId}/settings`;
    const before = teamSettingsSchema.parse((await team.clients.pilot.get(settings)).body);
    expect(before).toEqual({ requireFlownConfirmation: false, updatedBy: null, updatedAt: null });
    for (const role of ['planner', 'surveyor', 'pilot'] as const) expect((await team.clients[role].patch(settings, { requireFlownConfirmation: true })).status).toBe(403);
    expect((await team.clients.owner.patch(settings, { requireFlownConfirmation: 'yes' })).status).toBe(422);
    const after = teamSettingsSchema.parse((await team.clients.owner.patch(settings, { requireFlownConfirmation: true })).body);
    expect(after.requireFlownConfirmation).toBe(true);
    expect(after.updatedBy?.name).toBe(team.users.owner.name);
    expect(teamSettingsSchema.parse((await team.clients.surveyor.get(settings)).body).requireFlownConfirmation).toBe(true);
  });

  it('refuses before sign-off, then until the photos are checked, saying what to do', async () => {
    const early = await team.clients.surveyor.post(`${versionPath}/confirm-flown`, {});
    expect(early.status).toBe(409);
    expect(early.body.error.code).toBe('not_signed_off');
    await srv.db.update(planVersion).set({ reviewState: 'signed_off', signedOffBy: team.users.surveyor.id, signedOffAt: new Date() }).where(eq(planVersion.id, versionId));
    const unchecked = await team.clients.surveyor.post(`${versionPath}/confirm-flown`, {});
    expect(unchecked.status).toBe(409);
    expect(unchecked.body.error.code).toBe('as_flown_required');
    expect(unchecked.body.error.message).toContain('check the flight\'s photos');
    // the report says the confirmation is owed, as the team requires it
    const report = complianceReportSchema.parse((await team.clients.surveyor.get(`${versionPath}/report`)).body);
    expect(report.flown).toMatchObject({ required: true, confirmedBy: null });
    expect(report.flown?.statement).toContain('NOT YET CONFIRMED AS FLOWN');
    const pdf = await team.clients.surveyor.getBytes(`${versionPath}/report.pdf`);
    expect(pdfText(pdf.bytes).replace(/\s+/g, ' ')).toContain('NOT YET CONFIRMED AS FLOWN');
  });

  it('needs a reason for each item the flight lost against the plan, and takes only reviewers', async () => {
    const photos = parsePhotoLogCsv(fs.readFileSync('datasets/example-photo-log.csv', 'utf8'));
    const posted = await team.clients.pilot.post(`/api/teams/${team.teamId}/flights/${versionId}/as-flown-checks`, { source: 'csv', label: 'example-photo-log.csv', photos });
    expect(posted.status).toBe(201);
    check = asFlownCheckSchema.parse(posted.body);
    // the items the stored check shows lower as flown than as planned
    const lost = check.document.flown.items.filter((it) => it.share < check.document.planned.items.find((p) => p.item === it.item)!.share - 1e-6).map((it) => it.item);
    expect(lost.length).toBeGreaterThan(0);
    const status = flownConfirmationSchema.parse((await team.clients.surveyor.get(`${versionPath}/flown-confirmation`)).body);
    expect(status).toMatchObject({ required: true, mayConfirm: true, confirmedAt: null, check: { id: check.id, photoCount: photos.length } });
    expect(status.shortfalls.map((s) => s.key)).toEqual(lost);
    for (const role of ['planner', 'pilot'] as const) expect((await team.clients[role].post(`${versionPath}/confirm-flown`, {})).status).toBe(403);
    const bare = await team.clients.surveyor.post(`${versionPath}/confirm-flown`, { reasons: [] });
    expect(bare.status).toBe(422);
    expect(bare.body.error.code).toBe('reasons_required');
    expect(bare.body.error.fields.map((d: { path: string }) => d.path)).toEqual(lost.map((k) => `reasons.${k}`));
  });

  it('confirms once, against the latest check, with the audit entry; the report and PDF name who and why', async () => {
    const reasons = status0Reasons();
    const ok = await team.clients.surveyor.post(`${versionPath}/confirm-flown`, { comment: 'Rim strip re-flown the same afternoon.', reasons });
    expect(ok.status).toBe(200);
    const done = flownConfirmationSchema.parse(ok.body);
    expect(done).toMatchObject({ confirmedBy: { name: team.users.surveyor.name }, check: { id: check.id }, mayConfirm: false });
    expect(done.reasons.map((r) => r.reason)).toEqual(reasons.map((r) => r.reason));
    const again = await team.clients.owner.post(`${versionPath}/confirm-flown`, { reasons });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('already_confirmed');
    const trail = auditTrailSchema.parse((await team.clients.planner.get(`/api/teams/${team.teamId}/plans/${planId}/audit`)).body);
    const entries = trail.events.filter((e) => e.action === 'review.flown_confirmed');
    expect(entries).toHaveLength(1);
    expect(entries[0].comment).toContain('example-photo-log.csv');
    expect(entries[0].comment).toContain('Rim strip re-flown');
    const report = complianceReportSchema.parse((await team.clients.surveyor.get(`${versionPath}/report`)).body);
    expect(report.flown?.statement).toContain(`Confirmed as flown by ${team.users.surveyor.name}`);
    expect(report.flown?.reasons.map((r) => r.reason)).toEqual(reasons.map((r) => r.reason));
    const text = pdfText((await team.clients.surveyor.getBytes(`${versionPath}/report.pdf`)).bytes).replace(/\s+/g, ' ');
    expect(text).toContain(`Confirmed as flown by ${team.users.surveyor.name}`);
    expect(text).toContain(reasons[0].reason);
  });
});

/** One reason per item the stored check shows lost. */
function status0Reasons() {
  return check.document.flown.items
    .filter((it) => it.share < check.document.planned.items.find((p) => p.item === it.item)!.share - 1e-6)
    .map((it) => ({ key: it.item, reason: `Re-flown and checked again for ${it.item}; the client accepted the remaining strip.` }));
}

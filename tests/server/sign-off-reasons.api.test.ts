/**
 * Signing off a version that misses part of the client's spec: refused until each unmet requirement has a reason,
 * named one by one; the reasons are stored with the sign-off and printed in the report and its PDF (read back with
 * pdftotext from Debian's poppler-utils). A version that meets the spec signs off with no reason at all.
 */
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { complianceReportSchema } from '../../contracts/reports';
import { versionReviewSchema } from '../../contracts/reviews';
import { planVersion } from '../../db/schema';
import { createVersion, freshTeam, syntheticMission, type FreshTeam, type VersionFixture } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';
import { pdfText } from '../reports/pdf-text';

let srv: TestServer;
let team: FreshTeam;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  team = await freshTeam(srv, 'reasons');
});
afterAll(async () => srv?.stop());

/** An analysed version in review whose spec asks for what the fixture's results cannot give. */
async function failingVersion(): Promise<VersionFixture> {
  const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review' });
  // The same results against a stricter spec: 95 % forward overlap and a 40 m height limit cannot be met.
  await srv.db.update(planVersion).set({ input: syntheticMission({ forwardOverlap: 0.95, maxAglM: 40 }) }).where(eq(planVersion.id, v.versionId));
  return v;
}

describe('sign-off of a version that misses the spec', () => {
  it('names each unmet requirement in the review status, as the report words it', async () => {
    const v = await failingVersion();
    const status = versionReviewSchema.parse((await team.clients.surveyor.get(`${v.path}/review`)).body);
    const report = complianceReportSchema.parse((await team.clients.surveyor.get(`${v.path}/report`)).body);
    const failing = report.checks.filter((c) => !c.pass);
    expect(failing.map((c) => c.key)).toEqual(expect.arrayContaining(['forward-overlap', 'height-limit']));
    expect(status.unmet).toEqual(failing.map(({ key, label, required, achieved }) => ({ key, label, required, achieved })));
  });

  it('refuses a sign-off without a reason for every unmet requirement, naming the ones missing, and changes nothing', async () => {
    const v = await failingVersion();
    const { unmet } = versionReviewSchema.parse((await team.clients.surveyor.get(`${v.path}/review`)).body);
    const bare = await team.clients.surveyor.post(`${v.path}/sign-off`, { comment: 'Looks fine.' });
    expect(bare.status).toBe(422);
    expect(bare.body.error.code).toBe('reasons_required');
    for (const u of unmet) expect(bare.body.error.message).toContain(u.label);
    expect(bare.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(unmet.map((u) => `reasons.${u.key}`).sort());

    // One reason of two still refuses, and names only the one missing.
    const partial = await team.clients.surveyor.post(`${v.path}/sign-off`, { reasons: [{ key: unmet[0].key, reason: 'Accepted by the client on site, see e-mail of 1 December.' }] });
    expect(partial.status).toBe(422);
    expect(partial.body.error.fields.map((f: { path: string }) => f.path)).toEqual(unmet.slice(1).map((u) => `reasons.${u.key}`));
    // A reason too short to mean anything is refused by the schema, field by field.
    const short = await team.clients.surveyor.post(`${v.path}/sign-off`, { reasons: unmet.map((u) => ({ key: u.key, reason: 'ok' })) });
    expect(short.status).toBe(422);
    expect(short.body.error.code).not.toBe('reasons_required');

    const after = versionReviewSchema.parse((await team.clients.surveyor.get(`${v.path}/review`)).body);
    expect(after.reviewState).toBe('in_review');
  });

  it('signs off with a reason for each, and prints the reasons in the report and its PDF', async () => {
    const v = await failingVersion();
    const { unmet } = versionReviewSchema.parse((await team.clients.surveyor.get(`${v.path}/review`)).body);
    const reasons = unmet.map((u, i) => ({ key: u.key, reason: `Reason ${i + 1}: the client accepted ${u.label.toLowerCase()} as flown & <noted>.` }));
    const ok = await team.clients.surveyor.post(`${v.path}/sign-off`, { comment: 'Signed with reasons.', reasons });
    expect(ok.status).toBe(200);
    const review = versionReviewSchema.parse(ok.body);
    expect(review.reviewState).toBe('signed_off');
    expect(review.signOffReasons.map((r) => [r.key, r.reason])).toEqual(reasons.map((r) => [r.key, r.reason]));

    const report = complianceReportSchema.parse((await team.clients.surveyor.get(`${v.path}/report`)).body);
    expect(report.signOff.reasons.map((r) => [r.key, r.reason])).toEqual(reasons.map((r) => [r.key, r.reason]));
    for (const r of report.signOff.reasons) expect(r.label).toBe(unmet.find((u) => u.key === r.key)!.label);

    const pdf = await team.clients.surveyor.getBytes(`${v.path}/report.pdf`);
    expect(pdf.status).toBe(200);
    const text = pdfText(pdf.bytes).replace(/\s+/g, ' ');
    expect(text).toContain('the surveyor’s reasons');
    for (const r of reasons) expect(text).toContain(r.reason);
  });

  it('signs off a version that meets the spec with no reason, and keeps none', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review' });
    const { unmet } = versionReviewSchema.parse((await team.clients.surveyor.get(`${v.path}/review`)).body);
    // Whatever the fixture misses, a spec loosened to what it achieves has nothing unmet.
    if (unmet.length) {
      await srv.db.update(planVersion).set({ input: syntheticMission({ forwardOverlap: 0.1, sideOverlap: 0.1, maxAglM: 500, clearanceM: 1, obstacleAllowanceM: 0, gsdTolerance: 0.5 }) }).where(eq(planVersion.id, v.versionId));
    }
    const status = versionReviewSchema.parse((await team.clients.surveyor.get(`${v.path}/review`)).body);
    expect(status.unmet).toEqual([]);
    const ok = await team.clients.surveyor.post(`${v.path}/sign-off`, {});
    expect(ok.status).toBe(200);
    expect(versionReviewSchema.parse(ok.body).signOffReasons).toEqual([]);
    const report = complianceReportSchema.parse((await team.clients.surveyor.get(`${v.path}/report`)).body);
    expect(report.signOff.reasons).toEqual([]);
  });
});

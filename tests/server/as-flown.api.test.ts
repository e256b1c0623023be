/**
 * As-flown checks over real HTTP against the real database: a photo log of the demo mission's simulated flight
 * (datasets/example-photo-log.csv, made by datasets/make-example-photo-log.ts: wind drift, crab, and triggers
 * skipped on purpose) is checked against a version of the same mission. The stored document equals the command
 * line's for the same grid, mission and log; the skipped triggers are found exactly (the simulation's ground
 * truth); roles, refusals and the audit trail hold.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { asFlownCheckListSchema, asFlownCheckSchema, type AsFlownCheck } from '../../contracts/as-flown';
import { generalCautions } from '../../contracts/cautions';
import { shareWords } from '../../contracts/coverage-words';
import { complianceReportSchema } from '../../contracts/reports';
import { pdfImages, pdfText } from '../reports/pdf-text';
import { parsePhotoLogCsv, type PhotoRecord } from '../../contracts/photo-log';
import { planVersion } from '../../db/schema';
import { runTerrainCli } from '../cli/run-cli';
import { EXAMPLE_SKIPPED } from '../../datasets/make-example-photo-log';
import { freshTeam, type FreshTeam } from '../support/fixtures';
import { analysedExampleVersion, EXAMPLE_MISSION as MISSION } from '../support/analysed-version';
import { startTestServer, type TestServer } from '../support/test-server';

const LOG = 'datasets/example-photo-log.csv';
let srv: TestServer;
let team: FreshTeam;
let versionId: string;
let planId: string;
let checks: string;
let photos: PhotoRecord[];
let first: AsFlownCheck;

beforeAll(async () => {
  srv = await startTestServer({ web: false, env: { WORKERS: '1', JOBS_POLL_SECONDS: '0.5' } });
  team = await freshTeam(srv, 'as-flown');
  ({ versionId, planId } = await analysedExampleVersion(team));
  checks = `/api/teams/${team.teamId}/flights/${versionId}/as-flown-checks`;
  photos = parsePhotoLogCsv(fs.readFileSync(LOG, 'utf8'));
});
afterAll(async () => srv?.stop());

describe('as-flown checks', () => {
  it('checks the simulated flight\'s photo log: the skipped triggers exactly, and the command line\'s document', async () => {
    const r = await team.clients.planner.post(checks, { source: 'csv', label: 'example-photo-log.csv', photos });
    expect(r.status).toBe(201);
    first = asFlownCheckSchema.parse(r.body);
    const d = first.document;
    expect(first).toMatchObject({ source: 'csv', label: 'example-photo-log.csv', photoCount: photos.length, createdBy: { name: team.users.planner.name } });
    // ground truth of the simulation (datasets/make-example-photo-log.ts): the triggers it skipped on purpose
    expect(d.matching.missed.map((m) => ({ line: m.line, station: m.station }))).toEqual(EXAMPLE_SKIPPED);
    expect(first.missedTriggers).toBe(EXAMPLE_SKIPPED.length);
    expect(first.shareAllFlown).toBe(d.flown.shareAll);
    expect(d.flown.shareAll).toBeLessThan(d.planned.shareAll);
    expect(d.cautions).toEqual([...generalCautions]);
    // every height names its reference: the site's vertical datum
    expect(d.heights.reference).toContain('EGM96');
    // the command line on the same grid, mission and log says the same (heights name the file's own datum there)
    // the version's mission as stored (defaults filled in), so both check the same plan
    const stored = (await team.clients.planner.get(`/api/teams/${team.teamId}/plans/${planId}/versions/${versionId}`)).body.input;
    const missionFile = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-as-flown-api-')), 'mission.json');
    fs.writeFileSync(missionFile, JSON.stringify(stored));
    // in a child process, as a user runs it (in this process it would hold the server's event loop for seconds)
    const out = await runTerrainCli(['as-flown', 'datasets/harrow-fell-dem.tif', '--mission', missionFile, '--photos', LOG]);
    expect(out.stderr).toBe('');
    const cli = JSON.parse(out.stdout) as Record<string, unknown>;
    const strip = (doc: Record<string, unknown>) => { const { timingMs: _t, heights: _h, ...rest } = doc; return rest; };
    expect(strip(d as unknown as Record<string, unknown>)).toEqual(strip(cli));
    // the same-day re-flight flies stretches of the version's own lines at the version's stored heights: each
    // stretch leg's ends, read off the stored result's legs (linear along each leg), agree within 1 cm
    const result = (await team.clients.planner.get(`/api/teams/${team.teamId}/plans/${planId}/versions/${versionId}`)).body.result as {
      lines: Array<{ legs: Array<{ start: { distanceM: number }; end: { distanceM: number }; altitudeStartAboveTakeoffM: number; altitudeEndAboveTakeoffM: number; altitudeStartM: number; altitudeEndM: number }> }>;
    };
    const items = d.reflight?.stretches?.items ?? [];
    expect(items.length).toBeGreaterThan(0);
    const heightAt = (line: number, dM: number, key: 'AboveTakeoffM' | 'M') => {
      const leg = result.lines[line - 1].legs.find((g) => g.start.distanceM <= dM + 0.05 && g.end.distanceM >= dM - 0.05)!;
      const t = leg.end.distanceM > leg.start.distanceM ? (dM - leg.start.distanceM) / (leg.end.distanceM - leg.start.distanceM) : 0;
      const a = key === 'M' ? leg.altitudeStartM : leg.altitudeStartAboveTakeoffM, b = key === 'M' ? leg.altitudeEndM : leg.altitudeEndAboveTakeoffM;
      return a + Math.min(1, Math.max(0, t)) * (b - a);
    };
    for (const st of items) {
      for (const g of st.legs) {
        // distances and heights are stored to the millimetre
        expect(Math.abs(g.altitudeStartAboveTakeoffM - heightAt(st.line, g.fromM, 'AboveTakeoffM'))).toBeLessThan(0.01);
        expect(Math.abs(g.altitudeEndAboveTakeoffM - heightAt(st.line, g.toM, 'AboveTakeoffM'))).toBeLessThan(0.01);
        expect(Math.abs(g.altitudeStartM - heightAt(st.line, g.fromM, 'M'))).toBeLessThan(0.01);
        expect(Math.abs(g.altitudeEndM - heightAt(st.line, g.toM, 'M'))).toBeLessThan(0.01);
      }
    }
    expect(d.heights.datum).toContain('EGM96');
  });

  it('lists the checks newest first for every role that reads flights, and answers one whole', async () => {
    for (const role of ['owner', 'planner', 'surveyor'] as const) {
      const l = await team.clients[role].get(checks);
      expect(l.status).toBe(200);
      const list = asFlownCheckListSchema.parse(l.body);
      expect(list.checks.map((c) => c.id)).toContain(first.id);
    }
    const one = await team.clients.surveyor.get(`${checks}/${first.id}`);
    expect(one.status).toBe(200);
    expect(asFlownCheckSchema.parse(one.body).document.matching.missed).toEqual(first.document.matching.missed);
    expect((await team.clients.surveyor.get(`${checks}/${crypto.randomUUID()}`)).status).toBe(404);
    expect((await team.clients.surveyor.get(`${checks}/not-an-id`)).status).toBe(404);
  });

  it('keeps each check in the audit trail: who, how many photos, from where', async () => {
    const r = await srv.db.$client.query<{ action: string; comment: string; actor_id: string }>(
      "select action, comment, actor_id from audit_event where plan_version_id = $1 and action = 'as-flown.checked'", [versionId]);
    expect(r.rows).toHaveLength(1);
    expect(r.rows[0].actor_id).toBe(team.users.planner.id);
    expect(r.rows[0].comment).toContain(`${photos.length} photos (CSV photo log: example-photo-log.csv)`);
    expect(r.rows[0].comment).toContain(`${EXAMPLE_SKIPPED.length} missed triggers`);
  });

  it('puts the latest check in the compliance report and its PDF, as flown next to as planned', async () => {
    const versionPath = `/api/teams/${team.teamId}/plans/${planId}/versions/${versionId}`;
    const report = complianceReportSchema.parse((await team.clients.surveyor.get(`${versionPath}/report`)).body);
    const a = report.asFlown!;
    expect(a).toMatchObject({ photoCount: photos.length, checkCount: 1, label: 'example-photo-log.csv', checkedBy: team.users.planner.name, missedTriggers: EXAMPLE_SKIPPED.length });
    expect(a.shareAllFlown).toBe(first.document.flown.shareAll);
    expect(a.items.map((i) => [i.item, i.flown, i.planned])).toEqual(first.document.flown.items.map((i) => [i.item, i.share, first.document.planned.items.find((x) => x.item === i.item)!.share]));
    const pdf = await team.clients.surveyor.getBytes(`${versionPath}/report.pdf`);
    expect(pdf.status).toBe(200);
    // pdftotext (Debian poppler-utils) reads the PDF back
    const text = pdfText(pdf.bytes).replace(/\s+/g, ' ');
    expect(text).toContain('As flown: what the photos covered');
    expect(text).toContain(`Whole spec met on ${shareWords(first.document.flown.shareAll)} of the area as flown (${shareWords(first.document.planned.shareAll)} as planned)`);
    expect(text).toContain(`${EXAMPLE_SKIPPED.length} missed triggers`);
    // the map as flown: the check's own image, in the report and printed in the PDF with its legend in words
    const map = first.document.map!;
    expect(a.map).toEqual(map);
    expect(text).toContain('Map as flown: pale green: meets the whole spec as flown');
    expect(text).toContain('orange with dark stripes: lost in flight');
    // pdfimages (Debian poppler-utils) finds the image at its own size in the PDF
    expect(pdfImages(pdf.bytes).some((im) => im.type === 'image' && im.width === map.widthPx && im.height === map.heightPx)).toBe(true);
  });

  it('refuses a bad photo log naming the photo and the field, and stores nothing', async () => {
    const bad = photos.slice(0, 20).map((p, i) => (i === 3 ? { ...p, lat: 95 } : p));
    const r = await team.clients.planner.post(checks, { source: 'csv', label: 'bad.csv', photos: bad });
    expect(r.status).toBe(422);
    expect(r.body.error.fields.map((f: { path: string }) => f.path)).toContain('photos.3.lat');
    expect(JSON.stringify(r.body)).toContain('lat must be a number from -90 to 90');
    const none = await team.clients.planner.post(checks, { source: 'csv', label: 'empty.csv', photos: [] });
    expect(none.status).toBe(422);
    const list = asFlownCheckListSchema.parse((await team.clients.planner.get(checks)).body);
    expect(list.checks).toHaveLength(1);
  });

  it('reads a photo log past the 1 MB other requests may send, and refuses one past 20,000 photos by its count (not its size)', async () => {
    const many = Array.from({ length: 20_001 }, (_, i) => ({ ...photos[i % photos.length], file: `IMG_${i}.JPG` }));
    const body = { source: 'photos', label: 'DCIM/100', photos: many };
    expect(JSON.stringify(body).length).toBeGreaterThan(1_000_000);
    const r = await team.clients.planner.post(checks, body);
    expect(r.status).toBe(422);
    expect(JSON.stringify(r.body.error)).toMatch(/20000|20,000/);
  });

  it('refuses to check a version whose analysis is not done, saying so', async () => {
    // the version is set back to running for this check alone, then restored
    await srv.db.update(planVersion).set({ analysisState: 'running' }).where(eq(planVersion.id, versionId));
    try {
      const r = await team.clients.planner.post(checks, { source: 'csv', label: 'x.csv', photos: photos.slice(0, 5) });
      expect(r.status).toBe(409);
      expect(r.body.error.code).toBe('analysis_not_done');
      expect(r.body.error.message).toContain('has no finished analysis yet');
    } finally {
      await srv.db.update(planVersion).set({ analysisState: 'done' }).where(eq(planVersion.id, versionId));
    }
  });

  it('lets pilots check only signed-off versions (others do not exist for them); surveyors read but do not check', async () => {
    const s = await team.clients.surveyor.post(checks, { source: 'csv', label: 'x.csv', photos: photos.slice(0, 5) });
    expect(s.status).toBe(403);
    expect((await team.clients.pilot.post(checks, { source: 'csv', label: 'x.csv', photos: photos.slice(0, 5) })).status).toBe(404);
    expect((await team.clients.pilot.get(checks)).status).toBe(404);
    await srv.db.update(planVersion).set({ reviewState: 'signed_off' }).where(eq(planVersion.id, versionId));
    const p = await team.clients.pilot.post(checks, { source: 'photos', label: '12 photos from DCIM/101', photos: photos.slice(100, 112) });
    expect(p.status).toBe(201);
    const doc = asFlownCheckSchema.parse(p.body);
    expect(doc.photoCount).toBe(12);
    expect(doc.source).toBe('photos');
    // twelve photos cover a sliver: most of the area falls short as flown, and the check says so rather than failing
    expect(doc.document.flown.shareAll).toBeLessThan(0.2);
    expect(doc.document.matching.matched).toBe(12);
  });

  it('hides a team\'s checks from another team, even with the exact ids', async () => {
    const outsider = await freshTeam(srv, 'as-flown-outsider');
    const theirs = `/api/teams/${outsider.teamId}/flights/${versionId}/as-flown-checks`;
    expect((await outsider.clients.owner.get(theirs)).status).toBe(404);
    // not a member of the team named in the path: the team itself does not exist for them
    expect((await outsider.clients.owner.get(checks)).status).toBe(404);
    expect((await outsider.clients.planner.post(theirs, { source: 'csv', label: 'x.csv', photos: photos.slice(0, 5) })).status).toBe(404);
  });

});

/**
 * Photos as flown in Chromium against the real web build and API: the pilot, on a 390x844 phone, picks the 894
 * photos of the example mission's simulated flight (JPEGs whose metadata exiftool wrote from
 * datasets/example-photo-log.csv); the browser reads their metadata (only that is sent), and the leg sheet shows
 * the share of the area meeting the spec as flown against as planned, the missed triggers the simulation skipped
 * on purpose, and the re-flight. The surveyor, at 1440x900, reads the same check on the version screen with no
 * control to run one. Screenshots go to .artifacts/screenshots/as-flown/.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parsePhotoLogCsv } from '../../contracts/photo-log';
import { asFlownCheck, planVersion } from '../../db/schema';
import { asFlownDocSchema } from '../../contracts/as-flown';
import { formatAltitudePair } from '../../components/flights/leg-format';
import { EXAMPLE_SKIPPED } from '../../datasets/make-example-photo-log';
import { analysedExampleVersion } from '../support/analysed-version';
import { growToContent, launchBrowser, openPage, screenshotDir, viewports, signInWith } from '../support/browser';
import { fixturePassword, freshTeam, type FreshTeam } from '../support/fixtures';
import { writePhotoJpegs } from '../support/photo-jpegs';
import { startTestServer, type TestServer } from '../support/test-server';

const shotDir = path.join(screenshotDir, 'as-flown');
let srv: TestServer;
let browser: Browser;
let team: FreshTeam;
let ids: { projectId: string; planId: string; versionId: string };
let jpegs: string[];

beforeAll(async () => {
  if (!process.env.LOFTLINE_WEB_DIST) throw new Error('LOFTLINE_WEB_DIST is not set: run the browser tests through `npm test`.');
  fs.mkdirSync(shotDir, { recursive: true });
  srv = await startTestServer({ env: { WORKERS: '1', JOBS_POLL_SECONDS: '0.5' } });
  browser = await launchBrowser();
  team = await freshTeam(srv, 'as-flown-e2e');
  ids = await analysedExampleVersion(team, { plan: 'Face and spoil heap' });
  // a signed-off version is what a pilot flies (the review itself is tested elsewhere)
  await srv.db.update(planVersion).set({ reviewState: 'signed_off', signedOffBy: team.users.surveyor.id, signedOffAt: new Date() }).where(eq(planVersion.id, ids.versionId));
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-as-flown-e2e-'));
  jpegs = writePhotoJpegs(parsePhotoLogCsv(fs.readFileSync('datasets/example-photo-log.csv', 'utf8')), dir);
}, 240_000);
afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

async function signIn(page: Page, email: string) {
  await signInWith(page, srv.url, email, fixturePassword);
}

/** "line 5, stations 12–17" runs of the simulation's skipped triggers, as the card words them. */
function skippedRuns(): string[] {
  const out: string[] = [];
  for (const s of EXAMPLE_SKIPPED) {
    const last = out.length ? out[out.length - 1] : null;
    const m = last ? /^line (\d+), stations? (\d+)(?:–(\d+))?$/.exec(last) : null;
    if (m && Number(m[1]) === s.line && Number(m[3] ?? m[2]) === s.station - 1) out[out.length - 1] = `line ${s.line}, stations ${m[2]}–${s.station}`;
    else out.push(`line ${s.line}, station ${s.station}`);
  }
  return out;
}

describe('photos as flown', () => {
  it('lets the pilot check the flight\'s photos on a phone and see what is short, where, and the re-flight', async () => {
    const { page, context, pageErrors } = await openPage(browser, viewports.phone);
    await signIn(page, team.users.pilot.email);
    await page.goto(`${srv.url}/flights/${ids.versionId}`);
    const card = page.getByTestId('as-flown');
    await card.scrollIntoViewIfNeeded();
    await expect(card.getByTestId('as-flown-none').textContent()).resolves.toContain('No photos checked');
    const t0 = Date.now();
    await page.getByTestId('as-flown-photos-input').setInputFiles(jpegs);
    await page.getByText(/Checking \d+ photos against the plan/).waitFor({ timeout: 60_000 });
    const readMs = Date.now() - t0;
    await card.getByTestId('as-flown-result').waitFor({ timeout: 120_000 });
    console.info(`as-flown in Chromium: ${jpegs.length} photos' metadata read on the device in ${readMs} ms; result after ${Date.now() - t0} ms`);
    const text = (await card.getByTestId('as-flown-result').textContent()) ?? '';
    expect(text).toContain(`${jpegs.length} photos`);
    expect(text).toMatch(/Whole spec met on [\d.]+ % of the area as flown \([\d.]+ % as planned\)/);
    for (const run of skippedRuns()) expect(await card.getByTestId('as-flown-missed').textContent()).toContain(run);
    await expect(card.getByTestId('as-flown-verdict').textContent()).resolves.toBe('Short of the plan');
    expect(await card.getByTestId('as-flown-reflight').textContent()).toMatch(/Lines\d+Photos\d+/);
    expect(text).toContain('EGM96');
    // the same-day re-flight sheet: stretches of the signed-off lines at their signed-off heights, as stored with the check
    const [row] = await srv.db.select().from(asFlownCheck).where(eq(asFlownCheck.planVersionId, ids.versionId));
    const stretches = asFlownDocSchema.parse(row.document).reflight?.stretches;
    expect(stretches?.items.length).toBeGreaterThan(0);
    const sheet = card.getByTestId('as-flown-stretches');
    expect(await sheet.textContent()).toContain('Re-fly before you leave: stretches of the signed-off lines');
    // the first few show at once; the rest on request
    if (stretches!.items.length > 4) {
      await expect(card.getByTestId('as-flown-stretch-5').count()).resolves.toBe(0);
      await card.getByTestId('as-flown-stretches-all').click();
    }
    for (const [n, st] of stretches!.items.entries()) {
      const box = card.getByTestId(`as-flown-stretch-${n + 1}`);
      expect(await box.textContent()).toContain(`Line ${st.line}: `);
      for (const [k, g] of st.legs.entries()) {
        await expect(box.getByTestId(`as-flown-stretch-${n + 1}-altitude-${k + 1}`).textContent()).resolves.toBe(formatAltitudePair({ start: g.altitudeStartAboveTakeoffM, end: g.altitudeEndAboveTakeoffM }, 'metric'));
      }
    }
    const restore = await growToContent(page);
    await card.getByTestId('as-flown-stretch-1').screenshot({ path: path.join(shotDir, 'pilot-reflight-stretch-phone.png') });
    await card.screenshot({ path: path.join(shotDir, 'pilot-phone.png') });
    await restore();
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 240_000);

  it('shows the surveyor the check on the version screen, without a control to run one', async () => {
    const { page, context, pageErrors } = await openPage(browser, viewports.wide);
    await signIn(page, team.users.surveyor.email);
    await page.goto(`${srv.url}/projects/${ids.projectId}/plans/${ids.planId}/versions/${ids.versionId}`);
    const card = page.getByTestId('as-flown');
    await card.getByTestId('as-flown-result').waitFor({ timeout: 60_000 });
    expect(await card.getByTestId('as-flown-photos').count()).toBe(0);
    expect(await card.textContent()).toContain(`checked by ${team.users.pilot.name}`);
    const restore = await growToContent(page);
    await card.screenshot({ path: path.join(shotDir, 'surveyor-wide.png') });
    await restore();
    // the compliance report's as-flown section, with the check's map, at both sizes
    for (const vp of [viewports.wide, viewports.phone]) {
      await page.setViewportSize(vp);
      await page.goto(`${srv.url}/projects/${ids.projectId}/plans/${ids.planId}/versions/${ids.versionId}/report`);
      const section = page.getByTestId('report-as-flown');
      await section.getByTestId('report-as-flown-share').waitFor({ timeout: 60_000 });
      await section.getByTestId('as-flown-map-image').waitFor();
      expect(await section.getByTestId('as-flown-map-legend').textContent()).toContain('lost in flight');
      const back = await growToContent(page);
      await section.screenshot({ path: path.join(shotDir, `report-as-flown-${vp.width}.png`) });
      await back();
    }
    // after the flight the surveyor confirms the version as flown (the viewport is the phone's from the loop above), with a reason for each item the flight lost
    await page.goto(`${srv.url}/projects/${ids.projectId}/plans/${ids.planId}/versions/${ids.versionId}`);
    const flown = page.getByTestId('flown-card');
    await flown.getByTestId('flown-open').click();
    const boxes = flown.locator('textarea[data-testid^="flown-reason-"]');
    await boxes.first().waitFor();
    const n = await boxes.count();
    expect(n).toBeGreaterThan(0);
    // confirming without the reasons is refused in place
    await flown.getByTestId('flown-confirm').click();
    await expect(flown.getByText('Give a reason of at least 10 characters', { exact: false }).first().isVisible()).resolves.toBe(true);
    for (let k = 0; k < n; k++) await boxes.nth(k).fill('Strip along the rim re-flown the same afternoon and checked again.');
    await flown.getByTestId('flown-confirm').click();
    await flown.getByTestId('flown-state').filter({ hasText: `By ${team.users.surveyor.name}` }).waitFor({ timeout: 30_000 });
    const shot = await growToContent(page);
    await flown.screenshot({ path: path.join(shotDir, 'surveyor-confirm-flown-phone.png') });
    await shot();
    await page.goto(`${srv.url}/projects/${ids.projectId}/plans/${ids.planId}/versions/${ids.versionId}/report`);
    await page.getByTestId('report-flown').filter({ hasText: `Confirmed as flown by ${team.users.surveyor.name}` }).waitFor({ timeout: 30_000 });
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 180_000);

  it('lets the planner save the re-flight as new plans of the project, which analyse over the same grid', async () => {
    const { page, context, pageErrors } = await openPage(browser, viewports.wide);
    await signIn(page, team.users.planner.email);
    await page.goto(`${srv.url}/projects/${ids.projectId}/plans/${ids.planId}/versions/${ids.versionId}`);
    const save = page.getByTestId('as-flown-reflight-save');
    await save.waitFor({ timeout: 60_000 });
    const label = (await save.textContent()) ?? '';
    const n = Number(/as (\d+) new plan/.exec(label)?.[1]);
    expect(n).toBeGreaterThan(0);
    await save.click();
    const saved = page.getByTestId('as-flown-reflight-plans');
    await saved.getByText(/Saved as \d+ new plan/).waitFor({ timeout: 30_000 });
    const plans = (await team.clients.planner.get(`/api/teams/${team.teamId}/projects/${ids.projectId}/plans`)).body.plans as Array<{ id: string; name: string }>;
    const reflights = plans.filter((pl) => pl.name.startsWith('Re-flight '));
    expect(reflights.map((pl) => pl.name).sort()).toEqual(Array.from({ length: n }, (_, k) => expect.stringContaining(`Re-flight ${k + 1} of ${n} for Face and spoil heap v1`)));
    const restore = await growToContent(page);
    await saved.screenshot({ path: path.join(shotDir, 'planner-reflight-wide.png') });
    await restore();
    // the first re-flight runs like any plan: analysed over the same grid, its lines inside the version's area
    const planPath = `/api/teams/${team.teamId}/plans/${reflights.find((pl) => pl.name.startsWith(`Re-flight 1 of`))!.id}`;
    const run = await team.clients.planner.post(`${planPath}/runs`, {});
    expect(run.status).toBe(202);
    let state = '';
    for (let i = 0; i < 300 && state !== 'done' && state !== 'failed'; i++) {
      await new Promise((r) => setTimeout(r, 300));
      state = (await team.clients.planner.get(`${planPath}/versions/${run.body.id}/status`)).body.analysisState;
    }
    expect(state).toBe('done');
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 180_000);
});

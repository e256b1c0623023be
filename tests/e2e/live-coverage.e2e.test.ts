/**
 * Live coverage in Chromium against the real web build and API: photos recorded on line 1 of a signed-off version,
 * with a gap, show on the version page's map (views coloured, the passed gap hatched) and on the pilot's leg sheet
 * (share of the area, the patch to re-fly). Screenshots go to .artifacts/screenshots/live/.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { growToContent, launchBrowser, openPage, screenshotDir, viewports, signInWith } from '../support/browser';
import { analysedResult, createVersion, fixturePassword, freshTeam, storeSyntheticDem, type FreshTeam, type VersionFixture } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';

const shotDir = path.join(screenshotDir, 'live');
let srv: TestServer;
let browser: Browser;
let team: FreshTeam;
let v: VersionFixture;

beforeAll(async () => {
  if (!process.env.LOFTLINE_WEB_DIST) throw new Error('LOFTLINE_WEB_DIST is not set: run the browser tests through `npm test`.');
  fs.mkdirSync(shotDir, { recursive: true });
  srv = await startTestServer({ env: { LIVE_COVERAGE_SECONDS: '0.5' } });
  browser = await launchBrowser();
  team = await freshTeam(srv, 'live-e2e');
  v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off', planName: 'Tarn rim live' });
  await storeSyntheticDem(srv, v.siteId);
  // Line 1 flown on its planned stations, six photos in the middle missing.
  const plan = analysedResult();
  const line1 = plan.lines[0].stations;
  const mid = Math.floor(line1.length / 2);
  const triggers = line1
    .map((s, k) => ({ imageIndex: k, lat: s.lat, lon: s.lon, altitudeAboveTakeoffM: s.altitudeAboveTakeoffM, altitudeMslM: 300, rollDeg: 0, pitchDeg: 0, yawDeg: plan.lines[0].headingDeg, capturedAt: new Date(Date.UTC(2026, 11, 2, 10, 0, k * 2)).toISOString() }))
    .filter((_, k) => k < mid - 3 || k >= mid + 3);
  const r = await team.clients.pilot.post(`/api/teams/${team.teamId}/flights/${v.versionId}/triggers`, { sortie: crypto.randomUUID(), triggers });
  expect(r.status).toBe(201);
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

async function signIn(role: 'planner' | 'pilot', viewport: { width: number; height: number }) {
  const { page, context, pageErrors } = await openPage(browser, viewport);
  await signInWith(page, srv.url, team.users[role].email, fixturePassword);
  return { page, context, pageErrors };
}

describe('live coverage in the browser', () => {
  it('draws the coverage as flown on the version page\'s map, the passed gap hatched (wide)', async () => {
    const { page, context, pageErrors } = await signIn('planner', viewports.wide);
    await page.goto(`${srv.url}/projects/${v.projectId}/plans/${v.planId}/versions/${v.versionId}`);
    const card = page.getByTestId('live-map-card');
    await card.getByTestId('live-map').waitFor({ timeout: 60_000 });
    await expect(card.getByTestId('live-map-headline').textContent()).resolves.toMatch(/^\d+ photos recorded, last matched to line 1 station \d+; 6 planned stations passed without a photo\./);
    // Both images are on the map, from the event's PNGs (data: URLs the page's CSP allows).
    await expect(page.locator('[data-testid="live-layer-views"]').getAttribute('href')).resolves.toMatch(/^data:image\/png;base64,/);
    // The hatching is a patterned rectangle masked by the short-ground image.
    await expect(page.locator('[data-testid="live-layer-short"]').count()).resolves.toBe(1);
    await expect(page.locator('mask image[href^="data:image/png;base64,"]').count()).resolves.toBe(1);
    await card.getByTestId('live-map-patches').waitFor();
    await card.scrollIntoViewIfNeeded();
    await card.screenshot({ path: path.join(shotDir, 'wide-live-map.png') });
    expect(pageErrors).toEqual([]);
    await context.close();
  });

  it('gives the pilot the figures and the patch to re-fly on the leg sheet (phone)', async () => {
    const { page, context, pageErrors } = await signIn('pilot', viewports.phone);
    await page.goto(`${srv.url}/flights/${v.versionId}`);
    const card = page.getByTestId('live-coverage');
    await card.getByTestId('live-coverage-headline').filter({ hasText: 'photos recorded' }).waitFor({ timeout: 60_000 });
    await expect(card.getByTestId('live-coverage-patches').textContent()).resolves.toMatch(/[\d,]+ m² short of the spec around /);
    await expect(card.getByTestId('live-coverage-state').textContent()).resolves.toMatch(/^Live · computed /);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    // the app scrolls inside its own container: the window grows to the content for the shot, then is restored
    const restore = await growToContent(page);
    await card.screenshot({ path: path.join(shotDir, 'phone-leg-sheet-live.png') });
    await restore();
    expect(pageErrors).toEqual([]);
    await context.close();
  });
});

/**
 * The review loop in Chromium against the real web build and API: the demo planner sends a version for review, the
 * demo surveyor signs it off from the compliance report, the demo pilot reads the leg sheet on a 390x844 phone (also
 * with the leg-sheet request cut off), and the demo owner invites a pilot who joins through the e-mailed link.
 * Screenshots go to .artifacts/screenshots/review/.
 */
import fs from 'node:fs';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoUsers } from '../../contracts/demo-team';
import { demoPassword } from '../../server/seed/demo-password';
import type { Role } from '../../contracts/roles';
import { user } from '../../db/schema';
import { growToContent, launchBrowser, screenshotDir, viewports, openPage, signInWith } from '../support/browser';
import { demoClients, demoTeamId, seededDemoVersion } from '../support/demo';
import { createVersion, eventually, type VersionFixture } from '../support/fixtures';
import type { ApiClient } from '../support/http-client';
import { uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

const shotDir = path.join(screenshotDir, 'review');
const skipWeb = process.env.LOFTLINE_SKIP_WEB === '1';

let srv: TestServer;
let browser: Browser;
let teamId: string;
let clients: Record<Role, ApiClient>;
let version: VersionFixture;

const demo = (role: Role) => demoUsers.find((u) => u.role === role)!;

beforeAll(async () => {
  if (!process.env.LOFTLINE_WEB_DIST && !skipWeb) throw new Error('LOFTLINE_WEB_DIST is not set: run the browser tests through `npm test`.');
  fs.mkdirSync(shotDir, { recursive: true });
  srv = await startTestServer();
  browser = await launchBrowser();
  teamId = await demoTeamId(srv);
  clients = await demoClients(srv);
  version = (await seededDemoFixture()) ?? (await fixtureVersion());
});

/** Version 1 of the seeded demo plan (Harrow Fell, analysed at seed time), when the seed made it. */
async function seededDemoFixture(): Promise<VersionFixture | null> {
  const demo = await seededDemoVersion(srv);
  return demo && { projectId: demo.projectId, planId: demo.planId, versionId: demo.versionId, siteId: demo.siteId, path: demo.apiPath };
}

/** Otherwise an analysed draft over the fixtures' synthetic hill in the demo team. */
async function fixtureVersion(): Promise<VersionFixture> {
  const [planner] = await srv.db.select({ id: user.id }).from(user).where(eq(user.email, demo('planner').email));
  return createVersion(srv, { teamId, createdBy: planner!.id, planName: `Quarry north face ${Date.now().toString(36)}` });
}

afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

async function signIn(page: Page, email: string, password = demoPassword): Promise<void> {
  await signInWith(page, srv.url, email, password);
}

/**
 * A screenshot of the whole screen: the app scrolls inside its own container, not the document, so the window is
 * made as tall as the content for the shot (Chromium's limit is 16384 px) and restored after.
 */
async function shootWhole(page: Page, name: string): Promise<void> {
  const restore = await growToContent(page);
  await page.screenshot({ path: path.join(shotDir, name) });
  await restore();
}

/** The page's width beyond the window: 0 means nothing scrolls sideways. */
async function horizontalOverflowPx(page: Page): Promise<number> {
  return page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
}

const reportUrl = () => `${srv.url}/projects/${version.projectId}/plans/${version.planId}/versions/${version.versionId}/report`;

describe.skipIf(skipWeb)('surveyor sign-off and the pilot leg sheet', () => {
  it('the demo planner sends the version for review through the API', async () => {
    const before = await clients.planner.get(`${version.path}/review`);
    expect(before.status).toBe(200);
    // Another suite may already have sent the shared demo version; signing off is what this file needs to see.
    expect(before.body.reviewState, 'the demo version must not be signed off before this suite').not.toBe('signed_off');
    if (before.body.reviewState !== 'in_review') {
      const r = await clients.planner.post(`${version.path}/submit`, { comment: 'Follow mode over the face; please check the lines by the spoil heap.' });
      expect(r.status).toBe(200);
      expect(r.body.reviewState).toBe('in_review');
    }
  });

  it('the demo surveyor reads the compliance report and signs the version off', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.wide);
    try {
      await signIn(page, demo('surveyor').email);
      await page.goto(reportUrl());
      await page.getByTestId('report-spec').waitFor();
      await expect(page.getByTestId('review-state').textContent()).resolves.toBe('In review');
      // The figures on screen are the API's: the overall median GSD, formatted to two decimals.
      const api = await clients.surveyor.get(`${version.path}/report`);
      expect(api.status).toBe(200);
      const median = api.body.overall.gsdCm.median as number;
      await expect(page.getByTestId('overall-gsd-median').textContent()).resolves.toContain(median.toFixed(2));
      await expect(page.getByTestId('gsd-chart-1').locator('svg path').count()).resolves.toBeGreaterThan(0);
      await expect(page.getByTestId('report-pdf').getAttribute('href')).resolves.toBe(`/api/teams/${teamId}/plans/${version.planId}/versions/${version.versionId}/report.pdf`);
      await shootWhole(page, 'wide-report-in-review.png');

      // A return needs a comment: confirming an empty one is refused in place, nothing is sent.
      await page.getByTestId('review-return').click();
      await page.getByTestId('review-confirm').click();
      await page.getByTestId('review-comment-error').waitFor();
      await page.getByTestId('review-cancel').click();

      await page.getByTestId('review-sign-off').click();
      await page.getByTestId('review-comment').fill('Checked against the client spec on site with the client.');
      // Every requirement the version misses gets a reason box; confirming with any left empty is refused in place.
      const { unmet } = (await clients.surveyor.get(`${version.path}/review`)).body as { unmet: { key: string; label: string }[] };
      for (const u of unmet) await page.getByTestId(`review-reason-${u.key}`).waitFor();
      if (unmet.length) {
        await page.getByTestId('review-confirm').click();
        await page.getByTestId(`review-reason-${unmet[0].key}-error`).waitFor();
        await expect(page.getByTestId('review-state').textContent()).resolves.toBe('In review');
        await page.getByTestId('review-panel').screenshot({ path: path.join(shotDir, 'wide-review-panel-reasons.png') });
        for (const u of unmet) await page.getByTestId(`review-reason-${u.key}`).fill(`Client accepted on site: ${u.label.toLowerCase()} as planned.`);
      }
      await page.getByTestId('review-confirm').click();
      await page.getByTestId('review-locked').waitFor();
      for (const u of unmet) {
        await eventually(async () => (await page.getByTestId(`sign-off-reason-${u.key}`).count()) > 0, 10_000, `the reason for ${u.key} in the report`);
        await expect(page.getByTestId(`sign-off-reason-${u.key}`).textContent()).resolves.toContain('Client accepted on site');
      }
      if (unmet.length) await page.getByTestId('report-sign-off').screenshot({ path: path.join(shotDir, 'wide-report-sign-off-block.png') });
      await expect(page.getByTestId('review-state').textContent()).resolves.toBe('Signed off');
      await page.getByTestId('audit-review.signed_off').waitFor();
      await eventually(async () => (await page.getByTestId('sign-off-by').textContent())?.includes(demo('surveyor').name), 10_000, 'the sign-off block');
      await shootWhole(page, 'wide-report-signed-off.png');

      const status = await clients.surveyor.get(`${version.path}/review`);
      expect(status.body).toMatchObject({ reviewState: 'signed_off', locked: true, allowedActions: [] });
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);

  it('the demo pilot on a 390x844 phone opens the leg sheet and reads the API\'s first-leg altitude', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.phone);
    try {
      await signIn(page, demo('pilot').email);
      await page.waitForURL((u) => u.pathname === '/flights');
      await page.getByTestId(`flight-${version.versionId}`).waitFor();
      await shootWhole(page, 'phone-flights.png');
      await page.getByTestId(`flight-${version.versionId}`).click();
      await page.waitForURL((u) => u.pathname === `/flights/${version.versionId}`);
      const altitude = page.getByTestId('leg-1-1-altitude');
      await altitude.waitFor();

      const sheet = await clients.pilot.get(`/api/teams/${teamId}/flights/${version.versionId}/leg-sheet`);
      expect(sheet.status).toBe(200);
      const first = sheet.body.lines[0].legs[0].altitudeAboveTakeoffM as { start: number; end: number };
      const shown = (await altitude.textContent()) ?? '';
      // "62 m" or "62 → 75 m": the first figure is the start altitude rounded to whole metres.
      const figure = Number(/^(-?[\d,]+)/.exec(shown)?.[1]?.replace(/,/g, ''));
      expect(shown).toMatch(/ m$/);
      expect(figure).toBe(Math.round(first.start));
      expect(Math.abs(figure - first.start)).toBeLessThanOrEqual(0.5);

      await page.screenshot({ path: path.join(shotDir, 'phone-leg-sheet-top.png') });

      // Large enough to read outdoors: the altitude is the largest type on the page.
      const px = await altitude.evaluate((el) => parseFloat(getComputedStyle(el).fontSize));
      expect(px).toBeGreaterThanOrEqual(40);
      await expect(page.getByTestId('leg-sheet-state').textContent()).resolves.toBe('Signed off');
      await expect(page.getByTestId('checklist-takeoff-height').isVisible()).resolves.toBe(true);
      await page.getByTestId('checklist-wind').click();
      await expect(page.getByTestId('checklist-wind').getAttribute('aria-checked')).resolves.toBe('true');
      for (const f of ['geojson', 'kml', 'gpx', 'csv']) {
        await expect(page.getByTestId(`export-${f}`).getAttribute('href')).resolves.toBe(`/api/teams/${teamId}/plans/${version.planId}/versions/${version.versionId}/export.${f}`);
      }
      // The autopilot hand-off card: the item count of the mission-items route, trigger distance and speed per line, the JSON.
      const mission = (await clients.pilot.get(`/api/teams/${teamId}/flights/${version.versionId}/mission-items`)).body;
      await page.getByTestId('mission-items-count').waitFor();
      await expect(page.getByTestId('mission-items-count').textContent()).resolves.toContain(`${mission.items.length} items. Altitudes in MAV_FRAME_GLOBAL_RELATIVE_ALT_INT`);
      await expect(page.getByTestId('mission-items-line-1').textContent()).resolves.toMatch(/^Line 1: a photo every .+ at .+ \(\d+ photos, items \d+–\d+\)$/);
      // The compact item list, one row per item, heights named above takeoff.
      await page.getByTestId('mission-items-toggle').click();
      await expect(page.getByTestId('mission-items-list').getByRole('listitem').count()).resolves.toBe(mission.items.length);
      await expect(page.getByTestId('mission-items-list').getByRole('listitem').first().textContent()).resolves.toMatch(/^0 NAV_TAKEOFF · .+ above takeoff$/);
      await page.getByTestId('mission-items-toggle').click();
      await page.getByTestId('mission-items-recorded').filter({ hasText: 'No photos recorded as flown yet' }).waitFor();
      // Live coverage over server-sent events: nothing flown yet.
      await page.getByTestId('live-coverage-headline').filter({ hasText: 'No photos recorded yet' }).waitFor();
      await expect(page.getByTestId('mission-items-download').getAttribute('href')).resolves.toBe(`/api/teams/${teamId}/flights/${version.versionId}/mission-items?download=1`);
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
      await shootWhole(page, 'phone-leg-sheet.png');

      // With the leg-sheet request cut off (network gone after loading), the device copy still shows, said so.
      await page.route('**/leg-sheet', (route) => route.abort('internetdisconnected'));
      await page.reload();
      await page.getByTestId('offline-notice').waitFor();
      await expect(page.getByTestId('offline-notice').textContent()).resolves.toContain('Offline copy, loaded at');
      await expect(page.getByTestId('leg-1-1-altitude').textContent()).resolves.toBe(shown);
      // The tick made before the reload is still there (kept on the device for the day).
      await expect.poll(() => page.getByTestId('checklist-wind').getAttribute('aria-checked')).toBe('true');
      await page.getByTestId('offline-retry').waitFor({ timeout: 15_000 });
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
      await page.screenshot({ path: path.join(shotDir, 'phone-leg-sheet-offline.png') });
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);

  it('the signed-off report and the review panel also read on a 390x844 phone', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.phone);
    try {
      await signIn(page, demo('surveyor').email);
      await page.goto(reportUrl());
      await page.getByTestId('review-locked').waitFor();
      await page.getByTestId('gsd-chart-1').locator('svg').waitFor();
      expect(await horizontalOverflowPx(page)).toBe(0);
      await shootWhole(page, 'phone-report-signed-off.png');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);

  it('the leg sheet also lays out on a 1440x900 window', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.wide);
    try {
      await signIn(page, demo('pilot').email);
      await page.goto(`${srv.url}/flights/${version.versionId}`);
      await page.getByTestId('leg-1-1-altitude').waitFor();
      expect(await horizontalOverflowPx(page)).toBe(0);
      await shootWhole(page, 'wide-leg-sheet.png');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);
});

describe.skipIf(skipWeb)('invitations and the development outbox', () => {
  const invited = uniqueEmail('invited-pilot');
  let link = '';

  it('the demo owner invites a pilot from the Team screen and sees it pending', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.wide);
    try {
      await signIn(page, demo('owner').email);
      await page.getByTestId('nav-team').click();
      await page.getByTestId('invite-email').fill(invited);
      await page.getByTestId('invite-role-pilot').click();
      await page.getByTestId('invite-submit').click();
      await page.getByTestId('invite-sent').waitFor();
      link = ((await page.getByTestId('invite-link').textContent()) ?? '').trim();
      expect(link).toMatch(/\/invite\/[^/]+$/);
      await expect(page.getByTestId(`invitation-status-${invited}`).textContent()).resolves.toBe('Pending');
      await shootWhole(page, 'wide-team-invitations.png');
      await page.setViewportSize(viewports.phone);
      await page.getByTestId('bottom-tabs').waitFor();
      expect(await horizontalOverflowPx(page)).toBe(0);
      await shootWhole(page, 'phone-team-invitations.png');
      await page.setViewportSize(viewports.wide);
      await page.getByTestId('side-nav').waitFor();

      // The fake SMTP server got the invitation and the sign-off mail with its PDF; Profile links the outbox.
      await page.getByTestId('nav-profile').click();
      await page.getByTestId('profile-outbox').click();
      await page.getByTestId('outbox-list').waitFor();
      await eventually(async () => {
        const subjects = await page.getByTestId('outbox-subject').allTextContents();
        if (subjects.length < 2) await page.getByTestId('outbox-refresh').click();
        return subjects.length >= 2;
      }, 15_000, 'two messages in the outbox');
      await expect(page.locator('[data-testid^="outbox-attachment-"]').count()).resolves.toBeGreaterThan(0);
      await shootWhole(page, 'wide-outbox.png');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);

  it('the invited person signs up from the link at 390 px (signed in at once, nothing typed twice), sees team and role, and joins as a pilot', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.phone);
    try {
      const url = new URL(link);
      await page.goto(`${srv.url}${url.pathname}`);
      await page.getByTestId('invite-signed-out').waitFor();
      await shootWhole(page, 'phone-invite-signed-out.png');
      await page.getByTestId('invite-switch-form').click();
      await page.getByTestId('sign-up-name').fill('Nell Ashby');
      await page.getByTestId('sign-up-email').fill(invited);
      await page.getByTestId('sign-up-password').fill('heather ridge lantern');
      await page.getByTestId('sign-up-submit').click();
      // Signed in with what was just typed: the address and password are not asked for a second time.
      await page.getByTestId('invite-offer').waitFor();
      await expect(page.getByTestId('sign-in-email').count()).resolves.toBe(0);
      await expect(page.getByTestId('invite-signed-in-as').textContent()).resolves.toBe(`Signed in as ${invited}.`);
      await expect(page.getByTestId('invite-role-offered').textContent()).resolves.toBe('Pilot');
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
      await shootWhole(page, 'phone-invite-offer.png');
      await page.getByTestId('invite-accept').click();
      await page.waitForURL((u) => u.pathname === '/flights');
      await expect(page.getByTestId(`flight-state-${version.versionId}`).textContent()).resolves.toBe('Signed off');
      await page.getByTestId(`flight-${version.versionId}`).waitFor();
      await expect(page.getByTestId('current-team-role').textContent()).resolves.toBe('Pilot');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);
});

/**
 * The work lists in Chromium against the real web build and API: the demo surveyor lands on Work and finds the
 * version a planner sent, marked "In review", and opens it; the demo planner finds a returned version with the
 * surveyor's comment, marked "Returned"; the project's plan list names the review state; the demo pilot's Flights
 * list marks every row "Signed off". Screenshots at 390x844 and 1440x900 go to .artifacts/screenshots/work/.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoUsers } from '../../contracts/demo-team';
import type { Role } from '../../contracts/roles';
import { demoPassword } from '../../server/seed/demo-password';
import { growToContent, launchBrowser, openPage, screenshotDir, viewports, signInWith } from '../support/browser';
import { demoClients, demoTeamVersions } from '../support/demo';
import type { VersionFixture } from '../support/fixtures';
import type { ApiClient } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

const shotDir = path.join(screenshotDir, 'work');
const skipWeb = process.env.LOFTLINE_SKIP_WEB === '1';
const tag = Date.now().toString(36);
const sentName = `Work list north bench ${tag}`;
const returnedName = `Work list haul road ${tag}`;
const comment = `Lower the first line over the haul road (${tag}).`;

let srv: TestServer;
let browser: Browser;
let clients: Record<Role, ApiClient>;
let sent: VersionFixture;
let returned: VersionFixture;
let unsent: VersionFixture;

beforeAll(async () => {
  if (!process.env.LOFTLINE_WEB_DIST && !skipWeb) throw new Error('LOFTLINE_WEB_DIST is not set: run the browser tests through `npm test`.');
  fs.mkdirSync(shotDir, { recursive: true });
  srv = await startTestServer();
  browser = await launchBrowser();
  clients = await demoClients(srv);
  [sent, returned, unsent] = await demoTeamVersions(srv, [
    { reviewState: 'draft', planName: sentName },
    { reviewState: 'draft', planName: returnedName },
    { reviewState: 'draft', planName: `Work list unsent draft ${tag}` },
  ]);
  // The product's own transitions, so the lists can say who sent and who returned.
  expect((await clients.planner.post(`${sent.path}/submit`, {})).status).toBe(200);
  expect((await clients.planner.post(`${returned.path}/submit`, {})).status).toBe(200);
  expect((await clients.surveyor.post(`${returned.path}/return`, { comment })).status).toBe(200);
}, 60_000);

afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

const demo = (role: Role) => demoUsers.find((u) => u.role === role)!;

async function signIn(page: Page, role: Role): Promise<void> {
  await signInWith(page, srv.url, demo(role).email, demoPassword);
}

async function shootWhole(page: Page, name: string): Promise<void> {
  const restore = await growToContent(page);
  await page.screenshot({ path: path.join(shotDir, name) });
  await restore();
}

describe.skipIf(skipWeb)('each role\'s home lists what waits for it', () => {
  for (const [size, viewport] of Object.entries(viewports)) {
    it(`the demo surveyor lands on Work at ${viewport.width} px, finds the sent version "In review" and opens it`, async () => {
      const { context, page, pageErrors } = await openPage(browser, viewport);
      try {
        await signIn(page, 'surveyor');
        await page.waitForURL((u) => u.pathname === '/work');
        const row = page.getByTestId(`work-review-${sent.versionId}`);
        await row.waitFor();
        expect(await row.textContent()).toContain(`${sentName} · version 1`);
        expect(await row.textContent()).toContain('Sent for review by Tomas');
        await expect(page.getByTestId(`work-state-${sent.versionId}`).textContent()).resolves.toBe('In review');
        // A returned version is the planner's work, not the surveyor's.
        await expect(page.getByTestId(`work-returned-${returned.versionId}`).count()).resolves.toBe(0);
        await expect(page.getByTestId('nav-work').getAttribute('aria-current')).resolves.toBe('page');
        expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBe(0);
        await shootWhole(page, `${size}-surveyor-work.png`);
        await row.click();
        await page.waitForURL((u) => u.pathname === `/projects/${sent.projectId}/plans/${sent.planId}/versions/${sent.versionId}`);
        await page.getByTestId('version-screen').waitFor();
        await expect(page.getByTestId('review-state').first().textContent()).resolves.toBe('In review');
        expect(pageErrors).toEqual([]);
      } finally {
        await context.close();
      }
    }, 90_000);
  }

  it('the demo planner at 390 px finds the returned version with the surveyor\'s comment, and the plan list names the state', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.phone);
    try {
      await signIn(page, 'planner');
      await page.waitForURL((u) => u.pathname === '/work');
      const row = page.getByTestId(`work-returned-${returned.versionId}`);
      await row.waitFor();
      await expect(page.getByTestId(`work-state-${returned.versionId}`).textContent()).resolves.toBe('Returned');
      await expect(page.getByTestId(`work-comment-${returned.versionId}`).textContent()).resolves.toBe(`“${comment}”`);
      expect(await row.textContent()).toContain('Returned by Rhea');
      // An analysed draft waits to be sent.
      await page.getByTestId(`work-send-${unsent.versionId}`).waitFor();
      await expect(page.getByTestId(`work-state-${unsent.versionId}`).textContent()).resolves.toBe('Draft');
      await shootWhole(page, 'phone-planner-work.png');

      await page.goto(`${srv.url}/projects/${returned.projectId}`);
      await expect(page.getByTestId(`plan-review-${returnedName}`).textContent()).resolves.toBe('Returned');
      await page.goto(`${srv.url}/projects/${sent.projectId}`);
      await expect(page.getByTestId(`plan-review-${sentName}`).textContent()).resolves.toBe('In review');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);

  it('the demo owner at 1440 px sees every list, the flights among them with the cautions', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.wide);
    try {
      await signIn(page, 'owner');
      await page.waitForURL((u) => u.pathname === '/work');
      for (const kind of ['review', 'returned', 'send', 'flight']) await page.getByTestId(`work-${kind}`).waitFor();
      await page.getByTestId(`work-review-${sent.versionId}`).waitFor();
      await page.getByTestId(`work-returned-${returned.versionId}`).waitFor();
      await expect(page.locator('[data-testid^="work-flight-"] [data-testid^="work-state-"]').first().textContent()).resolves.toBe('Signed off');
      await page.getByTestId('flight-cautions').waitFor();
      await expect(page.getByTestId('flight-cautions').textContent()).resolves.toContain('Local regulations and licensed practice govern every flight');
      await shootWhole(page, 'wide-owner-work.png');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);

  it('the demo pilot\'s home, Flights, marks every row "Signed off"', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.phone);
    try {
      await signIn(page, 'pilot');
      await page.waitForURL((u) => u.pathname === '/flights');
      await page.getByTestId('flights-list').waitFor();
      const states = await page.locator('[data-testid^="flight-state-"]').allTextContents();
      expect(states.length).toBeGreaterThan(0);
      expect(new Set(states)).toEqual(new Set(['Signed off']));
      await expect(page.getByTestId('nav-work').count()).resolves.toBe(0);
      await shootWhole(page, 'phone-pilot-flights.png');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);
});

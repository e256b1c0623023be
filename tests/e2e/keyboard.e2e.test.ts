/**
 * Each role's main path with the keyboard alone (Tab, Enter, Space; no clicks) in Chromium at 1440x900, asserting
 * where focus lands after every change of screen: on the new screen's main heading, never on the page body. A
 * refused sign-in keeps focus on the password field, marks it invalid and ties the reason to it.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoUsers } from '../../contracts/demo-team';
import type { Role } from '../../contracts/roles';
import { demoPassword } from '../../server/seed/demo-password';
import { launchBrowser, openPage, viewports } from '../support/browser';
import { demoTeamVersions } from '../support/demo';
import type { VersionFixture } from '../support/fixtures';
import { uniqueEmail } from '../support/http-client';
import { startTestServer, type TestServer } from '../support/test-server';

const skipWeb = process.env.LOFTLINE_SKIP_WEB === '1';
let srv: TestServer;
let browser: Browser;
let inReview: VersionFixture;
let signedOff: VersionFixture;

beforeAll(async () => {
  if (skipWeb) return;
  srv = await startTestServer();
  browser = await launchBrowser();
  [inReview, signedOff] = await demoTeamVersions(srv, [
    { reviewState: 'in_review', planName: 'Keys: west bench in review' },
    { reviewState: 'signed_off', planName: 'Keys: east bench signed off' },
  ]);
});
afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

/** What has focus: its test id, role, level, text and invalid/described state (or "body"). */
async function focused(page: Page) {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return { where: 'body' as const };
    const describedBy = (el.getAttribute('aria-describedby') ?? '').split(/\s+/).filter(Boolean);
    return {
      where: 'element' as const,
      testId: el.getAttribute('data-testid'),
      role: el.getAttribute('role'),
      level: el.getAttribute('aria-level'),
      text: (el.textContent ?? '').trim(),
      invalid: el.getAttribute('aria-invalid'),
      checked: el.getAttribute('aria-checked'),
      description: describedBy.map((id) => document.getElementById(id)?.textContent ?? '').join(' '),
    };
  });
}

/** Press Tab until the element with `testId` has focus; fails after `max` presses (it is not reachable). */
async function tabTo(page: Page, testId: string, max = 80): Promise<void> {
  for (let i = 0; i < max; i++) {
    await page.keyboard.press('Tab');
    if ((await page.evaluate(() => document.activeElement?.getAttribute('data-testid'))) === testId) return;
  }
  throw new Error(`${testId} was not reached with ${max} presses of Tab`);
}

/** Focus is on the screen's main heading, whose words include `text`. */
async function expectFocusOnHeading(page: Page, text: string | RegExp): Promise<void> {
  await expect
    .poll(async () => {
      const f = await focused(page);
      return f.where === 'element' && f.role === 'heading' && f.level === '1' ? f.text : `not the main heading: ${JSON.stringify(f)}`;
    }, { timeout: 15_000 })
    .toMatch(text);
}

async function signInByKeys(page: Page, role: Role, password = demoPassword): Promise<void> {
  await page.goto(`${srv.url}/sign-in`);
  await page.getByTestId('sign-in-email').waitFor();
  await tabTo(page, 'sign-in-email');
  await page.keyboard.type(demoUsers.find((u) => u.role === role)!.email);
  await page.keyboard.press('Tab');
  await page.keyboard.type(password);
  await page.keyboard.press('Enter');
}

describe.skipIf(skipWeb)('keyboard-only paths', () => {
  it('a refused sign-in keeps focus on the password, marked invalid, with the reason tied to it', async () => {
    const { context, page } = await openPage(browser, viewports.wide);
    try {
      await signInByKeys(page, 'planner', 'not the password');
      await page.getByTestId('sign-in-failure').waitFor();
      await expect.poll(async () => (await focused(page)).where === 'element' && (await focused(page) as { testId: string | null }).testId).toBe('sign-in-password');
      const f = await focused(page);
      expect(f).toMatchObject({ testId: 'sign-in-password', invalid: 'true' });
      expect((f as { description: string }).description).toMatch(/check the e-mail and password/i);
      await expect(page.title()).resolves.toBe('Sign in · Loftline');
    } finally {
      await context.close();
    }
  }, 60_000);

  it('planner: signs in, opens a project and a plan, focus on each main heading', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.wide);
    try {
      await signInByKeys(page, 'planner');
      // A planner's home is the work list; Projects is one Tab stop away in the navigation.
      await expectFocusOnHeading(page, /^Work$/);
      await tabTo(page, 'nav-projects');
      await page.keyboard.press('Enter');
      await expectFocusOnHeading(page, /^Projects$/);
      await tabTo(page, `project-link-Hollin Fell quarry survey`);
      // Two fixture projects share the name; the one focused first is whichever sorts first: follow it.
      await page.keyboard.press('Enter');
      await expectFocusOnHeading(page, /Hollin Fell quarry survey/);
      await page.locator('[data-testid^="plan-link-"]').first().waitFor();
      const planTestId = await page.evaluate(() => document.querySelector('[data-testid^="plan-link-"]')?.getAttribute('data-testid'));
      expect(planTestId).toBeTruthy();
      await tabTo(page, planTestId!);
      await page.keyboard.press('Enter');
      await expectFocusOnHeading(page, /bench/);
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);

  it('surveyor: opens the report of a version in review, reaches Sign off, and lands in the note field', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.wide);
    try {
      await signInByKeys(page, 'surveyor');
      // The home is the work list: the version in review is reached with Tab and opened with Enter.
      await expectFocusOnHeading(page, /^Work$/);
      await tabTo(page, `work-review-${inReview.versionId}`, 150);
      await page.keyboard.press('Enter');
      await page.waitForURL((u) => u.pathname === `/projects/${inReview.projectId}/plans/${inReview.planId}/versions/${inReview.versionId}`);
      // The project's plan list says which plan waits for review, without opening it.
      await page.goto(`${srv.url}/projects/${inReview.projectId}`);
      await expect.poll(() => page.getByTestId('plan-review-Keys: west bench in review').textContent()).toBe('In review');
      await page.goto(`${srv.url}/projects/${inReview.projectId}/plans/${inReview.planId}/versions/${inReview.versionId}/report`);
      await expectFocusOnHeading(page, /.+/);
      await expect.poll(() => page.title()).toMatch(/^Compliance report — Keys: west bench in review v1 · Loftline$/);
      await tabTo(page, 'review-sign-off', 150);
      await page.keyboard.press('Enter');
      await expect.poll(async () => ((await focused(page)) as { testId?: string | null }).testId).toBe('review-comment');
      await page.keyboard.type('Checked by keyboard.');
      await tabTo(page, 'review-cancel');
      await page.keyboard.press('Enter');
      await page.getByTestId('review-sign-off').waitFor();
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);

  it('pilot: signs in to the flights, opens a leg sheet, ticks a check with Space', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.wide);
    try {
      await signInByKeys(page, 'pilot');
      await expectFocusOnHeading(page, /flights/i);
      await tabTo(page, `flight-${signedOff.versionId}`);
      await page.keyboard.press('Enter');
      await expectFocusOnHeading(page, /^Leg sheet$/);
      await expect.poll(() => page.title()).toMatch(/^Leg sheet — Keys: east bench signed off v1 · Loftline$/);
      await tabTo(page, 'checklist-wind', 200);
      await page.keyboard.press('Space');
      await expect.poll(async () => ((await focused(page)) as { checked?: string | null }).checked).toBe('true');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);

  it('owner: goes to the team screen from the navigation and sends an invitation', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.wide);
    try {
      await signInByKeys(page, 'owner');
      await expectFocusOnHeading(page, /^Work$/);
      await tabTo(page, 'nav-team');
      await page.keyboard.press('Enter');
      await expectFocusOnHeading(page, /^Team$/);
      await tabTo(page, 'invite-email');
      const address = uniqueEmail('keys');
      await page.keyboard.type(address);
      await tabTo(page, 'invite-submit');
      await page.keyboard.press('Enter');
      await page.getByTestId('invite-sent').waitFor();
      await expect(page.getByTestId('invite-sent').textContent()).resolves.toContain(address);
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);
});

/**
 * What an owner and a newcomer trip over, in Chromium against the real web build and API: a role changes only after
 * the owner confirms it (the picker alone changes nothing on the server); pressing Upload with no file chosen says
 * what to do; an emptied endurance field is refused with a message and nothing is saved. Screenshots at 390x844 and
 * 1440x900 go to .artifacts/screenshots/owner-newcomer/.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { emptyEnduranceMessage } from '../../components/plans/plan-form-schema';
import { noFileMessage } from '../../components/sites/site-upload-words';
import { growToContent, launchBrowser, openPage, screenshotDir, viewports, signInWith } from '../support/browser';
import { createVersion, eventually, fixturePassword, freshTeam, type FreshTeam, type VersionFixture } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';

const shotDir = path.join(screenshotDir, 'owner-newcomer');
const skipWeb = process.env.LOFTLINE_SKIP_WEB === '1';

let srv: TestServer;
let browser: Browser;
let team: FreshTeam;
let version: VersionFixture;

beforeAll(async () => {
  if (!process.env.LOFTLINE_WEB_DIST && !skipWeb) throw new Error('LOFTLINE_WEB_DIST is not set: run the browser tests through `npm test`.');
  fs.mkdirSync(shotDir, { recursive: true });
  srv = await startTestServer();
  browser = await launchBrowser();
  team = await freshTeam(srv, 'owner-newcomer');
  version = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, planName: 'Endurance check plan' });
}, 60_000);

afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

async function signIn(page: Page, email: string): Promise<void> {
  await signInWith(page, srv.url, email, fixturePassword);
}

async function shootWhole(page: Page, name: string): Promise<void> {
  const restore = await growToContent(page);
  await page.screenshot({ path: path.join(shotDir, name) });
  await restore();
}

async function roleOnServer(email: string): Promise<string> {
  const res = await team.clients.owner.get(`/api/teams/${team.teamId}/members`);
  expect(res.status).toBe(200);
  return (res.body.members as { email: string; role: string }[]).find((m) => m.email === email)!.role;
}

describe.skipIf(skipWeb)('owner and newcomer', () => {
  for (const [size, viewport] of Object.entries(viewports)) {
    it(`a role changes only once the owner confirms it (${viewport.width} px)`, async () => {
      const { context, page, pageErrors } = await openPage(browser, viewport);
      const pilot = team.users.pilot.email;
      try {
        await signIn(page, team.users.owner.email);
        await page.goto(`${srv.url}/team`);
        const before = await roleOnServer(pilot);
        const next = before === 'pilot' ? 'surveyor' : 'pilot';
        await page.getByTestId(`member-role-${pilot}-${next}`).click();
        const confirm = page.getByTestId(`member-role-confirm-${pilot}`);
        await confirm.waitFor();
        expect(await confirm.textContent()).toContain(`Make ${team.users.pilot.name} ${next} instead of ${before}?`);
        // The question and both answers fit the window (on a phone too): nothing is cut off at the card's edge.
        for (const id of [`member-role-confirm-${pilot}`, `member-role-apply-${pilot}`, `member-role-keep-${pilot}`]) {
          const box = (await page.getByTestId(id).boundingBox())!;
          expect(box.x + box.width, id).toBeLessThanOrEqual(viewport.width);
        }
        await shootWhole(page, `${size}-team-role-confirm.png`);
        // The tap alone changed nothing; "Keep" puts the picker back.
        expect(await roleOnServer(pilot)).toBe(before);
        await page.getByTestId(`member-role-keep-${pilot}`).click();
        await expect(confirm.count()).resolves.toBe(0);
        await expect.poll(() => page.getByTestId(`member-role-${pilot}-${before}`).getAttribute('aria-checked')).toBe('true');
        expect(await roleOnServer(pilot)).toBe(before);

        await page.getByTestId(`member-role-${pilot}-${next}`).click();
        await page.getByTestId(`member-role-apply-${pilot}`).click();
        await eventually(async () => (await roleOnServer(pilot)) === next, 10_000, `the role to become ${next}`);
        await expect.poll(() => page.getByTestId(`member-role-${pilot}-${next}`).getAttribute('aria-checked')).toBe('true');
        expect(pageErrors).toEqual([]);
      } finally {
        await context.close();
      }
    }, 90_000);
  }

  it('Upload with no file chosen says to choose one, and uploads nothing (390 px)', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.phone);
    try {
      await signIn(page, team.users.planner.email);
      await page.goto(`${srv.url}/projects/${version.projectId}/sites/new`);
      await page.getByTestId('site-upload-submit').click();
      await expect(page.getByTestId('site-file-error').textContent()).resolves.toBe(noFileMessage);
      await shootWhole(page, 'phone-upload-no-file.png');
      const sites = await team.clients.planner.get(`/api/teams/${team.teamId}/projects/${version.projectId}/sites`);
      expect(sites.status).toBe(200);
      expect((sites.body.sites ?? sites.body).length).toBe(1); // the fixture's grid only
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);

  it('an emptied endurance field is refused with a message and the saved plan keeps its endurance (1440 px)', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.wide);
    try {
      const path0 = `/api/teams/${team.teamId}/plans/${version.planId}`;
      const saved = (await team.clients.planner.get(path0)).body;
      const enduranceBefore = saved.input.enduranceMin;
      await signIn(page, team.users.planner.email);
      await page.goto(`${srv.url}/projects/${version.projectId}/plans/${version.planId}`);
      const field = page.getByTestId('plan-endurance');
      await field.waitFor();
      await field.fill('');
      await page.getByTestId('plan-save').click();
      await expect(page.getByTestId('plan-endurance-error').textContent()).resolves.toBe(emptyEnduranceMessage);
      await page.getByTestId('plan-endurance').scrollIntoViewIfNeeded();
      await page.screenshot({ path: path.join(shotDir, 'wide-plan-endurance-empty.png') });
      const after = (await team.clients.planner.get(path0)).body;
      expect(after.input.enduranceMin).toBe(enduranceBefore);
      expect(after.updatedAt).toBe(saved.updatedAt);
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 90_000);
});

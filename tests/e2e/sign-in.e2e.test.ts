/**
 * Each demo role signs in through the real web build served by a real server, on a phone-sized and a desktop-sized
 * window, and sees exactly the navigation its role allows. Screenshots go to .artifacts/screenshots/sign-in/.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../contracts/roles';
import { demoTeam, demoUsers } from '../../contracts/demo-team';
import { demoPassword } from '../../server/seed/demo-password';
import { launchBrowser, screenshotDir, viewports, openPage, signInWith } from '../support/browser';
import { startTestServer, type TestServer } from '../support/test-server';

const navIds = ['nav-work', 'nav-projects', 'nav-flights', 'nav-team', 'nav-profile'] as const;
type NavId = (typeof navIds)[number];

/**
 * What each role must see, written out by hand from the role table in the shared domain notes (owner, planner and
 * surveyor read projects and members; a pilot reads only signed-off plans), not derived from the app's own code.
 */
const expected: Record<Role, { nav: NavId[]; home: string; roleLabel: string }> = {
  owner: { nav: ['nav-work', 'nav-projects', 'nav-flights', 'nav-team', 'nav-profile'], home: '/work', roleLabel: 'Owner' },
  planner: { nav: ['nav-work', 'nav-projects', 'nav-flights', 'nav-team', 'nav-profile'], home: '/work', roleLabel: 'Planner' },
  surveyor: { nav: ['nav-work', 'nav-projects', 'nav-flights', 'nav-team', 'nav-profile'], home: '/work', roleLabel: 'Surveyor' },
  pilot: { nav: ['nav-flights', 'nav-profile'], home: '/flights', roleLabel: 'Pilot' },
};

const hrefOf: Record<NavId, string> = {
  'nav-work': '/work',
  'nav-projects': '/projects',
  'nav-flights': '/flights',
  'nav-team': '/team',
  'nav-profile': '/profile',
};

const shotDir = path.join(screenshotDir, 'sign-in');
const skipWeb = process.env.LOFTLINE_SKIP_WEB === '1';

let srv: TestServer;
let browser: Browser;

beforeAll(async () => {
  if (!process.env.LOFTLINE_WEB_DIST) throw new Error('LOFTLINE_WEB_DIST is not set: run the browser tests through `npm test`.');
  fs.mkdirSync(shotDir, { recursive: true });
  srv = await startTestServer();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

async function visibleNavIds(page: Page): Promise<string[]> {
  const found: string[] = [];
  for (const id of navIds) if (await page.getByTestId(id).isVisible()) found.push(id);
  return found;
}

describe.skipIf(skipWeb).each(Object.entries(viewports))('signing in on a %s window', (viewportName, viewport) => {
  const wide = viewport.width >= 1024;

  it('shows the sign-in form first to a visitor without a session', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewport);
    try {
      await page.goto(`${srv.url}/projects`);
      await page.getByTestId('sign-in-email').waitFor();
      expect(new URL(page.url()).pathname).toBe('/sign-in');
      await expect(page.getByTestId('sign-in-password').isVisible()).resolves.toBe(true);
      await expect(page.getByTestId('sign-in-submit').isVisible()).resolves.toBe(true);
      await page.screenshot({ path: path.join(shotDir, `${viewportName}-sign-in.png`) });
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });

  it('refuses a wrong password with the server message and stays signed out', async () => {
    const { context, page } = await openPage(browser, viewport);
    try {
      await page.goto(`${srv.url}/sign-in`);
      await page.getByTestId('sign-in-email').fill(demoUsers[0]!.email);
      await page.getByTestId('sign-in-password').fill('not-the-demo-password');
      await page.getByTestId('sign-in-submit').click();
      const failure = page.getByTestId('sign-in-failure');
      await failure.waitFor();
      expect((await failure.textContent())?.trim().length).toBeGreaterThan(0);
      expect(new URL(page.url()).pathname).toBe('/sign-in');
      await expect(page.getByTestId('nav-profile').count()).resolves.toBe(0);
    } finally {
      await context.close();
    }
  });

  for (const user of demoUsers) {
    const want = expected[user.role];
    const absent = navIds.filter((id) => !want.nav.includes(id));

    it(`lets the demo ${user.role} in, landing on ${want.home} with only ${want.nav.join(', ')}`, async () => {
      const { context, page, pageErrors } = await openPage(browser, viewport);
      try {
        await signInWith(page, srv.url, user.email, demoPassword);
        await page.waitForURL((u) => u.pathname === want.home);

        // The layout for the window size: a side column from 1024 px, a bottom tab bar below that.
        await expect(page.getByTestId(wide ? 'side-nav' : 'bottom-tabs').isVisible()).resolves.toBe(true);
        await expect(page.getByTestId(wide ? 'bottom-tabs' : 'side-nav').count()).resolves.toBe(0);

        expect(await visibleNavIds(page)).toEqual(want.nav);
        for (const id of absent) await expect(page.getByTestId(id).count()).resolves.toBe(0);

        // The navigation names the current team and the user's role in it.
        await expect(page.getByTestId('current-team-name').textContent()).resolves.toBe(demoTeam.name);
        await expect(page.getByTestId('current-team-role').textContent()).resolves.toBe(want.roleLabel);
        await page.screenshot({ path: path.join(shotDir, `${viewportName}-${user.role}-home.png`) });

        // Every item it shows leads to its screen.
        for (const id of want.nav) {
          await page.getByTestId(id).click();
          await page.waitForURL((u) => u.pathname === hrefOf[id]);
          await expect(page.getByTestId(id).getAttribute('aria-current')).resolves.toBe('page');
        }
        expect(pageErrors).toEqual([]);
      } finally {
        await context.close();
      }
    });
  }
});

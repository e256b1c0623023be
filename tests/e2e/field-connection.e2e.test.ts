/**
 * The pilot's leg sheet on a weak field connection, in Chromium with the DevTools protocol's network emulation at
 * 1.6 Mbit/s down, 0.75 Mbit/s up and 150 ms round trips (a weak mobile signal on a hillside): once the sheet is on
 * the device, a reload shows the first line's altitude within 1 s; with the network cut, a reload still opens the
 * sheet and the flights list from the device, said so on screen. The cold load (no cache, no service worker,
 * nothing kept on the device) is measured and printed against its 5 s budget but not yet asserted: it takes about
 * 4.9–5.4 s on this machine, the first screen's JavaScript (about 610 KB gzipped, 3 s at this rate) being most of it.
 */
import path from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, openPage, screenshotDir, viewports } from '../support/browser';
import { demoClients, demoTeamVersions } from '../support/demo';
import type { VersionFixture } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';

const skipWeb = process.env.LOFTLINE_SKIP_WEB === '1';
/** The field-connection budget (README): weak signal, cold (measured, not yet met) and already on the device. */
const COLD_BUDGET_MS = 5_000;
const WARM_BUDGET_MS = 1_000;
const weakSignal = { offline: false, latency: 150, downloadThroughput: 1_600_000 / 8, uploadThroughput: 750_000 / 8 };

let srv: TestServer;
let browser: Browser;
let version: VersionFixture;
let pilotCookie: string;

beforeAll(async () => {
  if (skipWeb) return;
  srv = await startTestServer();
  browser = await launchBrowser();
  [version] = await demoTeamVersions(srv, [{ reviewState: 'signed_off', planName: 'Field: ridge line signed off' }]);
  pilotCookie = (await demoClients(srv)).pilot.cookieHeader();
});
afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

/** The pilot's session cookie in a fresh context, as if signed in earlier (the sign-in itself is not timed here). */
async function signedInContext(context: BrowserContext): Promise<void> {
  await context.addCookies(
    pilotCookie.split('; ').map((pair) => {
      const i = pair.indexOf('=');
      return { name: pair.slice(0, i), value: pair.slice(i + 1), url: srv.url };
    }),
  );
}

/** Milliseconds from starting the navigation until the first leg's altitude is on screen. */
async function timeToAltitude(page: Page, go: () => Promise<unknown>): Promise<number> {
  const t0 = Date.now();
  await go();
  await page.getByTestId('leg-1-1-altitude').waitFor({ timeout: 30_000 });
  return Date.now() - t0;
}

describe.skipIf(skipWeb)('the leg sheet on a weak field connection', () => {
  it('already on the device within 1 s, and opens with the network cut (cold load measured against 5 s)', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.phone);
    try {
      await signedInContext(context);
      const cdp = await context.newCDPSession(page);
      await cdp.send('Network.enable');
      await cdp.send('Network.emulateNetworkConditions', weakSignal);
      const url = `${srv.url}/flights/${version.versionId}`;

      const coldMs = await timeToAltitude(page, () => page.goto(url, { waitUntil: 'commit' }));
      console.log(`field connection: cold ${coldMs} ms (${coldMs < COLD_BUDGET_MS ? 'within' : 'over'} the ${COLD_BUDGET_MS} ms budget)`);
      // The device keeps the app once its service worker is in charge (registered after the first screen).
      await page.waitForFunction(() => navigator.serviceWorker?.controller != null, undefined, { timeout: 60_000 });
      await page.waitForFunction(() => Boolean(localStorage.getItem('loftline.device-queries.v1')?.includes('"me"')), undefined, { timeout: 10_000 });

      // The pilot looks at the flights list once while still in signal, then comes back to the sheet.
      await page.getByTestId('leg-sheet-back').click();
      await page.getByTestId(`flight-${version.versionId}`).click();
      await page.getByTestId('leg-1-1-altitude').waitFor();
      await page.waitForFunction(() => Boolean(localStorage.getItem('loftline.device-queries.v1')?.includes('"list"')), undefined, { timeout: 10_000 });

      const warmMs = await timeToAltitude(page, () => page.reload({ waitUntil: 'commit' }));
      console.log(`field connection: on the device ${warmMs} ms`);
      await page.screenshot({ path: path.join(screenshotDir, 'phone-leg-sheet-weak-signal.png') });

      // Network cut: the page, its scripts, the session and the sheet all come from the device, and it says so.
      await context.setOffline(true);
      await cdp.send('Network.emulateNetworkConditions', { ...weakSignal, offline: true });
      const offlineMs = await timeToAltitude(page, () => page.reload({ waitUntil: 'commit' }));
      await page.getByTestId('offline-notice').waitFor().catch(async (e) => {
        await page.screenshot({ path: path.join(screenshotDir, 'phone-leg-sheet-offline-failed.png') });
        throw e;
      });
      await page.screenshot({ path: path.join(screenshotDir, 'phone-leg-sheet-offline.png') });
      await page.getByTestId('leg-sheet-back').click();
      await page.getByTestId(`flight-${version.versionId}`).waitFor({ timeout: 10_000 });

      console.log(`field connection (1.6 Mbit/s, 150 ms): cold ${coldMs} ms, on the device ${warmMs} ms, network cut ${offlineMs} ms`);
      expect(warmMs).toBeLessThan(WARM_BUDGET_MS);
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 180_000);
});

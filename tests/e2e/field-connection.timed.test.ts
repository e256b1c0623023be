/**
 * The pilot's leg sheet on a weak field connection, in Chromium with the DevTools protocol's network emulation at
 * 1.6 Mbit/s down, 0.75 Mbit/s up and 150 ms round trips (a weak mobile signal on a hillside): with the network cut,
 * a reload still opens the sheet and the flights list from the device, said so on screen. The two time budgets —
 * the first line's altitude within 5 s on a cold load (no cache, no service worker, nothing kept on the device) and
 * within 1 s once the sheet is on the device — are measured and printed but not yet asserted, because neither is
 * met reliably on this 2-core machine: cold 4.9–5.6 s (the first screen's 610 KB of gzipped JavaScript is 3 s of it
 * at this rate), on the device 0.86–1.3 s (about 0.35 s of it drawing the sheet after its data is in). The suite
 * runs in the timed pass, alone after the others (vitest.config.mts).
 */
import path from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, openPage, screenshotDir, viewports } from '../support/browser';
import { demoClients, demoTeamVersions } from '../support/demo';
import type { VersionFixture } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';

const skipWeb = process.env.LOFTLINE_SKIP_WEB === '1';
/** The field-connection budget (README): weak signal, cold and already on the device (both measured, not yet met). */
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
  it('opens with the network cut from the device; cold and on-device load times measured against 5 s and 1 s', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.phone);
    try {
      await signedInContext(context);
      const cdp = await context.newCDPSession(page);
      await cdp.send('Network.enable');
      await cdp.send('Network.emulateNetworkConditions', weakSignal);
      const url = `${srv.url}/flights/${version.versionId}`;

      const coldMs = await timeToAltitude(page, () => page.goto(url, { waitUntil: 'commit' }));
      const coldAltitude = await page.getByTestId('leg-1-1-altitude').textContent();
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
      console.log(`field connection: on the device ${warmMs} ms (${warmMs < WARM_BUDGET_MS ? 'within' : 'over'} the ${WARM_BUDGET_MS} ms budget)`);
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
      const offlineAltitude = await page.getByTestId('leg-1-1-altitude').textContent();
      const offlineNotice = await page.getByTestId('offline-notice').textContent();
      await page.getByTestId('leg-sheet-back').click();
      await page.getByTestId(`flight-${version.versionId}`).waitFor({ timeout: 10_000 });

      console.log(`field connection (1.6 Mbit/s, 150 ms): cold ${coldMs} ms, on the device ${warmMs} ms, network cut ${offlineMs} ms`);
      // The device copy answered with the same figure the server gave, marked as the device's copy.
      expect(offlineAltitude).toBe(coldAltitude);
      expect(offlineNotice).toContain('Offline copy, loaded at');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 180_000);
});

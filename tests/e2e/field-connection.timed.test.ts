/**
 * The pilot's leg sheet on a weak field connection, in Chromium with the DevTools protocol's network emulation at
 * 1.6 Mbit/s down, 0.75 Mbit/s up and 150 ms round trips (a weak mobile signal on a hillside): the first line's
 * altitude is on screen within 5 s on a cold load (no cache, no service worker, nothing kept on the device) and
 * within 1 s once the sheet is on the device (the median of three reloads); with the network cut, a reload still opens the sheet and the flights
 * list from the device, said so on screen. The budgets are the product's (README, "Field connection").
 * What keeps them: the entry script's brotli copy (scripts/lib/precompress.ts), the session check and the sheet
 * named in the shell's preload header (server/http/data-preload.ts), the field screens fetched while the app starts
 * and drawn without a Suspense reveal delay (components/app/screen-groups.ts), and the sheet's first line drawn
 * before the rest (components/app/use-after-first-paint.ts). The suite runs in the timed pass, alone after the
 * others (vitest.config.mts).
 */
import path from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, openPage, screenshotDir, viewports } from '../support/browser';
import { demoClients, demoTeamVersions } from '../support/demo';
import type { VersionFixture } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';

const skipWeb = process.env.LOFTLINE_SKIP_WEB === '1';
/** The field-connection budget (README): weak signal, cold and already on the device. */
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
  it('shows the first altitude within 5 s cold and 1 s from the device on a weak signal, and opens with the network cut', async () => {
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

      // Three reloads, judged by their median: one reload on a shared 2-core machine can be slowed by anything else
      // running, and the pilot's experience is the typical one, not the luckiest or unluckiest.
      const warmRuns: number[] = [];
      for (let i = 0; i < 3; i++) {
        warmRuns.push(await timeToAltitude(page, () => page.reload({ waitUntil: 'commit' })));
        await page.waitForTimeout(500); // let the second pass (the rest of the sheet) finish before the next reload
      }
      const warmMs = [...warmRuns].sort((a, b) => a - b)[1]!;
      console.log(`field connection: on the device ${warmMs} ms, median of ${warmRuns.join(', ')} ms (${warmMs < WARM_BUDGET_MS ? 'within' : 'over'} the ${WARM_BUDGET_MS} ms budget)`);
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
      expect(coldMs, 'cold load on a weak signal').toBeLessThan(COLD_BUDGET_MS);
      expect(warmMs, 'reload with the sheet on the device').toBeLessThan(WARM_BUDGET_MS);
      // The device copy answered with the same figure the server gave, marked as the device's copy.
      expect(offlineAltitude).toBe(coldAltitude);
      expect(offlineNotice).toContain('Offline copy, loaded at');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 180_000);
});

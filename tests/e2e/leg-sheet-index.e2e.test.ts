/**
 * The leg sheet's line index in Chromium against the real web build and API: the demo pilot opens the seeded
 * signed-off flight at 390x844 and 1440x900, finds one entry per line near the top of the sheet (number, legs,
 * photos, start height above takeoff as the API gives it), and a tap on the last entry brings that line's card to
 * the top of the screen; each battery pack says the altitude it flies home at. Screenshots go to
 * .artifacts/screenshots/leg-sheet-index/.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoUsers } from '../../contracts/demo-team';
import type { LegSheet } from '../../contracts/flights';
import { demoPassword } from '../../server/seed/demo-password';
import { launchBrowser, openPage, screenshotDir, viewports, signInWith } from '../support/browser';
import { demoClients, demoTeamId } from '../support/demo';
import { startTestServer, type TestServer } from '../support/test-server';

const shotDir = path.join(screenshotDir, 'leg-sheet-index');
const skipWeb = process.env.LOFTLINE_SKIP_WEB === '1';

let srv: TestServer;
let browser: Browser;
let sheet: LegSheet;

beforeAll(async () => {
  if (!process.env.LOFTLINE_WEB_DIST && !skipWeb) throw new Error('LOFTLINE_WEB_DIST is not set: run the browser tests through `npm test`.');
  fs.mkdirSync(shotDir, { recursive: true });
  srv = await startTestServer();
  browser = await launchBrowser();
  const teamId = await demoTeamId(srv);
  const pilot = (await demoClients(srv)).pilot;
  const flights = (await pilot.get(`/api/teams/${teamId}/flights`)).body.flights as { versionId: string; lineCount: number }[];
  // The seeded signed-off plan; other suites may add flights of their own, so take the one with the most lines.
  const flight = [...flights].sort((a, b) => b.lineCount - a.lineCount)[0];
  expect(flight, 'the seeded demo must hold a signed-off version').toBeDefined();
  sheet = (await pilot.get(`/api/teams/${teamId}/flights/${flight!.versionId}/leg-sheet`)).body as LegSheet;
  expect(sheet.lines.length).toBeGreaterThan(2);
}, 60_000);

afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

async function signIn(page: Page): Promise<void> {
  await signInWith(page, srv.url, demoUsers.find((u) => u.role === 'pilot')!.email, demoPassword);
}

describe.skipIf(skipWeb)('the line index of the leg sheet', () => {
  for (const [size, viewport] of Object.entries(viewports)) {
    it(`lists every line at the top and jumps to the one tapped (${viewport.width} px)`, async () => {
      const { context, page, pageErrors } = await openPage(browser, viewport);
      try {
        await signIn(page);
        await page.goto(`${srv.url}/flights/${sheet.version.id}`);
        const index = page.getByTestId('line-index');
        await index.waitFor();
        await expect(page.locator('[data-testid^="line-index-"]').count()).resolves.toBe(sheet.lines.length);
        // The sketch of lines and takeoff: one drawn line per sheet line, the takeoff marked, a scale bar in words.
        const sketch = page.getByTestId('lines-sketch');
        await expect(sketch.locator('[data-testid^="sketch-line-"]').count()).resolves.toBe(sheet.lines.length);
        await expect(sketch.getByTestId('sketch-takeoff').textContent()).resolves.toBe('Takeoff');
        expect(await sketch.getByTestId('sketch-scale').textContent()).toMatch(/^(1|2|5)0* (m|km)$/);
        expect(await sketch.getByRole('img').getAttribute('aria-label')).toContain(`${sheet.lines.length} flight lines and the takeoff point, north up`);
        await sketch.screenshot({ path: path.join(shotDir, `${size}-lines-sketch.png`) });

        // Each entry: number, legs, photos and the first leg's start altitude with its reference (whole metres).
        for (const line of [sheet.lines[0]!, sheet.lines[sheet.lines.length - 1]!]) {
          const text = (await page.getByTestId(`line-index-${line.number}`).textContent()) ?? '';
          const legs = line.legs.length;
          expect(text).toContain(`Line ${line.number}`);
          expect(text).toContain(`${legs} ${legs === 1 ? 'leg' : 'legs'} · ${line.photoCount.toLocaleString('en-GB')} photos`);
          const start = Math.round(line.legs[0]!.altitudeAboveTakeoffM.start);
          expect(text).toContain(`starts ${start.toLocaleString('en-GB')} m above takeoff`);
        }
        // The index sits at the top: it starts within the first two screens, before line 1's card and the cautions stay above it.
        const indexTop = (await index.boundingBox())!.y;
        expect(indexTop).toBeLessThan(viewport.height * 2);
        expect((await page.getByTestId('flight-cautions').boundingBox())!.y).toBeLessThan(indexTop);
        await page.screenshot({ path: path.join(shotDir, `${size}-leg-sheet-index.png`) });

        const last = sheet.lines[sheet.lines.length - 1]!;
        const card = page.getByTestId(`line-${last.number}`);
        expect((await card.boundingBox())!.y).toBeGreaterThan(viewport.height);
        await page.getByTestId(`line-index-${last.number}`).click();
        await expect
          .poll(async () => (await card.boundingBox())!.y, { timeout: 5_000 })
          .toBeLessThan(viewport.height / 2);
        expect((await card.boundingBox())!.y).toBeGreaterThanOrEqual(-1);
        await page.screenshot({ path: path.join(shotDir, `${size}-leg-sheet-after-jump.png`) });
        // A leg's start and end say their distance along the line in words, never as a bare figure that reads as a height.
        const figures = (await page.getByTestId('leg-1-1-figures').textContent()) ?? '';
        expect(figures).toMatch(/Start, [\d,.]+ m along the line/);
        expect(figures).not.toMatch(/Start \(/);
        // Each battery pack says the altitude above takeoff it flies home at from its last line, as the API's sheet has it (whole metres).
        const battery = page.getByTestId('battery-plan');
        await battery.scrollIntoViewIfNeeded();
        for (const pack of sheet.batteries.packs) {
          expect(pack.homeAboveTakeoffM, `pack ${pack.number} has a home altitude`).toBeDefined();
          const home = (await page.getByTestId(`pack-${pack.number}-home`).textContent()) ?? '';
          expect(home).toContain(`Home from line ${pack.lines[pack.lines.length - 1]} at ${Math.round(pack.homeAboveTakeoffM!).toLocaleString('en-GB')} m above takeoff`);
        }
        await battery.screenshot({ path: path.join(shotDir, `${size}-battery-plan.png`) });
        expect(pageErrors).toEqual([]);
      } finally {
        await context.close();
      }
    }, 90_000);
  }
});

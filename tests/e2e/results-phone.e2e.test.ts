/**
 * The results page on a phone (390x844) and wide (1440x900), in Chromium against the real web build and API, on
 * the seeded demo's analysed version: the page leads with what is wrong and where (a short summary of the failing
 * requirements naming their lines), says each warning once, and a tapped line card brings that line's chart into
 * the viewport. The page's height is measured and written to .artifacts/screenshots/results-phone/height.txt;
 * screenshots go to the same folder.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoUsers } from '../../contracts/demo-team';
import { planResultSchema } from '../../contracts/plan-result';
import { demoPassword } from '../../server/seed/demo-password';
import { growToContent, launchBrowser, openPage, screenshotDir, viewports, signInWith } from '../support/browser';
import { demoClients, seededDemoVersion } from '../support/demo';
import { startTestServer, type TestServer } from '../support/test-server';

const shotDir = path.join(screenshotDir, 'results-phone');
let srv: TestServer;
let browser: Browser;
let pagePath: string;
let apiPath: string;

beforeAll(async () => {
  if (!process.env.LOFTLINE_WEB_DIST) throw new Error('LOFTLINE_WEB_DIST is not set: run the browser tests through `npm test`.');
  fs.mkdirSync(shotDir, { recursive: true });
  srv = await startTestServer();
  browser = await launchBrowser();
  const demo = await seededDemoVersion(srv);
  if (!demo) throw new Error('The seeded demo version is missing: `npm test` seeds it before the suites run.');
  ({ pagePath, apiPath } = demo);
});
afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

async function signInAndOpen(page: Page): Promise<void> {
  await signInWith(page, srv.url, demoUsers.find((u) => u.role === 'surveyor')!.email, demoPassword);
  await page.goto(`${srv.url}${pagePath}`);
  await page.getByTestId('summary-figures').waitFor();
  // the panels below the results load on their own; the height counts once they are in
  await page.getByTestId('review-panel').waitFor().catch(() => undefined);
  await page.waitForTimeout(1500);
}

/** The height of the screen's content: the app scrolls inside its own container, so the tallest scroller counts. */
async function contentHeightPx(page: Page): Promise<number> {
  return page.evaluate(() => {
    let most = document.documentElement.scrollHeight;
    for (const el of Array.from(document.querySelectorAll<HTMLElement>('*'))) {
      const o = getComputedStyle(el).overflowY;
      if ((o === 'auto' || o === 'scroll') && el.scrollHeight > el.clientHeight + 1) most = Math.max(most, el.scrollHeight);
    }
    return most;
  });
}

describe('the results page on a phone', () => {
  it('leads with what is wrong and where, says each warning once, and a tapped line brings its chart into view (phone)', async () => {
    const clients = await demoClients(srv);
    const result = planResultSchema.parse((await clients.surveyor.get(apiPath)).body.result);
    const { page, context, pageErrors } = await openPage(browser, viewports.phone);
    await signInAndOpen(page);
    const heightPx = await contentHeightPx(page);
    fs.writeFileSync(path.join(shotDir, 'height.txt'), `results page content height at 390x844: ${heightPx} px\n`);
    console.log(`results page content height at 390x844: ${heightPx} px`);

    // what is wrong and where, before the figures: the summary sits above the summary figures and names lines
    const wrong = page.getByTestId('results-wrong');
    await wrong.waitFor();
    const wrongBox = (await wrong.boundingBox())!;
    const figuresBox = (await page.getByTestId('summary-figures').boundingBox())!;
    expect(wrongBox.y).toBeLessThan(figuresBox.y);
    const flaggedLines = result.lines.filter((l) => l.stations.some((s) => s.flags.length > 0)).map((l) => l.index + 1);
    const wrongText = (await wrong.textContent()) ?? '';
    if (flaggedLines.length > 0) expect(wrongText).toContain(`line${flaggedLines.length === 1 ? '' : 's'} ${flaggedLines[0]}`);
    expect(wrongText).toMatch(/photo/);

    // each warning once on the page: a plan-wide warning in the summary; a line's own in full only with that line's
    // chart (at most once), and its kind named in the summary with that line
    const bodyText = await page.evaluate(() => document.body.innerText);
    const lineMessages = new Map(result.lines.flatMap((l) => [...l.warnings.map((w) => w.message), ...l.unmet.map((u) => u.message)].map((m) => [m, l.index + 1] as const)));
    for (const w of result.warnings.filter((x) => !['bare-earth', 'local-rules', 'wind', 'band-not-held', 'stations-flagged'].includes(x.code))) {
      const probe = w.message.slice(0, 60);
      const times = bodyText.split(probe).length - 1;
      if (lineMessages.has(w.message)) {
        expect(times, `"${probe}…" appears ${times} times`).toBeLessThanOrEqual(1);
        expect(wrongText).toMatch(new RegExp(`lines? [^.]*\\b${lineMessages.get(w.message)}\\b`));
      } else {
        expect(times, `"${probe}…" appears ${times} times`).toBe(1);
      }
    }
    // line cards count their notes instead of repeating them
    const shortLegLine = result.lines.find((l) => l.warnings.length > 0);
    if (shortLegLine) await expect(page.getByTestId(`line-notes-${shortLegLine.index + 1}`).textContent()).resolves.toMatch(/note/);

    // tap the last line's card (far below the first chart): its chart comes into the viewport
    const last = result.lines[result.lines.length - 1].index + 1;
    const card = page.getByTestId(`line-row-${last}`);
    await card.scrollIntoViewIfNeeded();
    await card.tap().catch(() => card.click());
    const chart = page.getByTestId('results-chart');
    await expect.poll(async () => (await chart.getByRole('heading').first().textContent()) ?? '').toContain(`Line ${last}:`);
    await expect
      .poll(async () => {
        const b = await page.getByTestId('profile-chart-canvas').or(page.getByTestId('profile-chart-placeholder')).first().boundingBox();
        return b ? b.y >= 0 && b.y + b.height <= viewports.phone.height : false;
      }, { timeout: 5000 })
      .toBe(true);
    await page.screenshot({ path: path.join(shotDir, 'tapped-line-phone.png') });
    // the chart draws the height limit and names its reference in the legend
    await expect(page.getByTestId('profile-legend-limit').textContent()).resolves.toBe('Height limit: 120 m above ground (long dashes)');

    const restore = await growToContent(page);
    await page.screenshot({ path: path.join(shotDir, 'results-phone.png'), fullPage: true });
    await restore();
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 120_000);

  it('shows the same summary of what is wrong at the top on a wide screen (wide)', async () => {
    const { page, context, pageErrors } = await openPage(browser, viewports.wide);
    await signInAndOpen(page);
    const heightPx = await contentHeightPx(page);
    fs.appendFileSync(path.join(shotDir, 'height.txt'), `results page content height at 1440x900: ${heightPx} px\n`);
    await page.getByTestId('results-wrong').waitFor();
    await page.screenshot({ path: path.join(shotDir, 'results-wide.png') });
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 120_000);
});

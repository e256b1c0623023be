/**
 * The planner's whole path in Chromium, on a phone-sized and a desktop-sized window: the demo planner creates a
 * project, uploads the synthetic demo DEM (datasets/README.md) with a visible progress bar, reads the site's
 * metadata, draws a survey area by clicking on the hillshade, runs the analysis and sees the chart and the table.
 * A surveyor then reads the same results without any edit control. Screenshots go to .artifacts/screenshots/planner/.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, Locator, Page } from 'playwright-core';
import { PNG } from 'pngjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoUsers } from '../../contracts/demo-team';
import { demoPassword } from '../../server/seed/demo-password';
import { seriesLooks } from '../../components/charts/chart-palette';
import { launchBrowser, screenshotDir, viewports, openPage, signInWith } from '../support/browser';
import { startTestServer, type TestServer } from '../support/test-server';

const shotDir = path.join(screenshotDir, 'planner');
const skipWeb = process.env.LOFTLINE_SKIP_WEB === '1';
const demoDem = path.resolve('datasets/harrow-fell-dem.tif');
const notATiff = path.resolve('tests/fixtures/dem/not-a-tiff.tif');
const planner = demoUsers.find((u) => u.role === 'planner')!;
const surveyor = demoUsers.find((u) => u.role === 'surveyor')!;

let srv: TestServer;
let browser: Browser;
/** The results page each viewport's run ended on, for the surveyor's visit. */
const resultUrls: string[] = [];

beforeAll(async () => {
  if (!skipWeb && !process.env.LOFTLINE_WEB_DIST) throw new Error('LOFTLINE_WEB_DIST is not set: run the browser tests through `npm test`.');
  fs.mkdirSync(shotDir, { recursive: true });
  // This suite needs its runs analysed, so its server works the queue (test servers only queue by default).
  srv = await startTestServer({ env: { WORKERS: '1' } });
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

async function signIn(page: Page, email: string): Promise<void> {
  await signInWith(page, srv.url, email, demoPassword);
}

/**
 * The screens scroll inside their own scroll view, so a full-page picture is taken by growing the window to the
 * screen's content height for a moment (the width, and so the layout breakpoint, stays the same).
 */
async function shot(page: Page, viewport: { width: number; height: number }, name: string): Promise<void> {
  const h = await page.evaluate(() =>
    Math.max(window.innerHeight, ...Array.from(document.querySelectorAll('[data-testid$="-screen"]')).map((e) => (e as HTMLElement).scrollHeight)),
  );
  await page.setViewportSize({ width: viewport.width, height: Math.min(h + 120, 7000) });
  await page.waitForTimeout(300);
  await page.screenshot({ path: path.join(shotDir, name) });
  await page.setViewportSize(viewport);
}

/** Click at a fraction of an element's box (re-measured each time: the page may have moved). */
async function clickAt(target: Locator, fx: number, fy: number): Promise<void> {
  await target.scrollIntoViewIfNeeded();
  const box = await target.boundingBox();
  if (!box) throw new Error('the map is not on screen');
  await target.page().mouse.click(box.x + box.width * fx, box.y + box.height * fy);
}

/** Pixels of an element's screenshot within `tol` of an RGB colour given as #RRGGBB. */
async function pixelsNear(el: Locator, hex: string, tol = 40): Promise<number> {
  const png = PNG.sync.read(await el.screenshot());
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));
  let n = 0;
  for (let i = 0; i < png.data.length; i += 4) {
    if (Math.abs(png.data[i] - r) + Math.abs(png.data[i + 1] - g) + Math.abs(png.data[i + 2] - b) < tol) n++;
  }
  return n;
}

describe.skipIf(skipWeb).each(Object.entries(viewports))('the planner workflow on a %s window', (name, viewport) => {
  const wide = viewport.width >= 1024;

  it('creates a project, uploads the demo DEM, draws an area, runs the analysis and sees the chart and the table', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewport);
    try {
      await signIn(page, planner.email);
      // Home is the work list; the projects are one tap away.
      await page.getByTestId('work-screen').waitFor();
      await page.getByTestId('nav-projects').click();
      await page.getByTestId('projects-screen').waitFor();

      // 1. A new project, found again by searching for its client.
      const projectName = `Upper Tarn ${name} ${Date.now().toString(36)}`;
      await page.getByTestId('new-project').click();
      await page.getByTestId('project-form-name').fill(projectName);
      await page.getByTestId('project-form-client').fill(`Tarnside Stone ${name}`);
      await page.getByTestId('project-form-submit').click();
      await page.getByTestId(`project-link-${projectName}`).waitFor();
      await page.getByTestId('projects-search').fill(`Tarnside Stone ${name}`);
      await page.waitForFunction(() => document.querySelectorAll('[data-testid^="project-link-"]').length === 1);
      await shot(page, viewport, `${name}-01-projects.png`);
      await page.getByTestId(`project-link-${projectName}`).click();
      await page.getByTestId('project-screen').waitFor();

      // 2. A file that is no GeoTIFF is refused with the engine's reason, shown as the server gave it.
      await page.getByTestId('site-upload-open').click();
      await page.getByTestId('site-upload-screen').waitFor();
      await page.getByTestId('site-file-input').setInputFiles(notATiff);
      await page.getByTestId('site-surface-bare-earth').click();
      await page.getByTestId('site-upload-submit').click();
      const refused = page.getByTestId('site-upload-refused');
      await refused.waitFor();
      expect(await refused.textContent()).toMatch(/TIFF/i);
      await shot(page, viewport, `${name}-02-upload-refused.png`);

      // 3. The demo DEM, with upload throttled (Chromium's network emulation) so the progress bar can be seen moving.
      const cdp = await context.newCDPSession(page);
      await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: 400 * 1024 });
      await page.getByTestId('site-file-input').setInputFiles(demoDem);
      await expect(page.getByTestId('site-file-name').textContent()).resolves.toContain('harrow-fell-dem.tif');
      await page.getByTestId('site-upload-submit').click();
      const percent = page.getByTestId('site-upload-progress-percent');
      await percent.waitFor();
      await page.waitForFunction(() => {
        const t = document.querySelector('[data-testid="site-upload-progress-percent"]')?.textContent ?? '';
        const v = parseInt(t, 10);
        return v > 0 && v < 100;
      });
      await shot(page, viewport, `${name}-03-upload-progress.png`);
      await page.getByTestId('site-screen').waitFor({ timeout: 60_000 });
      await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });

      // 4. The site page: metadata read from the file (values from datasets/README.md) and the hillshade.
      await page.getByTestId('site-metadata').waitFor();
      await expect(page.getByTestId('site-fact-crs').textContent()).resolves.toContain('EPSG:32631');
      await expect(page.getByTestId('site-fact-size').textContent()).resolves.toContain('1,100 × 900');
      await expect(page.getByTestId('site-fact-resolution').textContent()).resolves.toContain('2.000 × 2.000 m');
      await expect(page.getByTestId('site-fact-datum').textContent()).resolves.toContain('EGM96');
      await expect(page.getByTestId('site-fact-surface').textContent()).resolves.toContain('Bare earth');
      await page.waitForFunction(() => {
        const img = document.querySelector('[data-testid="site-hillshade-svg"] image') as SVGImageElement | null;
        return img !== null && img.getBBox().width > 0;
      });
      await page.waitForTimeout(500);
      await shot(page, viewport, `${name}-04-site.png`);

      // 5. A plan over it: live flat-ground figures, then an area drawn by clicking on the hillshade.
      await page.getByTestId('site-new-plan').click();
      await page.getByTestId('new-plan-screen').waitFor();
      const map = page.getByTestId('area-map-svg');
      await map.waitFor();
      await expect(page.getByTestId('flight-cautions').isVisible()).resolves.toBe(true);
      // 1-inch 20 MP 8.8 mm preset at 3 cm: H = 3 cm x 8.8 mm / (13.2 mm / 5472 px) = 109.4 m (GSD = H p / f).
      await expect(page.getByTestId('derived-height').textContent()).resolves.toBe('109.4 m');

      // An outline that crosses itself is refused and stays open.
      for (const [fx, fy] of [[0.4, 0.4], [0.6, 0.6], [0.6, 0.4], [0.4, 0.6]]) await clickAt(map, fx, fy);
      await page.getByTestId('area-close').click();
      await expect(page.getByTestId('area-problem').textContent()).resolves.toMatch(/crosses itself/);
      await page.getByTestId('area-clear').click();

      // A quadrilateral over the ridge north of the quarry, then the takeoff point south-west of it.
      for (const [fx, fy] of [[0.36, 0.34], [0.62, 0.32], [0.66, 0.62], [0.4, 0.66], [0.3, 0.5]]) await clickAt(map, fx, fy);
      await page.getByTestId('area-undo').click(); // the fifth corner was a slip
      await page.getByTestId('area-close').click();
      await expect(page.getByTestId('area-status').textContent()).resolves.toContain('4 corners, area closed');
      await clickAt(map, 0.3, 0.74);
      await expect(page.getByTestId('area-status').textContent()).resolves.toContain('takeoff set');
      await shot(page, viewport, `${name}-05-plan.png`);

      // 6. Run: a new version, its progress, then the results.
      await page.getByTestId('plan-run').click();
      await page.getByTestId('version-screen').waitFor({ timeout: 30_000 });
      await page.getByTestId('results-view').waitFor({ timeout: 180_000 });
      await expect(page.getByTestId('flight-cautions').isVisible()).resolves.toBe(true);
      const canvas = page.getByTestId('profile-chart-canvas');
      await canvas.waitFor({ timeout: 60_000 });
      await page.waitForFunction(() => {
        const c = document.querySelector('[data-testid="profile-chart-canvas"] canvas') as HTMLCanvasElement | null;
        return c !== null && c.width > 0 && c.height > 0;
      });
      await page.waitForTimeout(1500);
      // The chart really drew: the suggested-altitude line's colour is on the canvas.
      expect(await pixelsNear(canvas, seriesLooks.altitude.color)).toBeGreaterThan(50);
      await expect(page.getByTestId('profile-legend').textContent()).resolves.toContain('Suggested altitude');

      // The lines table (a list on phones) has one row per line the summary counts.
      const lineCount = Number((await page.getByTestId('summary-photos-note').textContent())?.match(/^(\d+) lines$/)?.[1]);
      expect(lineCount).toBeGreaterThan(0);
      await page.getByTestId(wide ? 'lines-table' : 'lines-list').waitFor();
      await expect(page.getByTestId(wide ? 'lines-list' : 'lines-table').count()).resolves.toBe(0);
      await expect(page.locator('[data-testid^="line-row-"]').count()).resolves.toBe(lineCount);
      // Every status of the legend is listed with its count, whatever the counts are.
      await expect(page.locator('[data-testid^="legend-"]').count()).resolves.toBe(5);

      // Choosing another line shows its chart.
      await page.getByTestId('line-row-1').click();
      await expect(page.getByTestId('profile-chart').getByRole('heading').textContent()).resolves.toContain('Line 1');
      await page.waitForTimeout(800);
      await shot(page, viewport, `${name}-06-results.png`);
      resultUrls.push(page.url());
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 300_000);
});

describe.skipIf(skipWeb)('a surveyor', () => {
  it('reads the project and the results with no control to create, upload, edit or run, and a failed run with its reason', async () => {
    expect(resultUrls.length).toBeGreaterThan(0);
    const { context, page, pageErrors } = await openPage(browser, viewports.wide);
    try {
      await signIn(page, surveyor.email);
      // Home is the work list; the projects are one tap away.
      await page.getByTestId('work-screen').waitFor();
      await page.getByTestId('nav-projects').click();
      await page.getByTestId('projects-screen').waitFor();
      await page.getByTestId('projects-list').waitFor();
      await expect(page.getByTestId('new-project').count()).resolves.toBe(0);
      await expect(page.locator('[data-testid^="project-rename-"]').count()).resolves.toBe(0);

      await page.goto(resultUrls[0]!);
      await page.getByTestId('results-view').waitFor({ timeout: 60_000 });
      await page.getByTestId('profile-chart-canvas').waitFor({ timeout: 60_000 });
      await page.getByTestId('lines-table').waitFor();

      await page.getByRole('link', { name: /Back to the plan/ }).click();
      await page.getByTestId('plan-screen').waitFor();
      await page.getByTestId('area-map').waitFor();
      await expect(page.getByTestId('plan-run').count()).resolves.toBe(0);
      await expect(page.getByTestId('plan-save').count()).resolves.toBe(0);
      await expect(page.getByTestId('area-close').count()).resolves.toBe(0);
      await expect(page.getByTestId('plan-gsd').isEditable()).resolves.toBe(false);
      await shot(page, viewports.wide, 'wide-07-surveyor-plan.png');

      // A run that failed shows the worker's reason word for word (the status answer is replaced in the browser,
      // since a real failure cannot be ordered up on demand).
      const reason = 'The survey area lies over nodata only: no ground heights could be read under it.';
      await page.route('**/versions/*/status', (route) =>
        route.fulfill({ json: { id: crypto.randomUUID(), planId: crypto.randomUUID(), number: 9, analysisState: 'failed', analysisProgressPct: 40, analysisError: reason, analysedAt: null } }),
      );
      await page.goto(resultUrls[0]!);
      await expect(page.getByTestId('run-failed').textContent()).resolves.toContain(reason);
      await expect(page.getByTestId('results-view').count()).resolves.toBe(0);
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  }, 120_000);
});

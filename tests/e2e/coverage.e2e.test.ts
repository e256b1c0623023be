/**
 * The ground proof of the seeded demo in Chromium against the real web build and API: the surveyor reads, at
 * 390x844 and 1440x900, the share of area meeting each item of the demo's spec (≤ 2.5 cm, ≥ 5 views, ±5° roll),
 * colours the map by another measure, opens the largest shortfall on the map and reads its cell, and finds the
 * raster download. Screenshots go to .artifacts/screenshots/coverage/.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { versionCoverageSchema } from '../../contracts/coverage';
import { demoUsers } from '../../contracts/demo-team';
import { demoPassword } from '../../server/seed/demo-password';
import { growToContent, launchBrowser, openPage, screenshotDir, viewports, signInWith } from '../support/browser';
import { demoClients, seededDemoVersion } from '../support/demo';
import { startTestServer, type TestServer } from '../support/test-server';

const shotDir = path.join(screenshotDir, 'coverage');
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

describe('ground proof on the version screen', () => {
  for (const [size, viewport] of Object.entries(viewports)) {
    it(`shows the surveyor the share per item, the layer, a shortfall's cell and the download (${size})`, async () => {
      const clients = await demoClients(srv);
      const api = versionCoverageSchema.parse((await clients.surveyor.get(`${apiPath}/coverage`)).body);
      if (api.state !== 'ready') throw new Error('the demo coverage is not ready');
      const { page, context, pageErrors } = await openPage(browser, viewport);
      await signInWith(page, srv.url, demoUsers.find((u) => u.role === 'surveyor')!.email, demoPassword);
      await page.goto(`${srv.url}${pagePath}`);
      const card = page.getByTestId('coverage-card');
      await card.waitFor();
      await page.getByTestId('coverage-items').waitFor();
      await expect(page.getByTestId('coverage-spec').textContent()).resolves.toContain('GSD ≤ 2.5 cm, ≥ 5 views in every cell');
      await expect(page.getByTestId('coverage-basis').textContent()).resolves.toContain('±5° roll');
      for (const it of api.document.compliance.items) {
        const pct = `${(it.share * 100).toFixed(1)} %`;
        await expect(page.getByTestId(`coverage-item-${it.item}`).textContent()).resolves.toContain(pct);
      }
      // the layer image and the hatching are on the map, placed inside the hillshade
      const img = page.locator('[data-testid="coverage-layer-image"]');
      await expect(img.getAttribute('href')).resolves.toBe(api.layers.find((l) => l.measure === 'gsd')!.imageUrl);
      await page.getByTestId('coverage-measure').getByText('Views', { exact: true }).click();
      await expect(img.getAttribute('href')).resolves.toBe(api.layers.find((l) => l.measure === 'views')!.imageUrl);
      await expect(page.getByTestId('coverage-legend').textContent()).resolves.toContain('higher is better');
      // the image really loaded (a broken image has no natural width)
      const loaded = await page.evaluate(async (href) => {
        const i = new Image();
        i.src = href;
        await i.decode();
        return i.naturalWidth;
      }, api.layers[1].imageUrl);
      expect(loaded).toBe(api.document.raster.width);
      // the largest shortfall on the map and its cell's figures
      await page.getByTestId('coverage-patch-0-show').click();
      const cell = page.getByTestId('coverage-cell');
      await expect(cell.textContent()).resolves.toMatch(/views · finest GSD/);
      await expect(cell.textContent()).resolves.toMatch(/Short of the spec|Meets every item/);
      await expect(page.getByTestId('coverage-download').getAttribute('href')).resolves.toBe(api.rasterUrl);
      const restore = await growToContent(page);
      await card.screenshot({ path: path.join(shotDir, `ground-proof-${size}.png`) });
      await page.screenshot({ path: path.join(shotDir, `version-${size}.png`) });
      await restore();
      expect(pageErrors).toEqual([]);
      await context.close();
    });
  }
});

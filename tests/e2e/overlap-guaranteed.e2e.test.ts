/**
 * Station overlaps as planned and as guaranteed on the seeded demo's results, in Chromium against the real web
 * build and API: the demo mission states an attitude envelope (±5° roll and pitch), so the summary shows the
 * least overlaps both ways and the line table / line cards give each line's guaranteed minimums beside the
 * planned ones, rounded toward failing like every figure against a target. Screenshots at 390x844 and
 * 1440x900 go to .artifacts/screenshots/overlap-guaranteed/.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoUsers } from '../../contracts/demo-team';
import { planResultSchema } from '../../contracts/plan-result';
import { roundTowardFailing } from '../../contracts/target-rounding';
import { demoPassword } from '../../server/seed/demo-password';
import { growToContent, launchBrowser, openPage, screenshotDir, viewports, signInWith } from '../support/browser';
import { demoClients, seededDemoVersion } from '../support/demo';
import { startTestServer, type TestServer } from '../support/test-server';

const shotDir = path.join(screenshotDir, 'overlap-guaranteed');
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

const pct = (v: number | null | undefined) => (v === null || v === undefined ? '–' : `${roundTowardFailing(v * 100, 1, 'min').toFixed(1)} %`);

describe('overlaps as planned and as guaranteed on the results screen', () => {
  for (const [size, viewport] of Object.entries(viewports)) {
    it(`shows both figures side by side in the summary and per line (${size})`, async () => {
      const clients = await demoClients(srv);
      const result = planResultSchema.parse((await clients.surveyor.get(apiPath)).body.result);
      const s = result.summary;
      expect(s.overlapEnvelope?.words).toBe('±5° roll, ±5° pitch');
      const { page, context, pageErrors } = await openPage(browser, viewport);
      await signInWith(page, srv.url, demoUsers.find((u) => u.role === 'surveyor')!.email, demoPassword);
      await page.goto(`${srv.url}${pagePath}`);
      await page.getByTestId('summary-figures').waitFor();
      const planned = await page.getByTestId('summary-overlap').textContent();
      expect(planned).toContain(`${pct(s.forwardOverlapMin)} / ${pct(s.sideOverlapMin)}`);
      expect(planned).toContain('as planned');
      const guaranteed = await page.getByTestId('summary-overlap-guaranteed').textContent();
      expect(guaranteed).toContain(`${pct(s.forwardOverlapGuaranteedMin)} / ${pct(s.sideOverlapGuaranteedMin)}`);
      expect(guaranteed).toContain('under ±5° roll, ±5° pitch');
      // line 1's least guaranteed overlaps, from its stations
      const min = (vs: Array<number | null | undefined>) => { const k = vs.filter((v): v is number => typeof v === 'number'); return k.length ? Math.min(...k) : null; };
      const st = result.lines[0].stations;
      const fwd = pct(min(st.map((x) => x.forwardOverlapGuaranteed))), side = pct(min(st.map((x) => x.sideOverlapGuaranteed)));
      if (size === 'wide') {
        const table = page.getByTestId('lines-table');
        await table.waitFor();
        await expect(page.getByTestId('lines-sort-forwardOverlapGuaranteedMin').textContent()).resolves.toContain('Fwd guar.');
        const row1 = await page.getByTestId('line-row-1').textContent();
        expect(row1).toContain(fwd);
        expect(row1).toContain(side);
        await expect(page.getByTestId('lines-table-basis').textContent()).resolves.toContain('as guaranteed under the attitude envelope (±5° roll, ±5° pitch)');
      } else {
        await page.getByTestId('lines-list').waitFor();
        // a phone card gives every figure once its line is chosen (the others give one line of figures)
        await page.getByTestId('line-row-1').click();
        await expect(page.getByTestId('line-brief-1').count()).resolves.toBe(0);
        await expect(page.getByTestId('line-guaranteed-1').textContent()).resolves.toBe(`As guaranteed under ±5° roll, ±5° pitch: ${fwd} forward, ${side} side`);
      }
      const restore = await growToContent(page);
      await page.screenshot({ path: path.join(shotDir, `results-${size}.png`), fullPage: true });
      await page.getByTestId('summary-figures').screenshot({ path: path.join(shotDir, `summary-${size}.png`) });
      await page.getByTestId(size === 'wide' ? 'lines-table' : 'line-row-1').screenshot({ path: path.join(shotDir, `lines-${size}.png`) });
      await restore();
      expect(pageErrors).toEqual([]);
      await context.close();
    }, 120_000);
  }
});

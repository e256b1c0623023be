/**
 * The first screen over the wire, as Chromium's network log records it on a cold load of the sign-in page: the
 * JavaScript stays within its budget (tests/support/web-budget.ts), every text response is compressed, hashed
 * bundles are cacheable for a year, fonts come as WOFF2 and never hold up the first paint.
 */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, openPage, viewports } from '../support/browser';
import { startTestServer, type TestServer } from '../support/test-server';
import { FIRST_SCREEN_FONT_BUDGET_BYTES, FIRST_SCREEN_JS_GZIP_BUDGET_BYTES } from '../support/web-budget';

const skipWeb = process.env.LOFTLINE_SKIP_WEB === '1';
let srv: TestServer;
let browser: Browser;
beforeAll(async () => {
  if (skipWeb) return;
  srv = await startTestServer();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

interface Transfer {
  url: string;
  type: string;
  encodedBytes: number;
  headers: Record<string, string>;
}

describe.skipIf(skipWeb)('the first screen on the wire', () => {
  it('sends the sign-in screen within the JavaScript and font budgets, compressed and cacheable, text painted before fonts arrive', async () => {
    const { context, page } = await openPage(browser, viewports.phone);
    const cdp = await context.newCDPSession(page);
    await cdp.send('Network.enable');
    const pending = new Map<string, Omit<Transfer, 'encodedBytes'>>();
    const done: Transfer[] = [];
    cdp.on('Network.responseReceived', (e) => {
      const headers = Object.fromEntries(Object.entries(e.response.headers).map(([k, v]) => [k.toLowerCase(), String(v)]));
      pending.set(e.requestId, { url: e.response.url, type: e.type, headers });
    });
    cdp.on('Network.loadingFinished', (e) => {
      const r = pending.get(e.requestId);
      if (r) done.push({ ...r, encodedBytes: e.encodedDataLength });
    });
    // Hold every font back until the form is on screen: an app that waited for its fonts would never show it.
    let release!: () => void;
    const released = new Promise<void>((r) => (release = r));
    let fontsAsked = 0;
    await page.route('**/*.woff2', async (route) => {
      fontsAsked++;
      await released;
      await route.continue();
    });
    const t0 = Date.now();
    await page.goto(`${srv.url}/sign-in`, { waitUntil: 'commit' }); // 'load' would wait for the held fonts
    await page.getByRole('button', { name: /sign in/i }).first().waitFor({ timeout: 30_000 });
    const formAfterMs = Date.now() - t0;
    const fontsLoadedBeforeRelease = await page.evaluate(() => [...document.fonts].filter((f) => f.status === 'loaded').length);
    release();
    await page.waitForLoadState('networkidle');
    await page.evaluate(() => document.fonts.ready);
    await context.close();

    const scripts = done.filter((t) => t.type === 'Script');
    const jsBytes = scripts.reduce((s, t) => s + t.encodedBytes, 0);
    expect(scripts.length).toBeGreaterThan(0);
    expect(jsBytes).toBeLessThan(FIRST_SCREEN_JS_GZIP_BUDGET_BYTES);
    for (const s of scripts) {
      expect(s.headers['content-encoding'], s.url).toMatch(/gzip|br/);
      expect(s.headers['cache-control'], s.url).toBe('public, max-age=31536000, immutable');
    }
    const doc = done.find((t) => t.type === 'Document')!;
    expect(doc.headers['content-encoding']).toMatch(/gzip|br/);

    const fonts = done.filter((t) => t.type === 'Font');
    expect(fonts.length).toBeGreaterThan(0);
    for (const f of fonts) expect(f.url).toMatch(/\.woff2$/);
    expect(done.some((t) => /\.ttf$/.test(t.url))).toBe(false);
    expect(fonts.reduce((s, t) => s + t.encodedBytes, 0)).toBeLessThan(FIRST_SCREEN_FONT_BUDGET_BYTES);
    // The form was on screen while every font was still held back (and the page did ask for them).
    expect(fontsAsked).toBeGreaterThan(0);
    expect(fontsLoadedBeforeRelease).toBe(0);
    console.log(`first screen: ${scripts.length} scripts, ${(jsBytes / 1024).toFixed(0)} KiB of JavaScript on the wire; ${fonts.length} fonts, ${(fonts.reduce((s, t) => s + t.encodedBytes, 0) / 1024).toFixed(0)} KiB; form on screen after ${formAfterMs} ms with every font held back`);
  }, 120_000);

  it('names the screen group an address opens in a preload header, and the sign-in screen none', async () => {
    const pilot = await fetch(`${srv.url}/flights/00000000-0000-4000-8000-000000000000`);
    const link = pilot.headers.get('link') ?? '';
    const m = /^<(\/_expo\/static\/js\/web\/field-screens-[0-9a-f]{32}\.js)>; rel=preload; as=script$/.exec(link);
    expect(m, link).not.toBeNull();
    const group = await fetch(`${srv.url}${m![1]}`);
    expect(group.status).toBe(200);
    expect(await group.text()).toContain('LegSheetScreen');
    expect((await fetch(`${srv.url}/projects`)).headers.get('link')).toMatch(/office-screens-[0-9a-f]{32}\.js>; rel=preload; as=script$/);
    expect((await fetch(`${srv.url}/sign-in`)).headers.get('link')).toBeNull();
  });
});

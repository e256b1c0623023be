/**
 * The first screen over the wire, as Chromium's network log records it on a cold load of the sign-in page: the
 * JavaScript stays within its budget (tests/support/web-budget.ts), every text response is compressed, hashed
 * bundles are cacheable for a year, fonts come as WOFF2 and never hold up the first paint.
 */
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, openPage, viewports } from '../support/browser';
import { createVersion, freshTeam } from '../support/fixtures';
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

  it('names the first API answers of a signed-in screen in the same header, only for a caller who may read them', async () => {
    const team = await freshTeam(srv, 'preload');
    const other = await freshTeam(srv, 'preload-other');
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off', planName: 'Preload: sheet' });
    const sheetPath = `/api/teams/${team.teamId}/flights/${v.versionId}/leg-sheet`;
    const linksFor = async (cookie: string | null, at: string) => {
      const r = await fetch(`${srv.url}${at}`, { headers: cookie ? { cookie } : {} });
      expect(r.status).toBe(200);
      return { links: (r.headers.get('link') ?? '').split(/,\s*/).filter(Boolean), vary: r.headers.get('vary') ?? '' };
    };
    const fetchLink = (href: string) => `<${href}>; rel=preload; as=fetch; crossorigin=use-credentials`;

    // The team's pilot: the session check and the sheet, beside the field screens' script; cached per cookie only.
    const pilot = await linksFor(team.clients.pilot.cookieHeader(), `/flights/${v.versionId}`);
    expect(pilot.links).toHaveLength(3);
    expect(pilot.links[0]).toMatch(/field-screens-[0-9a-f]{32}\.js>; rel=preload; as=script$/);
    expect(pilot.links.slice(1)).toEqual([fetchLink('/api/me'), fetchLink(sheetPath)]);
    expect(pilot.vary).toMatch(/cookie/i);
    // The header names exactly the address the sheet is read from: it answers the pilot with the sheet.
    expect((await team.clients.pilot.get(sheetPath)).status).toBe(200);

    // Someone from another team learns nothing of the version's team; nobody signed in gets no answers named;
    // an office screen gets the session check; the sign-in screen nothing at all.
    expect((await linksFor(other.clients.pilot.cookieHeader(), `/flights/${v.versionId}`)).links.slice(1)).toEqual([fetchLink('/api/me')]);
    expect((await linksFor(null, `/flights/${v.versionId}`)).links).toHaveLength(1);
    expect((await linksFor(team.clients.planner.cookieHeader(), '/projects')).links.slice(1)).toEqual([fetchLink('/api/me')]);
    expect((await linksFor(team.clients.planner.cookieHeader(), '/sign-in')).links).toEqual([]);
    // A home screen's list, for a caller with one team (the app opens that team); with two teams the app chooses.
    const teamPath = `/api/teams/${team.teamId}`;
    expect((await linksFor(team.clients.pilot.cookieHeader(), '/flights')).links.slice(1)).toEqual([fetchLink('/api/me'), fetchLink(`${teamPath}/flights`)]);
    expect((await linksFor(team.clients.surveyor.cookieHeader(), '/work')).links.slice(1)).toEqual([fetchLink('/api/me'), fetchLink(`${teamPath}/work`)]);
    expect((await team.clients.pilot.get(`${teamPath}/flights`)).status).toBe(200);
    expect((await other.clients.owner.post('/api/teams', { name: 'Preload second team' })).status).toBe(201);
    expect((await linksFor(other.clients.owner.cookieHeader(), '/work')).links.slice(1)).toEqual([fetchLink('/api/me')]);
    // A sheet address that is no version id asks the database nothing and names nothing beyond the session check.
    expect((await linksFor(team.clients.pilot.cookieHeader(), '/flights/not-a-version')).links.slice(1)).toEqual([fetchLink('/api/me')]);
  });

  it("sends the build's brotli copy of a script to a browser that accepts it, byte for byte what the build wrote", async () => {
    const webDist = process.env.LOFTLINE_WEB_DIST!;
    const html = await (await fetch(`${srv.url}/sign-in`)).text();
    const entry = /src="(\/_expo\/static\/js\/web\/entry-[0-9a-f]{32}\.js)"/.exec(html)![1];
    const onDisk = fs.readFileSync(path.join(webDist, entry));
    const br = await fetch(`${srv.url}${entry}`, { headers: { 'accept-encoding': 'br, gzip' } });
    expect(br.headers.get('content-encoding')).toBe('br');
    expect(br.headers.get('content-type')).toMatch(/javascript/);
    expect(br.headers.get('cache-control')).toBe('public, max-age=31536000, immutable');
    expect(br.headers.get('vary')).toMatch(/accept-encoding/i);
    // Node's fetch decodes the body: the decoded script must be the built file itself.
    expect(Buffer.from(await br.arrayBuffer()).equals(onDisk)).toBe(true);
    // Smaller on the wire than the on-the-fly gzip of the same file would be (the point of precompressing).
    expect(fs.statSync(path.join(webDist, `${entry}.br`)).size).toBeLessThan(zlib.gzipSync(onDisk, { level: 6 }).length * 0.9);
    const gz = await fetch(`${srv.url}${entry}`, { headers: { 'accept-encoding': 'gzip' } });
    expect(gz.headers.get('content-encoding')).toBe('gzip');
    expect(Buffer.from(await gz.arrayBuffer()).equals(onDisk)).toBe(true);
  });

  it('shows a way back when a screen group cannot be fetched, and opens the screen on a retry', async () => {
    const { context, page, pageErrors } = await openPage(browser, viewports.phone);
    try {
      const team = await freshTeam(srv, 'retry');
      await context.addCookies(
        team.clients.planner.cookieHeader().split('; ').map((pair) => {
          const i = pair.indexOf('=');
          return { name: pair.slice(0, i), value: pair.slice(i + 1), url: srv.url };
        }),
      );
      // The office screens' file cannot be fetched (the signal dropped) until the test says otherwise.
      let reachable = false;
      let asked = 0;
      await page.route('**/office-screens-*.js', async (route) => {
        asked++;
        return reachable ? route.continue() : route.abort('internetdisconnected');
      });
      await page.goto(`${srv.url}/projects`);
      await page.getByTestId('screen-load-failure').waitFor({ timeout: 30_000 });
      expect(await page.getByTestId('screen-load-failure').textContent()).toContain('Check the connection, then try again');
      const askedBefore = asked;
      reachable = true;
      await page.getByTestId('screen-load-retry').click();
      await page.getByTestId('projects-screen').waitFor({ timeout: 30_000 });
      expect(asked).toBeGreaterThan(askedBefore); // fetched again, not a remembered failure
      expect(pageErrors.filter((e) => !/office-screens|Loading chunk|Failed to fetch/i.test(e))).toEqual([]);
    } finally {
      await context.close();
    }
  }, 120_000);
});

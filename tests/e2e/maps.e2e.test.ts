/**
 * Maps in Chromium against the real web build and API, on a lon/lat (geographic) grid, the demo grid warped to
 * WGS 84 (tests/fixtures/dem/harrow-fell-wgs84.md): the hillshade is drawn with its ground aspect (not stretched
 * east–west), with a scale bar whose length matches the ground and a north arrow; in the plan editor the takeoff
 * label leaves corner 1 visible, a corner drags (the takeoff point stays), a corner dragged across the outline
 * gives the crossing message and dragged back closes the area again, a pressed corner can be removed, and the map
 * zooms and pans by buttons, keyboard and wheel, and resets. Screenshots at 390x844 and 1440x900 go to
 * .artifacts/screenshots/maps/.
 */
import fs from 'node:fs';
import path from 'node:path';
import geodesic from 'geographiclib-geodesic';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoUsers } from '../../contracts/demo-team';
import { demoPassword } from '../../server/seed/demo-password';
import { launchBrowser, openPage, screenshotDir, viewports, signInWith } from '../support/browser';
import { demoClients, demoTeamId } from '../support/demo';
import { uploadDem } from '../support/upload-helpers';
import { startTestServer, type TestServer } from '../support/test-server';

const { Geodesic } = geodesic as unknown as typeof import('geographiclib-geodesic');
const shotDir = path.join(screenshotDir, 'maps');
let srv: TestServer;
let browser: Browser;
let sitePath: string;
let planPath: string;
let bounds: [number, number, number, number];

// Corner 1 lies just up and to the right of the takeoff point, where a label drawn at its usual place would cover it.
const takeoff = { lon: 4.4733, lat: 46.767 };
const ring = [[4.476, 46.768], [4.488, 46.769], [4.488, 46.776], [4.477, 46.775]];

beforeAll(async () => {
  if (!process.env.LOFTLINE_WEB_DIST) throw new Error('LOFTLINE_WEB_DIST is not set: run the browser tests through `npm test`.');
  fs.mkdirSync(shotDir, { recursive: true });
  srv = await startTestServer();
  browser = await launchBrowser();
  const teamId = await demoTeamId(srv);
  const c = (await demoClients(srv)).planner;
  const projectId = (await c.post(`/api/teams/${teamId}/projects`, { name: 'Lon/lat copy of the demo grid (maps test)' })).body.id as string;
  const site = await uploadDem(c, `/api/teams/${teamId}/projects/${projectId}/sites`, new Uint8Array(fs.readFileSync('tests/fixtures/dem/harrow-fell-wgs84.tif')));
  expect(site.status).toBe(201);
  bounds = site.body.hillshade.boundsWgs84;
  const input = { ...JSON.parse(fs.readFileSync('datasets/example-mission.json', 'utf8')), area: { type: 'Polygon', coordinates: [[...ring, ring[0]]] }, takeoff };
  const p = await c.post(`/api/teams/${teamId}/projects/${projectId}/plans`, { name: 'Lon/lat map check', siteId: site.body.id, input });
  expect(p.status).toBe(201);
  sitePath = `/projects/${projectId}/sites/${site.body.id}`;
  planPath = `/projects/${projectId}/plans/${p.body.id}`;
});
afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

async function signIn(page: Page): Promise<void> {
  await signInWith(page, srv.url, demoUsers.find((u) => u.role === 'planner')!.email, demoPassword);
}

async function box(page: Page, testId: string) {
  const b = await page.getByTestId(testId).boundingBox();
  if (!b) throw new Error(`${testId} is not on screen`);
  return b;
}
const centre = (b: { x: number; y: number; width: number; height: number }) => [b.x + b.width / 2, b.y + b.height / 2] as const;
const overlaps = (a: { x: number; y: number; width: number; height: number }, b: typeof a) => a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;

/** Ground width and height of the hillshade (m): GeographicLib geodesics along its middle parallel and meridian. */
function groundSizeM(): { acrossM: number; downM: number } {
  // Reference: GeographicLib (npm geographiclib-geodesic 2.x, C. F. F. Karney, "Algorithms for geodesics", J. Geodesy 2013), WGS 84.
  const [w, s, e, n] = bounds;
  const midLat = (s + n) / 2;
  const midLon = (w + e) / 2;
  return { acrossM: Geodesic.WGS84.Inverse(midLat, w, midLat, e).s12 as number, downM: Geodesic.WGS84.Inverse(n, midLon, s, midLon).s12 as number };
}

describe('maps of a lon/lat grid', () => {
  for (const [size, viewport] of Object.entries(viewports)) {
    it(`draws the hillshade with the ground's aspect, a scale bar true to the ground and a north arrow (${size})`, async () => {
      const { page, context, pageErrors } = await openPage(browser, viewport);
      await signIn(page);
      await page.goto(`${srv.url}${sitePath}`);
      await page.getByTestId('site-hillshade-svg').waitFor();
      await page.waitForFunction(() => ((document.querySelector('[data-testid="site-hillshade-image"]') as SVGImageElement | null)?.getBoundingClientRect().width ?? 0) > 0);
      const img = await box(page, 'site-hillshade-image');
      const { acrossM, downM } = groundSizeM();
      const drawn = img.width / img.height;
      const ground = acrossM / downM;
      // drawn as wide against tall as the ground within 1 % (a pixel of rounding on a few hundred); square degrees were 1.46x too wide
      expect(Math.abs(drawn / ground - 1)).toBeLessThan(0.01);
      expect((bounds[2] - bounds[0]) / (bounds[3] - bounds[1]) / ground).toBeGreaterThan(1.4);
      // the scale bar: its length on screen times the ground per screen pixel is the length it names
      const label = (await page.getByTestId('site-hillshade-scale-label').textContent())!;
      const m = /^([\d.]+) (m|km)$/.exec(label)!;
      const namedM = Number(m[1]) * (m[2] === 'km' ? 1000 : 1);
      const barPx = (await box(page, 'site-hillshade-scale-bar')).width;
      expect(Math.abs((barPx * acrossM) / img.width / namedM - 1)).toBeLessThan(0.03);
      expect(/^[125]0*$/.test(String(namedM))).toBe(true);
      await expect(page.getByTestId('site-hillshade-north').getAttribute('aria-label')).resolves.toBe('North is up');
      await page.getByTestId('site-hillshade').screenshot({ path: path.join(shotDir, `site-map-${size}.png`) });
      await page.screenshot({ path: path.join(shotDir, `site-${size}.png`) });
      expect(pageErrors).toEqual([]);
      await context.close();
    }, 90_000);
  }

  it('keeps corner 1 clear of the takeoff label, drags corners (not the takeoff point), removes one, and zooms, pans and resets (phone)', async () => {
    const { page, context, pageErrors } = await openPage(browser, viewports.phone);
    await signIn(page);
    await page.goto(`${srv.url}${planPath}`);
    const map = page.getByTestId('area-map-svg');
    await map.waitFor();
    await expect(page.getByTestId('area-status').textContent()).resolves.toContain('4 corners, area closed · takeoff set');
    await page.getByTestId('area-map').scrollIntoViewIfNeeded();
    await page.getByTestId('area-map').screenshot({ path: path.join(shotDir, 'plan-map-phone-before.png') });

    // the takeoff label does not cover corner 1
    const corner1 = await box(page, 'area-map-marker-corner-0');
    const takeoffLabel = await box(page, 'area-map-label-takeoff');
    expect(overlaps(corner1, takeoffLabel)).toBe(false);

    // drag corner 1 by (18, 14) px: it follows; the takeoff point stays
    const takeoff0 = centre(await box(page, 'area-map-marker-takeoff'));
    const [cx, cy] = centre(corner1);
    await page.mouse.move(cx, cy);
    await page.mouse.down();
    await page.mouse.move(cx + 9, cy + 7, { steps: 3 });
    await page.mouse.move(cx + 18, cy + 14, { steps: 3 });
    await page.mouse.up();
    const [mx, my] = centre(await box(page, 'area-map-marker-corner-0'));
    expect(Math.abs(mx - (cx + 18))).toBeLessThan(2);
    expect(Math.abs(my - (cy + 14))).toBeLessThan(2);
    const takeoff1 = centre(await box(page, 'area-map-marker-takeoff'));
    expect(Math.abs(takeoff1[0] - takeoff0[0]) + Math.abs(takeoff1[1] - takeoff0[1])).toBeLessThan(1);
    await expect(page.getByTestId('area-status').textContent()).resolves.toContain('4 corners, area closed');

    // drag corner 2 across the outline: the crossing message asks to move or remove corners; dragged back, the area closes again
    const c2 = centre(await box(page, 'area-map-marker-corner-1'));
    const c4 = centre(await box(page, 'area-map-marker-corner-3'));
    await page.mouse.move(c2[0], c2[1]);
    await page.mouse.down();
    await page.mouse.move(c4[0] - 15, c4[1] + 20, { steps: 6 });
    await page.mouse.up();
    await expect(page.getByTestId('area-problem').textContent()).resolves.toMatch(/crosses itself.*Move or remove corners/);
    await expect(page.getByTestId('area-status').textContent()).resolves.toContain('not closed yet');
    const moved = centre(await box(page, 'area-map-marker-corner-1'));
    await page.mouse.move(moved[0], moved[1]);
    await page.mouse.down();
    await page.mouse.move(c2[0], c2[1], { steps: 6 });
    await page.mouse.up();
    await expect(page.getByTestId('area-status').textContent()).resolves.toContain('4 corners, area closed');
    await expect(page.getByTestId('area-problem').count()).resolves.toBe(0);

    // press corner 3 (no drag): it is chosen, and Remove corner takes it out
    const c3 = centre(await box(page, 'area-map-marker-corner-2'));
    await page.mouse.click(c3[0], c3[1]);
    await expect(page.getByTestId('area-remove-corner').textContent()).resolves.toBe('Remove corner 3');
    await page.getByTestId('area-remove-corner').click();
    await expect(page.getByTestId('area-status').textContent()).resolves.toContain('3 corners, area closed');

    // by keyboard alone: Next corner chooses corner 1; each press of an arrow button moves it one hillshade pixel
    await page.getByTestId('corner-next').focus();
    await page.keyboard.press('Enter');
    await expect(page.getByTestId('corner-chosen').textContent()).resolves.toMatch(/^Corner 1 of 3 chosen; a step is [\d.]+ m up or down, [\d.]+ m across$/);
    await expect(page.getByTestId('area-remove-corner').textContent()).resolves.toBe('Remove corner 1');
    await expect(page.getByTestId('corner-move-right').getAttribute('aria-label')).resolves.toMatch(/^Move corner 1 right by [\d.]+ m$/);
    const k0 = centre(await box(page, 'area-map-marker-corner-0'));
    const kv = (await map.getAttribute('data-view'))!.split(' ').map(Number);
    const kb = (await map.boundingBox())!;
    await page.getByTestId('corner-move-right').focus();
    for (let i = 0; i < 6; i++) await page.keyboard.press('Enter');
    await page.getByTestId('corner-move-up').focus();
    for (let i = 0; i < 4; i++) await page.keyboard.press('Enter');
    const k1 = centre(await box(page, 'area-map-marker-corner-0'));
    // six image pixels right and four up, drawn at the map's scale (view box in image pixels, aspect applied across)
    const acrossPx = kb.width / (kv[2] - kv[0]);
    const downPx = kb.height / (kv[3] - kv[1]);
    expect(k1[0] - k0[0]).toBeGreaterThan(0);
    expect(k0[1] - k1[1]).toBeGreaterThan(0);
    console.log(`corner keys: moved ${(k1[0] - k0[0]).toFixed(2)} px right, ${(k0[1] - k1[1]).toFixed(2)} px up; view px ${acrossPx.toFixed(3)} x ${downPx.toFixed(3)}`);
    expect(Math.abs((k1[0] - k0[0]) / 6 / acrossPx - 1)).toBeLessThan(0.05);
    expect(Math.abs((k0[1] - k1[1]) / 4 / downPx - 1)).toBeLessThan(0.05);
    await page.getByTestId('area-editor').screenshot({ path: path.join(shotDir, 'plan-map-phone-corner-keys.png') });
    await expect(page.getByTestId('area-status').textContent()).resolves.toContain('3 corners, area closed');

    // zoom: a button, then the keyboard (Enter on the focused button, arrows pan), then reset; the scale bar follows
    const view0 = (await map.getAttribute('data-view'))!.split(' ').map(Number);
    const scale0 = (await page.getByTestId('area-map-scale-label').textContent())!;
    await page.getByTestId('area-map-zoom-in').click();
    const view1 = (await map.getAttribute('data-view'))!.split(' ').map(Number);
    expect((view1[2] - view1[0]) / (view0[2] - view0[0])).toBeCloseTo(0.5, 6);
    await page.getByTestId('area-map-zoom-in').focus();
    await page.keyboard.press('Enter');
    const view2 = (await map.getAttribute('data-view'))!.split(' ').map(Number);
    expect((view2[2] - view2[0]) / (view0[2] - view0[0])).toBeCloseTo(0.25, 6);
    expect(await page.getByTestId('area-map-scale-label').textContent()).not.toBe(scale0);
    await page.keyboard.press('ArrowRight');
    const view3 = (await map.getAttribute('data-view'))!.split(' ').map(Number);
    expect(view3[0]).toBeGreaterThan(view2[0]);
    await page.getByTestId('area-map').screenshot({ path: path.join(shotDir, 'plan-map-phone-zoomed.png') });
    await page.getByTestId('area-map-zoom-reset').click();
    expect((await map.getAttribute('data-view'))!.split(' ').map(Number)).toEqual(view0);
    await expect(page.getByTestId('area-map-scale-label').textContent()).resolves.toBe(scale0);
    // the wheel zooms about the pointer
    const mb = await box(page, 'area-map-svg');
    await page.mouse.move(mb.x + mb.width * 0.8, mb.y + mb.height * 0.5);
    await page.mouse.wheel(0, -300);
    await expect.poll(async () => Number((await map.getAttribute('data-view'))!.split(' ')[0])).toBeGreaterThan(view0[0]);
    await page.getByTestId('area-map').screenshot({ path: path.join(shotDir, 'plan-map-phone-after.png') });
    await page.screenshot({ path: path.join(shotDir, 'plan-phone.png') });
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 120_000);

  it('zooms the phone map with a two-finger pinch about the fingers (phone, touch)', async () => {
    const context = await browser.newContext({ viewport: viewports.phone, hasTouch: true });
    const page = await context.newPage();
    const pageErrors: string[] = [];
    page.on('pageerror', (e) => pageErrors.push(e.message));
    await signIn(page);
    await page.goto(`${srv.url}${sitePath}`);
    const map = page.getByTestId('site-hillshade-svg');
    await map.waitFor();
    await map.scrollIntoViewIfNeeded();
    const view0 = (await map.getAttribute('data-view'))!.split(' ').map(Number);
    const [cx, cy] = centre(await box(page, 'site-hillshade-svg'));
    // two touch points 40 px apart moving to 120 px apart: three times closer
    const cdp = await context.newCDPSession(page);
    const touch = (type: 'touchStart' | 'touchMove' | 'touchEnd', d: number) => cdp.send('Input.dispatchTouchEvent', { type, touchPoints: type === 'touchEnd' ? [] : [{ x: cx - d, y: cy, id: 1 }, { x: cx + d, y: cy, id: 2 }] });
    await touch('touchStart', 20);
    for (let d = 25; d <= 60; d += 5) await touch('touchMove', d);
    await touch('touchEnd', 60);
    const view1 = (await map.getAttribute('data-view'))!.split(' ').map(Number);
    expect((view0[2] - view0[0]) / (view1[2] - view1[0])).toBeCloseTo(3, 1);
    // the point between the fingers stays where it was
    const mid0 = (view0[0] + view0[2]) / 2;
    expect(Math.abs((view1[0] + view1[2]) / 2 - mid0)).toBeLessThan((view0[2] - view0[0]) * 0.02);
    await page.getByTestId('site-hillshade').screenshot({ path: path.join(shotDir, 'site-map-phone-pinched.png') });
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 90_000);

  it('shows the plan editor map with its scale bar, north arrow and zoom buttons (wide)', async () => {
    const { page, context, pageErrors } = await openPage(browser, viewports.wide);
    await signIn(page);
    await page.goto(`${srv.url}${planPath}`);
    await page.getByTestId('area-map-svg').waitFor();
    await page.getByTestId('area-map-scale').waitFor();
    await expect(page.getByTestId('area-map-north').getAttribute('aria-label')).resolves.toBe('North is up');
    await expect(page.getByRole('button', { name: 'Zoom in' }).count()).resolves.toBe(1);
    const corner1 = await box(page, 'area-map-marker-corner-0');
    expect(overlaps(corner1, await box(page, 'area-map-label-takeoff'))).toBe(false);
    await page.screenshot({ path: path.join(shotDir, 'plan-wide.png') });
    await page.getByTestId('area-map').screenshot({ path: path.join(shotDir, 'plan-map-wide.png') });
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 120_000);
});

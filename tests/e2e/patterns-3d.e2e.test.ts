/**
 * Views from all round, end to end in Chromium against the real web build and API: a planner asks the plan editor's
 * spec for views from all round and lets Loftline lay the lines out; the run solves a slant plan (two sets of lines
 * across each other, the camera tilted) and the version screen says so; the surveyor signs it off and the pilot's leg
 * sheet shows each line's camera tilt and the spot photos as one group, as the API's plan data has them. The area
 * is a part of the demo grid around the quarry, so the solve stays short. Screenshots in
 * .artifacts/screenshots/patterns-3d/.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { LegSheet } from '../../contracts/flights';
import { EXAMPLE_MISSION } from '../support/analysed-version';
import { growToContent, launchBrowser, openPage, screenshotDir, viewports, signInWith } from '../support/browser';
import { fixturePassword, freshTeam, type FreshTeam } from '../support/fixtures';
import { signOffBody } from '../support/review-helpers';
import { startTestServer, type TestServer } from '../support/test-server';

const shotDir = path.join(screenshotDir, 'patterns-3d');
let srv: TestServer;
let browser: Browser;
let team: FreshTeam;
let projectId: string;
let planId: string;
let versionId: string;

/** The quarry's face and the ground south of it, about 270 m x 330 m of the demo area. */
const quarryArea = {
  type: 'Polygon',
  coordinates: [[[4.4835, 46.766], [4.487, 46.766], [4.487, 46.769], [4.4835, 46.769], [4.4835, 46.766]]],
};

beforeAll(async () => {
  if (!process.env.LOFTLINE_WEB_DIST) throw new Error('LOFTLINE_WEB_DIST is not set: run the browser tests through `npm test`.');
  fs.mkdirSync(shotDir, { recursive: true });
  srv = await startTestServer({ env: { WORKERS: '1', JOBS_POLL_SECONDS: '0.5' } });
  browser = await launchBrowser();
  team = await freshTeam(srv, 'patterns-3d');
  const c = team.clients.planner;
  projectId = (await c.post(`/api/teams/${team.teamId}/projects`, { name: 'Quarry faces' })).body.id;
  const f = new FormData();
  f.append('surfaceKind', 'bare-earth');
  f.append('verticalDatum', 'EGM96 (EPSG:5773)');
  f.append('file', new Blob([new Uint8Array(fs.readFileSync('datasets/harrow-fell-dem.tif'))]), 'harrow-fell-dem.tif');
  const site = await c.request('POST', `/api/teams/${team.teamId}/projects/${projectId}/sites`, { body: f });
  expect(site.status).toBe(201);
  const input = { ...JSON.parse(fs.readFileSync(EXAMPLE_MISSION, 'utf8')), area: quarryArea };
  planId = (await c.post(`/api/teams/${team.teamId}/projects/${projectId}/plans`, { name: 'Face from all round', siteId: site.body.id, input })).body.id;
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

async function signIn(page: Page, email: string): Promise<void> {
  await signInWith(page, srv.url, email, fixturePassword);
}

type Choice = { line: number; kind: 'line' | 'spot'; set: number; reasons: string[] };

describe('views from all round, from the spec to the leg sheet', () => {
  it('solves a slant plan from the editor and says so on the version screen (sets, tilt, the all-round item)', async () => {
    const { page, context, pageErrors } = await openPage(browser, viewports.wide);
    await signIn(page, team.users.planner.email);
    await page.goto(`${srv.url}/projects/${projectId}/plans/${planId}`);
    await page.getByTestId('spec-section').waitFor();
    await page.getByTestId('plan-spec-direction-gap').fill('120');
    await page.getByTestId('plan-layout-by-solver').click();
    // with the solver chosen, lines may be let past the edge (left empty here: 0 m)
    await page.getByTestId('plan-solve-beyond').waitFor();
    {
      const restore = await growToContent(page);
      await page.getByTestId('spec-section').screenshot({ path: path.join(shotDir, 'spec-section-wide.png') });
      await restore();
    }
    await page.getByTestId('plan-run').click();
    const card = page.getByTestId('solved-card');
    await card.waitFor({ timeout: 150_000 });
    versionId = page.url().split('/versions/')[1]!;
    const version = (await team.clients.planner.get(`/api/teams/${team.teamId}/plans/${planId}/versions/${versionId}`)).body;
    expect(version.input.spec.maxDirectionGapDeg ?? version.input.mission?.spec.maxDirectionGapDeg).toBe(120);
    const solved = version.result.solved;
    // the spec asks for views at 30° from four sides, more than nadir photos of the demo camera give: the slant
    expect(solved.pattern).toBe('slant');
    const choices = solved.choices.lines as Choice[];
    const set1 = choices.filter((c) => c.kind === 'line' && c.set === 1).length;
    const set2 = choices.filter((c) => c.kind === 'line' && c.set === 2).length;
    const spots = choices.filter((c) => c.kind === 'spot').length;
    expect(set1).toBeGreaterThan(2);
    expect(set2).toBeGreaterThan(2);
    expect(spots, 'the quarry face leaves ground the lines see too coarsely').toBeGreaterThan(0);
    const tilts = new Set((version.result.lines as { cameraTiltDeg?: number }[]).map((l) => l.cameraTiltDeg ?? 0));
    expect([...tilts].filter((t) => t > 0)).toEqual([35]); // the spec's 30° slant + 5°
    const comparison = (await card.getByTestId('solved-comparison').textContent()) ?? '';
    expect(comparison).toContain(`Lines (first set + second set across it)${set1} + ${set2}`);
    expect(comparison).toContain(`Spot photos (one photo straight above short ground)${spots}`);
    await card.getByTestId('solved-lines-toggle').click();
    const why = (await card.getByTestId('solved-lines').textContent()) ?? '';
    const firstOfSet2 = choices.find((c) => c.kind === 'line' && c.set === 2)!;
    expect(why).toContain(`Line ${firstOfSet2.line} · set 2`);
    expect(why).toContain('camera tilted 35° from straight down towards the nose');
    // the ground proof's item for views from all round, with the share the stored coverage gives
    const coverage = (await team.clients.planner.get(`/api/teams/${team.teamId}/plans/${planId}/versions/${versionId}/coverage`)).body;
    const item = coverage.document.compliance.items.find((i: { item: string }) => i.item === 'directions');
    expect(item).toBeDefined();
    const itemText = (await page.getByTestId('coverage-item-directions').textContent({ timeout: 30_000 })) ?? '';
    expect(itemText).toContain('Seen from all round: no gap over 120° between views ≥ 30° from vertical');
    expect(itemText).toContain(`${(item.share * 100).toFixed(1)} % of the area`);
    // the item's words sit right above its bar (they once stood a fixed 220 px tall)
    const words = await page.getByTestId('coverage-item-directions').boundingBox();
    expect(words!.height).toBeLessThan(120);
    const restore = await growToContent(page);
    await card.screenshot({ path: path.join(shotDir, 'solved-wide.png') });
    await page.getByTestId('coverage-card').screenshot({ path: path.join(shotDir, 'coverage-wide.png') });
    await restore();
    expect(pageErrors).toEqual([]);
    await context.close();

    const phone = await openPage(browser, viewports.phone);
    await signIn(phone.page, team.users.planner.email);
    await phone.page.goto(`${srv.url}/projects/${projectId}/plans/${planId}/versions/${versionId}`);
    const phoneCard = phone.page.getByTestId('solved-card');
    await phoneCard.waitFor({ timeout: 60_000 });
    const box = await phoneCard.boundingBox();
    expect(box!.x + box!.width).toBeLessThanOrEqual(viewports.phone.width + 1);
    const restorePhone = await growToContent(phone.page);
    await phoneCard.screenshot({ path: path.join(shotDir, 'solved-phone.png') });
    await phone.page.getByTestId('coverage-items').screenshot({ path: path.join(shotDir, 'coverage-items-phone.png') });
    await restorePhone();
    expect(phone.pageErrors).toEqual([]);
    await phone.context.close();
  }, 240_000);

  it("shows the pilot each line's set and camera tilt, and the spot photos as one group with their heights", async () => {
    const v = `/api/teams/${team.teamId}/plans/${planId}/versions/${versionId}`;
    expect((await team.clients.planner.post(`${v}/submit`, {})).status).toBe(200);
    expect((await team.clients.surveyor.post(`${v}/sign-off`, await signOffBody(team.clients.surveyor, v, { comment: 'Seen from all round.' }))).status).toBe(200);
    const result = (await team.clients.planner.get(v)).body.result;
    const choices = result.solved.choices.lines as Choice[];
    const spotLines = choices.filter((c) => c.kind === 'spot').map((c) => c.line);
    const sheet = (await team.clients.pilot.get(`/api/teams/${team.teamId}/flights/${versionId}/leg-sheet`)).body as LegSheet;
    const tilted = sheet.lines.filter((l) => (l.cameraTiltDeg ?? 0) > 0);
    expect(tilted.length).toBe(choices.filter((c) => c.kind === 'line').length);
    // the spot photos are flown as one tour: consecutive numbers in the flying order
    expect(spotLines).toEqual(spotLines.map((_, i) => spotLines[0]! + i));
    const firstSpot = spotLines[0]!;
    const set2 = sheet.lines.find((l) => l.set === 2)!;
    // the caution goes with every export too; the CSV repeats it on every row
    const tiltCaution = sheet.cautions.find((c) => c.startsWith('The camera is tilted 35° from straight down towards the nose'));
    expect(tiltCaution).toBeDefined();
    const csv = await team.clients.pilot.get(`${v}/export.csv`);
    expect(csv.status).toBe(200);
    expect(String(csv.body).split('\r\n')[1]).toContain(tiltCaution!.slice(0, 60));
    // the GeoJSON says which lines look ahead and which photos are spots
    const geo = (await team.clients.pilot.get(`${v}/export.geojson`)).body;
    const geoLines = geo.features.filter((f: { properties: { kind: string } }) => f.properties.kind === 'line');
    expect(geoLines.map((f: { properties: { cameraTiltDeg: number } }) => f.properties.cameraTiltDeg)).toEqual(sheet.lines.map((l) => l.cameraTiltDeg ?? 0));
    expect(geoLines.filter((f: { properties: { spotPhoto: boolean } }) => f.properties.spotPhoto).length).toBe(spotLines.length);

    // the compliance report: the all-round item, the camera as planned and the tilt among the cautions
    {
      const { page, context, pageErrors } = await openPage(browser, viewports.wide);
      await signIn(page, team.users.surveyor.email);
      await page.goto(`${srv.url}/projects/${projectId}/plans/${planId}/versions/${versionId}/report`);
      await page.getByTestId('report-assumptions').waitFor({ timeout: 30_000 });
      expect(await page.getByTestId('report-coverage-item-directions').textContent()).toContain('Seen from all round');
      expect(await page.getByTestId('report-assumptions').textContent()).toContain('take the camera as planned: tilted 35° from straight down towards the nose');
      expect(await page.getByTestId('report-cautions').textContent()).toContain('The camera is tilted 35°');
      const restore = await growToContent(page);
      for (const id of ['report-coverage', 'report-assumptions', 'report-cautions']) await page.getByTestId(id).screenshot({ path: path.join(shotDir, `${id}-wide.png`) });
      await restore();
      expect(pageErrors).toEqual([]);
      await context.close();
    }

    for (const [size, viewport] of Object.entries(viewports)) {
      const { page, context, pageErrors } = await openPage(browser, viewport);
      await signIn(page, team.users.pilot.email);
      await page.goto(`${srv.url}/flights/${versionId}`);
      await page.getByTestId('line-index').waitFor();
      // one index entry per line of the layout, and one for the tour of spot photos
      await expect(page.locator('[data-testid^="line-index-"]').count()).resolves.toBe(sheet.lines.length - spotLines.length + 1);
      const spotEntry = (await page.getByTestId(`line-index-spots-${firstSpot}`).textContent()) ?? '';
      expect(spotEntry).toContain(`${spotLines.length} spot photos`);
      expect(spotEntry).toContain(`Lines ${firstSpot}–${spotLines[spotLines.length - 1]}`);
      expect(spotEntry).toContain('above takeoff');
      // every tilted line's card says its tilt in degrees, from straight down and as the gimbal's pitch
      await page.getByTestId(`line-${sheet.lines[sheet.lines.length - 1]!.number}`).waitFor({ timeout: 30_000 });
      for (const l of [tilted[0]!, set2]) {
        const tilt = (await page.getByTestId(`line-${l.number}-tilt`).textContent()) ?? '';
        expect(tilt).toContain(`Camera tilted ${l.cameraTiltDeg}° from straight down towards the nose (gimbal pitch ${-(90 - l.cameraTiltDeg!)}° from the horizon)`);
      }
      expect(await page.getByTestId(`line-${set2.number}`).getByRole('heading').first().textContent()).toBe(`Line ${set2.number} · set 2`);
      // the spot photos: one group, counted as the plan has them, each with its heights and their references
      expect(await page.locator('[data-testid^="line-"][data-testid$="-tilt"]').count()).toBe(tilted.length);
      await expect(page.locator('[data-testid^="spot-photos-"][data-testid$="-count"]').count()).resolves.toBe(1);
      const group = page.getByTestId(`spot-photos-${firstSpot}`);
      expect(await group.getByTestId(`spot-photos-${firstSpot}-count`).textContent()).toBe(`${spotLines.length} spot photos`);
      await expect(group.locator('[data-testid$="-heights"]').count()).resolves.toBe(spotLines.length);
      for (const n of spotLines) {
        expect(await page.getByTestId(`line-${n}`).count()).toBe(0);
        const leg = sheet.lines[n - 1]!.legs[0]!;
        expect(await group.getByTestId(`spot-${n}-altitude`).textContent()).toBe(`${Math.round(leg.altitudeAboveTakeoffM.start)} m above takeoff`);
        const heights = (await group.getByTestId(`spot-${n}-heights`).textContent()) ?? '';
        expect(heights).toContain(`${leg.altitudeAboveDatumM.start.toFixed(1)} m above ${sheet.datum.name}`);
        expect(heights).toMatch(/ m above ground · GSD [\d.]+ cm$/);
      }
      // the sheet's facts count the lines of the layout and the spot photos apart
      const facts = (await page.getByTestId('sheet-facts').textContent()) ?? '';
      expect(facts).toContain(`Lines${sheet.lines.length - spotLines.length}`);
      expect(facts).toContain(`Spot photos${spotLines.length}`);
      // in a plan with tilted lines the spot photos say the camera looks straight down for them
      expect(await group.getByTestId(`spot-photos-${firstSpot}-camera`).textContent()).toContain('Camera straight down for these photos');
      // the flight-facing sheet keeps its cautions, with the camera tilt among the checks
      await page.getByText('Before you fly').first().waitFor();
      await expect(page.getByTestId('preflight-checklist').textContent()).resolves.toContain('The camera is tilted 35°');
      // the index's entry for the tour brings its card to the top
      expect((await group.boundingBox())!.y).toBeGreaterThan(viewport.height);
      await page.getByTestId(`line-index-spots-${firstSpot}`).click();
      await expect.poll(async () => (await group.boundingBox())!.y, { timeout: 5_000 }).toBeLessThan(viewport.height / 2);
      expect((await group.boundingBox())!.y).toBeGreaterThanOrEqual(-1);
      // the sketch's takeoff (south-west of this area, in the box's corner) is not drawn over the scale bar
      const takeoff = (await page.getByTestId('sketch-takeoff').boundingBox())!;
      const scale = (await page.getByTestId('sketch-scale').boundingBox())!;
      const apart = takeoff.x + takeoff.width < scale.x || scale.x + scale.width < takeoff.x || takeoff.y + takeoff.height < scale.y || scale.y + scale.height < takeoff.y;
      expect(apart, `takeoff ${JSON.stringify(takeoff)} over the scale bar ${JSON.stringify(scale)}`).toBe(true);
      // nothing runs out of its card on a phone (a MAVLink frame name in the hand-off cautions once did)
      for (const id of [`spot-photos-${firstSpot}`, 'mission-items']) {
        await page.getByTestId('mission-items-count').waitFor();
        const overflowing = await page.getByTestId(id).evaluate((card) =>
          Array.from(card.querySelectorAll<HTMLElement>('*')).filter((e) => e.scrollWidth > e.clientWidth + 1).map((e) => (e.textContent ?? '').slice(0, 60)),
        );
        expect(overflowing, id).toEqual([]);
      }
      // the app scrolls inside its own container: the window as tall as the content, so each card is drawn whole
      const restore = await growToContent(page);
      await group.screenshot({ path: path.join(shotDir, `spot-photos-${size}.png`) });
      await page.getByTestId(`line-${set2.number}`).screenshot({ path: path.join(shotDir, `set2-line-${size}.png`) });
      await page.getByTestId('line-index').screenshot({ path: path.join(shotDir, `line-index-${size}.png`) });
      await page.getByTestId('mission-items').screenshot({ path: path.join(shotDir, `mission-items-${size}.png`) });
      await page.getByTestId('preflight-checklist').screenshot({ path: path.join(shotDir, `checklist-${size}.png`) });
      await page.getByTestId('leg-sheet-datum').screenshot({ path: path.join(shotDir, `takeoff-and-heights-${size}.png`) });
      await page.getByTestId('lines-sketch').screenshot({ path: path.join(shotDir, `lines-sketch-${size}.png`) });
      await restore();
      expect(pageErrors).toEqual([]);
      await context.close();
    }
  }, 240_000);
});

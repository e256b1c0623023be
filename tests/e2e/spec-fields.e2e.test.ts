/**
 * The client's spec for every ground cell and the attitude envelope, set in the plan editor in Chromium at 390x844
 * against the real web build and API: the planner fills them, saves, and the stored mission carries them; a value out
 * of range is refused beside its field with the schema's range; with the solver chosen, a run lays the lines out
 * and the version screen says why. Screenshots in .artifacts/screenshots/spec/.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { COVERAGE_RANGES } from '../../terrain/coverage-ranges';
import { EXAMPLE_MISSION } from '../support/analysed-version';
import { growToContent, launchBrowser, openPage, screenshotDir, viewports, signInWith } from '../support/browser';
import { eventually, fixturePassword, freshTeam, type FreshTeam } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';

const shotDir = path.join(screenshotDir, 'spec');
let srv: TestServer;
let browser: Browser;
let team: FreshTeam;
let projectId: string;
let planId: string;

beforeAll(async () => {
  if (!process.env.LOFTLINE_WEB_DIST) throw new Error('LOFTLINE_WEB_DIST is not set: run the browser tests through `npm test`.');
  fs.mkdirSync(shotDir, { recursive: true });
  srv = await startTestServer({ env: { WORKERS: '1', JOBS_POLL_SECONDS: '0.5' } });
  browser = await launchBrowser();
  team = await freshTeam(srv, 'spec-fields');
  const c = team.clients.planner;
  projectId = (await c.post(`/api/teams/${team.teamId}/projects`, { name: 'Spec fields' })).body.id;
  const f = new FormData();
  f.append('surfaceKind', 'bare-earth');
  f.append('file', new Blob([new Uint8Array(fs.readFileSync('datasets/harrow-fell-dem.tif'))]), 'harrow-fell-dem.tif');
  const site = await c.request('POST', `/api/teams/${team.teamId}/projects/${projectId}/sites`, { body: f });
  const { spec: _s, envelope: _e, ...input } = JSON.parse(fs.readFileSync(EXAMPLE_MISSION, 'utf8'));
  planId = (await c.post(`/api/teams/${team.teamId}/projects/${projectId}/plans`, { name: 'Spec from the form', siteId: site.body.id, input })).body.id;
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

describe('spec for every ground cell in the plan editor', () => {
  it('saves the spec and the envelope the planner types, and refuses a value out of range beside its field', async () => {
    const { page, context, pageErrors } = await openPage(browser, viewports.phone);
    await signInWith(page, srv.url, team.users.planner.email, fixturePassword);
    await page.goto(`${srv.url}/projects/${projectId}/plans/${planId}`);
    const section = page.getByTestId('spec-section');
    await section.waitFor();
    await page.getByTestId('plan-spec-gsd').fill('2.5');
    await page.getByTestId('plan-spec-views').fill('5');
    // views from all round (3D): the widest gap between slanting views, at the default slant
    await page.getByTestId('plan-spec-direction-gap').fill('120');
    expect(await page.getByTestId('plan-envelope-roll').count()).toBe(0);
    await page.getByTestId('plan-envelope-multirotor').click();
    await page.getByTestId('plan-envelope-roll').fill('6');
    await page.getByTestId('plan-envelope-wind').fill('4');
    await page.getByTestId('plan-envelope-wind-from').fill('270');
    await page.getByTestId('plan-save').click();
    const saved = await eventually(async () => {
      const input = (await team.clients.planner.get(`/api/teams/${team.teamId}/plans/${planId}`)).body.input;
      return input?.envelope ? input : null;
    }, 15_000, 'the saved spec');
    expect(saved.spec).toEqual({ maxGsdCm: 2.5, minViews: 5, maxDirectionGapDeg: 120 });
    expect(saved.envelope).toEqual({ preset: 'multirotor', rollDeg: 6, windMps: 4, windFromDeg: 270 });
    const restore = await growToContent(page);
    await section.screenshot({ path: path.join(shotDir, 'planner-phone.png') });
    await restore();
    // out of range: the schema's own range, restated beside the field
    await page.getByTestId('plan-spec-views').fill(String(COVERAGE_RANGES.minViews.max + 1));
    await page.getByTestId('plan-save').click();
    await section.getByText(`Must be a number from ${COVERAGE_RANGES.minViews.min} to ${COVERAGE_RANGES.minViews.max}.`).waitFor({ timeout: 10_000 });
    const after = (await team.clients.planner.get(`/api/teams/${team.teamId}/plans/${planId}`)).body.input;
    expect(after.spec.minViews).toBe(5);
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 120_000);

  it('lets Loftline lay the lines out to the spec, and shows why on the version screen', async () => {
    const { page, context, pageErrors } = await openPage(browser, viewports.wide);
    await signInWith(page, srv.url, team.users.planner.email, fixturePassword);
    await page.goto(`${srv.url}/projects/${projectId}/plans/${planId}`);
    await page.getByTestId('spec-section').waitFor();
    await page.getByTestId('plan-spec-views').fill('5');
    await page.getByTestId('plan-layout-by-solver').click();
    await page.getByTestId('plan-run').click();
    const card = page.getByTestId('solved-card');
    await card.waitFor({ timeout: 150_000 });
    const saved = (await team.clients.planner.get(`/api/teams/${team.teamId}/plans/${planId}`)).body.input;
    expect(saved.layoutBy).toBe('solver');
    // the card says what the stored result's proof says
    const versionId = page.url().split('/versions/')[1];
    const result = (await team.clients.planner.get(`/api/teams/${team.teamId}/plans/${planId}/versions/${versionId}`)).body.result;
    expect(await card.getByTestId('solved-proof').textContent()).toContain(`${result.solved.proof.reachableCells} of ${result.solved.proof.cellsInArea} cells`);
    expect(await card.getByTestId('solved-lines').textContent()).toContain(result.solved.choices.lines[0].reasons[0]);
    const restore = await growToContent(page);
    await card.screenshot({ path: path.join(shotDir, 'solved-wide.png') });
    await restore();
    // the spot photos are counted beside the lines, and each names its ground in its reasons
    const spots = result.solved.choices.lines.filter((l: { kind: string }) => l.kind === 'spot').length;
    expect(await card.getByTestId('solved-comparison').textContent()).toContain(`Spot photos (one photo straight above short ground)${spots}`);
    // beside the planner's own settings: the solved plan's photos and batteries as stored, the own settings' as the
    // solver compared them
    const own = result.solved.comparison.uniform[0];
    const rows = await card.getByTestId('solved-versus-own').getByRole('row').allTextContents();
    expect(rows).toContain(`Photos${result.summary.photoCount}${own.photoCount}`);
    expect(rows).toContain(`Batteries${result.summary.batteries}${own.batteries}`);
    expect(await card.getByTestId('solved-versus-own').textContent()).toContain(`forward ${Math.round(own.setting.forwardOverlap * 100)} %, side ${Math.round(own.setting.sideOverlap * 100)} %, ${own.setting.mode}`);
    expect(pageErrors).toEqual([]);
    await context.close();
    // the same card on a phone: nothing wider than the screen
    const phone = await openPage(browser, viewports.phone);
    await phone.page.goto(`${srv.url}/sign-in`);
    await phone.page.getByTestId('sign-in-email').fill(team.users.planner.email);
    await phone.page.getByTestId('sign-in-password').fill(fixturePassword);
    await phone.page.getByTestId('sign-in-submit').click();
    await phone.page.getByTestId('nav-profile').waitFor();
    await phone.page.goto(`${srv.url}/projects/${projectId}/plans/${planId}/versions/${versionId}`);
    const phoneCard = phone.page.getByTestId('solved-card');
    await phoneCard.waitFor({ timeout: 60_000 });
    const box = await phoneCard.boundingBox();
    expect(box!.x + box!.width).toBeLessThanOrEqual(viewports.phone.width + 1);
    const restorePhone = await growToContent(phone.page);
    await phoneCard.screenshot({ path: path.join(shotDir, 'solved-phone.png') });
    await restorePhone();
    expect(phone.pageErrors).toEqual([]);
    await phone.context.close();
  }, 240_000);
});

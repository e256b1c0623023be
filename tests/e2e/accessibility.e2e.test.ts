/**
 * Every screen of every role, signed out and signed in, scanned with axe-core (Deque's WCAG rule engine, the
 * `axe-core` npm package, run inside Chromium) at 390x844 and 1440x900 for the WCAG 2.0/2.1/2.2 A and AA rules:
 * no critical and no serious finding. Each screen also names itself in the document title and has a main landmark.
 */
import fs from 'node:fs';
import { createRequire } from 'node:module';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoUsers } from '../../contracts/demo-team';
import type { Role } from '../../contracts/roles';
import { demoPassword } from '../../server/seed/demo-password';
import { launchBrowser, openPage, viewports, signInWith } from '../support/browser';
import { demoTeamVersions } from '../support/demo';
import type { VersionFixture } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';

const skipWeb = process.env.LOFTLINE_SKIP_WEB === '1';
const axeSource = fs.readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
const wcagTags = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];

let srv: TestServer;
let browser: Browser;
let signedOff: VersionFixture;
let draft: VersionFixture;

beforeAll(async () => {
  if (skipWeb) return;
  srv = await startTestServer();
  browser = await launchBrowser();
  [signedOff, draft] = await demoTeamVersions(srv, [
    { reviewState: 'signed_off', planName: 'Scan: signed-off bench' },
    { reviewState: 'in_review', planName: 'Scan: bench in review' },
  ]);
});
afterAll(async () => {
  await browser?.close();
  await srv?.stop();
});

interface Finding {
  screen: string;
  rule: string;
  impact: string;
  nodes: string[];
}

/** axe-core's findings on the page as it stands, critical and serious only. */
async function scan(page: Page, screen: string): Promise<Finding[]> {
  // Evaluated through the DevTools protocol, which the page's Content-Security-Policy does not govern.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(`${axeSource};0`);
  const violations = await page.evaluate(async (tags) => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: { id: string; impact: string; nodes: { target: string[]; html: string }[] }[] }> } }).axe;
    const r = await axe.run(document, { runOnly: { type: 'tag', values: tags }, resultTypes: ['violations'] });
    return r.violations.map((v) => ({ id: v.id, impact: v.impact, nodes: v.nodes.slice(0, 4).map((n) => `${n.target.join(' ')} ${n.html.slice(0, 160)}`) }));
  }, wcagTags);
  return violations.filter((v) => v.impact === 'critical' || v.impact === 'serious').map((v) => ({ screen, rule: v.id, impact: v.impact, nodes: v.nodes }));
}

/** Load a screen and wait until its main heading is up and the network is quiet. */
async function open(page: Page, url: string): Promise<void> {
  await page.goto(`${srv.url}${url}`);
  await page.waitForLoadState('networkidle');
  await page.locator('[role="heading"][aria-level="1"], h1').first().waitFor({ timeout: 20_000 });
  await page.waitForTimeout(150);
}

async function signIn(page: Page, role: Role): Promise<void> {
  await signInWith(page, srv.url, demoUsers.find((u) => u.role === role)!.email, demoPassword);
}

const v = () => `/projects/${draft.projectId}/plans/${draft.planId}/versions/${draft.versionId}`;
/** The screens each role works on (a pilot sees flights, not projects). */
function screensFor(role: Role | null): Record<string, string> {
  if (!role) return { 'sign-in': '/sign-in', 'sign-up': '/sign-up', invitation: '/invite/not-a-real-token', 'not found': '/no-such-page' };
  const common = { profile: '/profile', teams: '/teams', team: '/team', flights: '/flights', 'leg sheet': `/flights/${signedOff.versionId}` };
  if (role === 'pilot') return common;
  return {
    ...common,
    work: '/work',
    projects: '/projects',
    project: `/projects/${draft.projectId}`,
    site: `/projects/${draft.projectId}/sites/${draft.siteId}`,
    plan: `/projects/${draft.projectId}/plans/${draft.planId}`,
    results: v(),
    report: `${v()}/report`,
    ...(role === 'planner' || role === 'owner' ? { 'new plan': `/projects/${draft.projectId}/plans/new`, 'new site': `/projects/${draft.projectId}/sites/new` } : {}),
    ...(role === 'owner' ? { outbox: '/outbox' } : {}),
  };
}

describe.skipIf(skipWeb)('accessibility scan of every screen', () => {
  const roles: (Role | null)[] = [null, 'owner', 'planner', 'surveyor', 'pilot'];
  for (const [size, viewport] of Object.entries(viewports)) {
    for (const role of roles) {
      it(`${role ?? 'signed out'} at ${viewport.width}x${viewport.height}: no critical or serious axe finding, a title and a main landmark on every screen`, async () => {
        const { context, page, pageErrors } = await openPage(browser, viewport);
        const findings: Finding[] = [];
        const titles: Record<string, string> = {};
        try {
          if (role) await signIn(page, role);
          for (const [screen, url] of Object.entries(screensFor(role))) {
            await open(page, url);
            findings.push(...(await scan(page, `${size} ${role ?? 'signed out'} ${screen}`)));
            titles[screen] = await page.title();
            expect(await page.locator('[role="main"], main').count(), `${screen}: a main landmark`).toBeGreaterThan(0);
          }
        } finally {
          await context.close();
        }
        if (findings.length) console.log(JSON.stringify(findings, null, 1));
        expect(findings).toEqual([]);
        // Each screen names itself (not only the product), and no two screens share a title.
        for (const [screen, title] of Object.entries(titles)) expect(title, screen).toMatch(/^.+ · Loftline$/);
        expect(new Set(Object.values(titles)).size).toBe(Object.keys(titles).length);
        expect(pageErrors).toEqual([]);
      }, 240_000);
    }
  }
});

/** Debian's Chromium through playwright-core, headless, with a fresh profile (never a downloaded browser). */
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const screenshotDir = path.resolve('.artifacts', 'screenshots');

export async function launchBrowser(): Promise<Browser> {
  // playwright gives every launch a fresh temporary profile of its own.
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

export const viewports = {
  phone: { width: 390, height: 844 },
  wide: { width: 1440, height: 900 },
} as const;

/**
 * A fresh context (no cookies, empty localStorage) on `browser` that records uncaught page errors and, as errors
 * too, whatever the server's Content-Security-Policy made the browser refuse (Chromium reports it on the console).
 */
export async function openPage(
  browser: Browser,
  viewport: { width: number; height: number },
): Promise<{ context: BrowserContext; page: Page; pageErrors: string[] }> {
  const context = await browser.newContext({ viewport });
  const page = await context.newPage();
  const pageErrors: string[] = [];
  page.on('pageerror', (e) => pageErrors.push(e.message));
  page.on('console', (m) => {
    if (m.type() === 'error' && /Content Security Policy/i.test(m.text())) pageErrors.push(`CSP: ${m.text()}`);
  });
  return { context, page, pageErrors };
}

/**
 * Make the window as tall as the screen's content (the app scrolls inside its own container, not the document;
 * Chromium's limit is 16384 px) so a screenshot shows all of it; returns the function that restores the size.
 */
export async function growToContent(page: Page): Promise<() => Promise<void>> {
  const size = page.viewportSize()!;
  const contentPx = await page.evaluate(() => {
    let most = document.documentElement.scrollHeight;
    for (const el of Array.from(document.querySelectorAll<HTMLElement>('*'))) {
      const overflow = getComputedStyle(el).overflowY;
      if ((overflow === 'auto' || overflow === 'scroll') && el.scrollHeight > el.clientHeight + 1) {
        most = Math.max(most, el.scrollHeight + (window.innerHeight - el.clientHeight));
      }
    }
    return most;
  });
  await page.setViewportSize({ width: size.width, height: Math.min(16_000, Math.max(size.height, contentPx)) });
  await page.waitForTimeout(300);
  return () => page.setViewportSize(size);
}

/** Sign in through the sign-in screen at `baseUrl` and wait for the signed-in shell (its profile link). */
export async function signInWith(page: Page, baseUrl: string, email: string, password: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(password);
  await page.getByTestId('sign-in-submit').click();
  await page.getByTestId('nav-profile').waitFor();
}

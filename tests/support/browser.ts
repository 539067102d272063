/** Debian's Chromium driven by playwright-core (never a downloaded browser). */
import { mkdirSync } from 'node:fs';
import { chromium, type Browser, type Page } from 'playwright-core';
import { BASE_URL } from './env';

export const WIDTHS = { desktop: 1280, phone: 390 } as const;

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--disable-dev-shm-usage',
    ],
  });
}

/** Screenshots at desktop and phone width into the git-ignored screenshots/ folder. */
export async function screenshotBoth(page: Page, name: string): Promise<void> {
  mkdirSync('screenshots', { recursive: true });
  for (const [label, width] of Object.entries(WIDTHS)) {
    await page.setViewportSize({ width, height: 900 });
    await page.waitForTimeout(150);
    await page.screenshot({ path: `screenshots/${name}-${label}.png`, fullPage: true });
  }
  await page.setViewportSize({ width: WIDTHS.desktop, height: 900 });
}

/** Waits until every island on the page has hydrated (Astro drops the `ssr` attribute then). */
export async function hydrated(page: Page): Promise<void> {
  await page.waitForFunction(() => document.querySelectorAll('astro-island[ssr]').length === 0);
}

export async function signInThroughForm(page: Page, email: string, password: string): Promise<void> {
  await page.goto(`${BASE_URL}/sign-in`);
  await hydrated(page);
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => url.pathname.startsWith('/work'));
}

/** Collects console errors and failed requests to anything but our own server. */
export function watchPage(page: Page): { errors: string[]; foreign: string[] } {
  const seen = { errors: [] as string[], foreign: [] as string[] };
  page.on('console', (m) => m.type() === 'error' && seen.errors.push(m.text()));
  page.on('pageerror', (e) => seen.errors.push(e.message));
  page.on(
    'request',
    (r) => !r.url().startsWith(BASE_URL) && !r.url().startsWith('data:') && seen.foreign.push(r.url()),
  );
  return seen;
}

/**
 * The header as an admin (the longest menu) sees it: every item reachable on a phone through the menu, none hidden
 * sideways; screenshots at 1280 and 390 px.
 */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NAV } from '../../src/lib/nav';
import { hydrated, launchBrowser, signInThroughForm, watchPage } from '../support/browser';
import { BASE_URL } from '../support/env';
import { DEMO, DEMO_PASSWORD } from '../support/http';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe('navigation', () => {
  it('shows every item of the role at 1280 px and through the phone menu at 390 px, with the signed-in name', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.admin, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/admin/users`);
    await hydrated(page);
    const labels = NAV.filter((i) => i.roles === 'all' || i.roles.includes('admin')).map((i) => i.label);
    const main = page.getByRole('navigation', { name: 'Main', exact: true });
    for (const label of labels)
      await expect(main.getByRole('link', { name: label, exact: true }).isVisible()).resolves.toBe(true);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(1280);
    await page.screenshot({ path: 'screenshots/navigation-desktop.png' });

    await page.setViewportSize({ width: 390, height: 900 });
    await expect(main.isVisible()).resolves.toBe(false);
    await page.getByText('Menu ·').click();
    const phone = page.getByRole('navigation', { name: 'Menu', exact: true });
    for (const label of labels) {
      const link = phone.getByRole('link', { name: label, exact: true });
      await expect(link.isVisible()).resolves.toBe(true);
      const box = (await link.boundingBox())!;
      expect(box.x + box.width).toBeLessThanOrEqual(390);
    }
    await expect(phone.getByText('Signed in as').isVisible()).resolves.toBe(true);
    await expect(phone.getByRole('link', { name: 'Users', exact: true }).getAttribute('aria-current')).resolves.toBe(
      'page',
    );
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await page.screenshot({ path: 'screenshots/navigation-phone.png', fullPage: true });
    expect(seen.errors).toEqual([]);
    await page.close();
  });
});

/** The staff dashboard in a browser: charts load as they come into view, every chart has its table; screenshots at 1280 and 390 px. */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { BASE_URL } from '../support/env';
import { DEMO, DEMO_PASSWORD } from '../support/http';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe('/dashboard', () => {
  it('shows headroom, three charts with their tables, conditions and late proposals', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    const seen = watchPage(page);
    const anonymous = await page.goto(`${BASE_URL}/dashboard`);
    expect(new URL(anonymous!.url()).pathname).toBe('/sign-in');
    await signInThroughForm(page, DEMO.board, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/dashboard`);
    await expect(page.getByRole('heading', { name: 'Headroom' }).count()).resolves.toBe(1);
    await expect(page.getByText(/t CO2e left/).count()).resolves.toBe(1);
    // Charts load when they come into view.
    for (const id of ['changes', 'budget', 'ratios']) await page.locator(`#${id}`).scrollIntoViewIfNeeded();
    await hydrated(page);
    await page.locator('.recharts-surface').nth(2).waitFor();
    await expect(page.getByText('The same figures as a table').count()).resolves.toBe(3);
    await page.getByText('The same figures as a table').first().click();
    await expect(page.locator('details[open] table tbody tr').count()).resolves.toBeGreaterThan(3); // the demo history: 2021-2026
    await expect(page.getByRole('heading', { name: 'Conditions of approvals' }).count()).resolves.toBe(1);
    await expect(
      page
        .locator('td', { hasText: /Overdue \d+ d/ })
        .first()
        .isVisible(),
    ).resolves.toBe(true);
    await page.evaluate(() => window.scrollTo(0, 0));
    await screenshotBoth(page, 'dashboard');
    expect(seen.errors).toEqual([]);
    expect(seen.foreign).toEqual([]);
    await context.close();
  });
});

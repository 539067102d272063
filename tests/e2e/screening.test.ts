/** The screening map page as an assessor uses it: table sorted and filtered by level, the map, a recompute; screenshots at 1280 and 390 px. */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { api, DEMO, DEMO_PASSWORD, signIn } from '../support/http';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
  // The page shows the latest run; make sure one exists and is current.
  const assessor = await signIn(DEMO.assessor);
  const res = await api('POST', '/api/screening/recompute', { session: assessor });
  expect(res.status).toBe(200);
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await testDb.destroy();
});

const levelsShown = (page: import('playwright-core').Page) =>
  page
    .locator('tbody tr td:nth-child(3) [role="img"]')
    .evaluateAll((els) => els.map((e) => Number(/level (\d)/.exec(e.getAttribute('aria-label') ?? '')?.[1])));

describe('screening page', () => {
  it('lists screened parcels by level, filters by level, draws the map and recomputes on request', async () => {
    const expected = await testDb('screening_result').whereNotNull('level').count<{ count: string }[]>('* as count');
    expect(Number(expected[0]!.count)).toBeGreaterThan(0);
    const context = await browser.newContext();
    const page = await context.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.assessor, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/screening`);
    await hydrated(page);
    await expect(page.getByRole('heading', { name: 'Screening map', level: 1 }).count()).resolves.toBe(1);
    const levels = await levelsShown(page);
    expect(levels.length).toBeGreaterThan(0);
    // Sorted by level, highest first (the default).
    expect([...levels].sort((a, b) => b - a)).toEqual(levels);
    const top = levels[0]!;

    await page.getByLabel('Level if converted').selectOption(String(top));
    await page.waitForURL(new RegExp(`level=${top}`));
    await page.waitForFunction(() => !document.body.textContent?.includes('Loading…'));
    const filtered = await levelsShown(page);
    expect(filtered.length).toBeGreaterThan(0);
    expect(new Set(filtered)).toEqual(new Set([top]));
    const inDb = await testDb('screening_result').where({ level: top }).count<{ count: string }[]>('* as count');
    await expect(page.getByText(new RegExp(`of ${Number(inDb[0]!.count)}$`)).count()).resolves.toBe(1);

    await page.locator('.ol-viewport canvas').first().waitFor();
    await screenshotBoth(page, 'screening');
    const before = await testDb('screening_run').max<{ max: number }[]>('id as max');
    await page.getByRole('button', { name: 'Recompute now' }).click();
    await page.waitForLoadState('load');
    await hydrated(page);
    await expect
      .poll(async () => Number((await testDb('screening_run').max<{ max: number }[]>('id as max'))[0]!.max), {
        timeout: 60_000,
      })
      .toBeGreaterThan(Number(before[0]!.max));
    await page.getByText('recomputed on request').first().waitFor({ timeout: 60_000 });
    const width = await page.evaluate(() => document.documentElement.scrollWidth);
    expect(width).toBeLessThanOrEqual(1280);
    await page.setViewportSize({ width: 390, height: 900 });
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    expect(seen.errors).toEqual([]);
    expect(seen.foreign).toEqual([]);
    await context.close();
  });

  it('is not shown to anyone signed out', async () => {
    const res = await fetch(`${BASE_URL}/screening`, { redirect: 'manual' });
    expect([302, 303]).toContain(res.status);
  });
});

/** The calculator and factor-set pages as a person uses them; screenshots at 1280 and 390 px. */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL } from '../support/env';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { DEMO, DEMO_PASSWORD } from '../support/http';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

describe('carbon calculator', () => {
  it('an assessor estimates a ploughing of grassland and sees figures, chart, cautions and sources', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.assessor, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/calculator`);
    await hydrated(page);
    await screenshotBoth(page, 'calculator-empty');
    // Worked example 1 of tests/fixtures/worked-examples.ts: warm temperate moist, HAC, 1 ha, AR5 → 114.2 t CO2e.
    await page.getByLabel('IPCC climate region').selectOption('warm-temperate-moist');
    await page.getByLabel('Area, ha').fill('1');
    await page.getByRole('button', { name: 'Estimate' }).click();
    await page.getByText('Net emission').waitFor();
    await expect(page.locator('section').first().textContent()).resolves.toMatch(/114\.2 t CO2e/);
    await expect(page.getByText('Not a substitute for a site survey or soil sampling', { exact: false }).count()).resolves.toBeGreaterThan(0);
    await expect(page.getByText('Exploration only.').count()).resolves.toBe(1);
    // The warning names the unchecked values themselves, so no row marked "checked" is listed as unchecked.
    const warning = (await page.getByRole('note').filter({ hasText: 'Exploration only.' }).textContent())!;
    const checkedRows = await page.locator('tr', { has: page.getByText('✓ checked') }).locator('td:first-child span.block').allTextContents();
    for (const row of checkedRows) expect(warning).not.toContain(row);
    await page.locator('.recharts-line').first().waitFor();
    await screenshotBoth(page, 'calculator-result');
    expect(seen.errors).toEqual([]);
    expect(seen.foreign).toEqual([]);
    await context.close();
  });

  it('soil shares that do not add up are refused in the form, with the reason', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signInThroughForm(page, DEMO.planner, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/calculator`);
    await hydrated(page);
    await page.getByLabel('Share %').fill('80');
    await page.getByRole('button', { name: 'Estimate' }).click();
    await expect(page.getByText('Soil shares must add up to 100%', { exact: false }).count()).resolves.toBe(1);
    await context.close();
  });
});

describe('factor-set pages', () => {
  it('an admin sees the sets, a table with its source, and a comparison', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.admin, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/admin/factor-sets`);
    await expect(page.locator('h2 a').allTextContents()).resolves.toEqual(expect.arrayContaining([expect.stringMatching(/2006/), expect.stringMatching(/2019/)]));
    await screenshotBoth(page, 'factor-sets-list');
    await page.goto(`${BASE_URL}/admin/factor-sets/ipcc-2006`);
    await expect(page.locator('#soc-ref').textContent()).resolves.toMatch(/Table 2\.3/);
    await page.locator('#soc-ref summary').first().click();
    // One name per zone: the table's rows say "cool temperate", as the calculator's climate menu does.
    await expect(page.locator('#soc-ref table').textContent()).resolves.toMatch(/cool temperate moist · high-activity clay/);
    await expect(page.locator('#soc-ref table').textContent()).resolves.not.toMatch(/cold/i);
    await expect(page.locator('#grassland-stock-factors').textContent()).resolves.toMatch(/Partly checked: 15 of 35 values/);
    await screenshotBoth(page, 'factor-set-detail');
    await page.goto(`${BASE_URL}/admin/factor-sets/diff?a=ipcc-2006@1&b=ipcc-2019@1`);
    await expect(page.locator('main').textContent()).resolves.toMatch(/entries differ/);
    await screenshotBoth(page, 'factor-set-diff');
    expect(seen.errors).toEqual([]);
    await context.close();
  });
});

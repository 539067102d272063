/** The calculator and factor-set pages as a person uses them; screenshots at 1280 and 390 px. */
import { readFileSync } from 'node:fs';
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
    // Focus moves to the result, not back to the page.
    await expect(page.evaluate(() => document.activeElement?.id)).resolves.toBe('result-heading');
    // Shown to the place the 95% range supports (JCGM 100:2008 7.2.6), with the inputs restated.
    const headline = (await page.locator('section').first().textContent()) ?? '';
    expect(headline).toMatch(
      /Net emission of about [\d,]+ t CO2e \(95% range [\d,]+ to [\d,]+ t CO2e, 1000 Monte Carlo runs/,
    );
    expect(headline).not.toMatch(/114\.2/);
    await expect(page.getByRole('region', { name: 'What was estimated' }).textContent()).resolves.toMatch(
      /Warm temperate moist.*1\.00 ha/,
    );
    // The download carries the unrounded figures: worked example 1 → 114.2 t CO2e.
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Download (JSON)' }).click(),
    ]);
    const saved = JSON.parse(readFileSync((await download.path())!, 'utf8'));
    expect(saved.result.co2eTotal).toBeCloseTo(114.2, 1);
    expect(saved.inputs.Area).toBe('1.00 ha');
    expect(saved.request.areaHa).toBe(1);
    await expect(
      page.getByText('Not a substitute for a site survey or soil sampling', { exact: false }).count(),
    ).resolves.toBeGreaterThan(0);
    await expect(page.getByText('Exploration only.').count()).resolves.toBe(1);
    // The warning names the unchecked values themselves, so no row marked "checked" is listed as unchecked.
    const warning = (await page.getByRole('note').filter({ hasText: 'Exploration only.' }).textContent())!;
    const checkedRows = await page
      .locator('tr', { has: page.getByText('✓ checked') })
      .locator('td:first-child span.block')
      .allTextContents();
    for (const row of checkedRows) expect(warning).not.toContain(row);
    await page.locator('.recharts-line').first().waitFor();
    await expect(page.locator('.recharts-reference-area').count()).resolves.toBe(1);
    await screenshotBoth(page, 'calculator-result');
    await page.emulateMedia({ media: 'print' });
    await expect(page.getByRole('form', { name: 'Estimate inputs' }).isVisible()).resolves.toBe(false);
    await expect(page.locator('body > header').isVisible()).resolves.toBe(false);
    await page.screenshot({ path: 'screenshots/calculator-print.png', fullPage: true });
    await page.emulateMedia({ media: 'screen' });
    expect(seen.errors).toEqual([]);
    expect(seen.foreign).toEqual([]);
    await context.close();
  });

  it('added soil rows stay inside their panel at 1280 and 390 px', async () => {
    const context = await browser.newContext({ viewport: { width: 390, height: 900 } });
    const page = await context.newPage();
    await signInThroughForm(page, DEMO.planner, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/calculator`);
    await hydrated(page);
    await page.getByRole('button', { name: 'Add a soil class' }).click();
    await page.getByRole('button', { name: 'Add a soil class' }).click();
    await page.getByLabel('Soil class 3', { exact: true }).selectOption('organic');
    for (const width of [390, 1280]) {
      await page.setViewportSize({ width, height: 900 });
      const panel = (await page.getByRole('group', { name: 'Soils under the area' }).boundingBox())!;
      for (const el of await page
        .getByRole('group', { name: 'Soils under the area' })
        .locator('select, input, button')
        .all()) {
        const box = (await el.boundingBox())!;
        expect(box.x + box.width, `${width} px`).toBeLessThanOrEqual(panel.x + panel.width);
      }
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(width);
    }
    await screenshotBoth(page, 'calculator-soils');
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
    await expect(page.locator('h2 a').allTextContents()).resolves.toEqual(
      expect.arrayContaining([expect.stringMatching(/2006/), expect.stringMatching(/2019/)]),
    );
    await screenshotBoth(page, 'factor-sets-list');
    await page.goto(`${BASE_URL}/admin/factor-sets/ipcc-2006`);
    await expect(page.locator('#soc-ref').textContent()).resolves.toMatch(/Table 2\.3/);
    await page.locator('#soc-ref summary').first().click();
    // One name per zone: the table's rows say "cool temperate", as the calculator's climate menu does.
    await expect(page.locator('#soc-ref table').textContent()).resolves.toMatch(
      /cool temperate moist · high-activity clay/,
    );
    await expect(page.locator('#soc-ref table').textContent()).resolves.not.toMatch(/cold/i);
    await expect(page.locator('#grassland-stock-factors').textContent()).resolves.toMatch(
      /Partly checked: 15 of 35 values/,
    );
    await screenshotBoth(page, 'factor-set-detail');
    await page.goto(`${BASE_URL}/admin/factor-sets/diff?a=ipcc-2006@1&b=ipcc-2019@1`);
    await expect(page.locator('main').textContent()).resolves.toMatch(/entries differ/);
    await screenshotBoth(page, 'factor-set-diff');
    expect(seen.errors).toEqual([]);
    await context.close();
  });
});

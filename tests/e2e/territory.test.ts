/**
 * The admin's territory page: the default territory on the map, a new one pasted as GeoJSON
 * and saved, and the check switched off. Screenshots at 1280 and 390 px go to screenshots/.
 */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { DEMO, DEMO_PASSWORD } from '../support/http';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await testDb('app_setting').where({ key: 'territory' }).delete();
  await browser?.close();
  await testDb.destroy();
});

describe('territory admin page', () => {
  it('shows the default, saves a pasted polygon and switches the check off', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.admin, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/admin/territory`);
    await hydrated(page);
    await expect
      .poll(() => page.getByTestId('territory-source').textContent(), { timeout: 20_000 })
      .toMatch(/^Not set, so the default applies: the area of the current reference layers widened by 0\.05°/);
    await page.locator('.ol-viewport canvas').first().waitFor();
    await page.waitForTimeout(800);
    await screenshotBoth(page, 'territory-1-default');
    const box = {
      type: 'Polygon',
      coordinates: [
        [
          [-16.2, 52.3],
          [-15.9, 52.3],
          [-15.9, 52.45],
          [-16.2, 52.45],
          [-16.2, 52.3],
        ],
      ],
    };
    await page.getByLabel(/New territory/).fill(JSON.stringify(box));
    await page.getByRole('button', { name: 'Save territory' }).click();
    await expect.poll(() => page.getByRole('status').textContent(), { timeout: 15_000 }).toBe('Territory saved.');
    expect(await page.getByTestId('territory-source').textContent()).toBe('Set by an administrator.');
    await page.waitForTimeout(500);
    await screenshotBoth(page, 'territory-2-saved');
    await page.getByLabel(/New territory/).fill('{"type": "Polygon"');
    await page.getByRole('button', { name: 'Save territory' }).click();
    await expect.poll(() => page.getByRole('alert').textContent()).toMatch(/^This is not JSON/);
    await page.getByRole('button', { name: 'Switch the check off' }).click();
    await expect
      .poll(() => page.getByTestId('territory-source').textContent(), { timeout: 15_000 })
      .toMatch(/^Switched off/);
    expect(seen.errors).toEqual([]);
  });
});

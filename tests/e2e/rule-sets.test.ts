/** An admin copies the shipped rule set, changes a threshold with a reason, publishes and compares; screenshots at 1280 and 390 px. */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { DEMO, DEMO_PASSWORD } from '../support/http';

let browser: Browser;
const id = `tarrow-browser-${Date.now().toString(36)}`;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await testDb.destroy();
});

describe('rule-set pages', () => {
  it('an admin copies, edits with a reason, publishes and compares', async () => {
    const page = await browser.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.admin, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/admin/rule-sets`);
    await hydrated(page);
    await expect(
      page.getByRole('img', { name: 'Risk level 4 of 4: Barred unless cleared' }).first().isVisible(),
    ).resolves.toBe(true);
    await expect(page.getByText('Skarrow district').first().isVisible()).resolves.toBe(true);
    await screenshotBoth(page, 'rule-sets-list');

    await page.getByLabel('New rule-set id (lower-case, hyphens)').fill(id);
    await page.getByLabel('Title', { exact: true }).fill('Upper Tarrow rules, browser copy');
    await page.getByLabel('Description', { exact: true }).fill('Copy made in the browser test');
    await page
      .getByLabel('Why a new rule set is needed (recorded in the audit log)')
      .fill('Testing the copy, edit and publish pages.');
    await page.getByRole('button', { name: 'Copy into a new rule set' }).click();
    await page.waitForURL((u) => u.pathname === `/admin/rule-sets/${id}`);
    await hydrated(page);

    const rule = page.locator('section#soc-loss-10');
    await rule.getByText('Change this rule').click();
    await rule.getByLabel('aboveTonnesCPerHa').fill('12');
    await rule
      .getByLabel('Reason for the change and its source (recorded with the edit)')
      .fill('Board minute 2026/15: 12 t C/ha');
    await rule.getByRole('button', { name: 'Save the change to the draft' }).click();
    await page.locator('section#soc-loss-10').getByText('above 12 t C/ha').waitFor({ timeout: 15_000 });
    await screenshotBoth(page, 'rule-set-draft');

    await hydrated(page);
    await page.getByLabel(/What this version changes/).fill('Carbon threshold 12 t C/ha');
    await page.getByRole('button', { name: 'Publish this draft' }).click();
    await page.getByRole('heading', { level: 1, name: /v1 · published/ }).waitFor({ timeout: 15_000 });

    await page.goto(`${BASE_URL}/admin/rule-sets/diff?a=tarrow-screening@1&b=${id}@1`);
    await expect(page.getByText('1 rule differ').isVisible()).resolves.toBe(true);
    await expect(page.locator('td code', { hasText: 'soc-loss-10' }).isVisible()).resolves.toBe(true);
    await screenshotBoth(page, 'rule-set-diff');
    expect(seen.foreign).toEqual([]);
    expect(seen.errors).toEqual([]);
    await page.close();
  });

  it('an assessor reads the rules but gets no editing controls', async () => {
    const page = await browser.newPage();
    await signInThroughForm(page, DEMO.assessor, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/admin/rule-sets/tarrow-screening`);
    await expect(
      page.getByText('Regulation (EU) 2021/2115, Annex III, GAEC 9', { exact: false }).first().isVisible(),
    ).resolves.toBe(true);
    await expect(page.getByText('Change this rule').count()).resolves.toBe(0);
    await screenshotBoth(page, 'rule-set-shipped');
    await page.close();
  });
});

/** The public register as a member of the public reads it, without signing in; screenshots at 1280 and 390 px. */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { decidedProposal } from '../support/board';
import { hydrated, launchBrowser, screenshotBoth, watchPage } from '../support/browser';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { DEMO, signIn } from '../support/http';
import { APPLICANT } from '../support/proposals';

let browser: Browser;
let seq: number, reference: string;
beforeAll(async () => {
  browser = await launchBrowser();
  const [planner, assessor, board, chair] = await Promise.all(
    [DEMO.planner, DEMO.assessor, DEMO.board, DEMO.chair].map((e) => signIn(e)),
  );
  await testDb('app_setting').where({ key: 'board.quorum' }).delete();
  const d = await decidedProposal(
    { planner: planner!, assessor: assessor!, board: board!, chair: chair! },
    'approved-with-conditions',
  );
  [seq, reference] = [d.seq, d.proposal.reference];
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await testDb.destroy();
});

describe('public register pages', () => {
  it('lists, filters, verifies the chain and shows an entry with its outline, head hash and no personal data', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    const seen = watchPage(page);
    await page.goto(`${BASE_URL}/register`);
    await hydrated(page);
    await page.getByText('Chain intact.').waitFor();
    const head = await testDb('register_entry').orderBy('seq', 'desc').first();
    await expect(page.getByText(head.hash).count()).resolves.toBe(1);
    await screenshotBoth(page, 'register-list');
    await page.getByLabel('Reference or title').fill(reference);
    await page.getByRole('button', { name: 'Search' }).click();
    await page.waitForURL(/q=/);
    await expect(page.locator('tbody tr').count()).resolves.toBe(1);
    await page.getByRole('link', { name: reference }).click();
    await page.waitForURL(`${BASE_URL}/register/${seq}`);
    // The map over the public register tiles replaces the outline once it has drawn.
    await page.locator('div[role="region"][data-ready="true"] canvas').first().waitFor();
    await expect(page.locator('#entry-outline').isHidden()).resolves.toBe(true);
    await expect(page.getByText('Keep a 6 m grass margin along the watercourse.').count()).resolves.toBe(1);
    // This entry is the head: its hash shows in its own hashes and in the head panel.
    await expect(page.locator('aside[aria-labelledby="head-hash"]').getByText(head.hash).count()).resolves.toBe(1);
    await screenshotBoth(page, 'register-entry');
    const html = await page.content();
    for (const secret of [APPLICANT.name, APPLICANT.contact, 'HLD-TEST-77', 'Rennick Hale', 'Oona Vetch'])
      expect(html).not.toContain(secret);
    expect(seen.errors).toEqual([]);
    expect(seen.foreign).toEqual([]);
    const missing = await page.goto(`${BASE_URL}/register/999999`);
    expect(missing?.status()).toBe(404);
    await context.close();
  });

  it('without JavaScript the entry shows its SVG outline; at 390 px the list is cards', async () => {
    const context = await browser.newContext({ javaScriptEnabled: false });
    const page = await context.newPage();
    await page.goto(`${BASE_URL}/register/${seq}`);
    await expect(page.locator('#entry-outline path[stroke]').count()).resolves.toBeGreaterThan(0);
    await expect(page.locator('#entry-outline').isVisible()).resolves.toBe(true);
    await context.close();
    const phone = await browser.newContext({ viewport: { width: 390, height: 900 } });
    const p = await phone.newPage();
    await p.goto(`${BASE_URL}/register`);
    await expect(p.locator('ol[aria-label="Register entries"] > li').first().isVisible()).resolves.toBe(true);
    await expect(p.locator('table').first().isVisible()).resolves.toBe(false);
    const width = await p.evaluate(() => document.documentElement.scrollWidth);
    expect(width).toBeLessThanOrEqual(390);
    await phone.close();
  });
});

/**
 * The follow-ups page as an assessor uses it: overdue first and flagged in words, outcome (no script), evidence
 * (island), 409 shown; screenshots at 1280 and 390 px.
 */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addDays } from '~/lib/proposals/states';
import { decidedProposal, today } from '../support/board';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { DEMO, DEMO_PASSWORD, signIn } from '../support/http';

let browser: Browser;
let reference: string, overdueId: number;
// PNG (ISO/IEC 15948): signature, then an IHDR chunk of 1 x 1 pixels.
const png = Buffer.from([
  0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1, 0, 0, 0, 1, 8, 2, 0,
  0, 0, 0x90, 0x77, 0x53, 0xde, 0, 0, 0, 0,
]);

beforeAll(async () => {
  browser = await launchBrowser();
  const [planner, assessor, board, chair] = await Promise.all(
    [DEMO.planner, DEMO.assessor, DEMO.board, DEMO.chair].map((e) => signIn(e)),
  );
  const d = await decidedProposal(
    { planner: planner!, assessor: assessor!, board: board!, chair: chair! },
    'approved-with-conditions',
  );
  reference = d.proposal.reference;
  const t = await testDb('follow_up_task').where({ proposal_id: d.proposal.id, kind: 'condition' }).first();
  overdueId = Number(t.id);
  await testDb('follow_up_task')
    .where({ id: overdueId })
    .update({ due_date: addDays(today(), -12) });
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await testDb.destroy();
});

describe('follow-ups page', () => {
  it('lists overdue tasks first with a written flag, records an outcome, adds evidence and shows a stale edit as refused', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.assessor, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/follow-ups`);
    await hydrated(page);
    const first = page.locator('ol > li').first();
    await expect(first.getByText(/⚠ Overdue by \d+ days?/).count()).resolves.toBe(1);
    await expect(page.getByText(/open tasks? (is|are) overdue/).count()).resolves.toBe(1);
    await screenshotBoth(page, 'follow-ups-list');

    await page.goto(`${BASE_URL}/follow-ups?reference=${reference}`);
    await hydrated(page);
    const card = page.locator(`#task-${overdueId}`);
    await expect(card.getByText('⚠ Overdue by 12 days', { exact: false }).count()).resolves.toBe(1);
    await card.getByText('Record the outcome or add evidence').click();
    // Someone else records an outcome meanwhile: this form's version is now stale.
    await testDb('follow_up_task')
      .where({ id: overdueId })
      .update({ version: testDb.raw('version + 1') });
    await card.getByLabel('Not done').check();
    await card.getByLabel(/What was found/).fill('No margin along the watercourse at the visit.');
    await card.getByRole('button', { name: 'Save outcome' }).click();
    await page.waitForLoadState('load');
    await expect(
      page
        .locator(`#task-${overdueId}`)
        .getByRole('alert')
        .getByText(/Someone else recorded an outcome/)
        .count(),
    ).resolves.toBe(1);

    await page.goto(`${BASE_URL}/follow-ups?reference=${reference}`);
    await hydrated(page);
    const fresh = page.locator(`#task-${overdueId}`);
    await fresh.getByText('Record the outcome or add evidence').click();
    await fresh.getByLabel('Not done').check();
    await fresh.getByLabel(/What was found/).fill('No margin along the watercourse at the visit.');
    await fresh.getByRole('button', { name: 'Save outcome' }).click();
    await page.waitForURL(/saved=/);
    const saved = page.locator(`#task-${overdueId}`);
    await expect(saved.getByText('✗ Not done', { exact: false }).count()).resolves.toBeGreaterThan(0);
    expect((await testDb('follow_up_task').where({ id: overdueId }).first()).status).toBe('not-done');

    await saved.getByText('Change the outcome or add evidence').click();
    await saved
      .getByLabel(/Add evidence/)
      .setInputFiles({ name: 'watercourse.png', mimeType: 'image/png', buffer: png });
    await saved.getByRole('button', { name: 'Add evidence', exact: true }).click();
    await page.waitForURL(/added=/);
    await expect(
      page.locator(`#task-${overdueId}`).getByRole('link', { name: 'watercourse.png' }).count(),
    ).resolves.toBe(1);
    await page.locator(`#task-${overdueId}`).getByText('Change the outcome or add evidence').click();
    await screenshotBoth(page, 'follow-ups-task');
    // The stale save answers 409 on purpose (the browser logs that status); nothing else may fail.
    expect(seen.errors.filter((e) => !/status of 409/.test(e))).toEqual([]);
    expect(seen.errors.filter((e) => /status of 409/.test(e))).toHaveLength(1);
    expect(seen.foreign).toEqual([]);
    await context.close();
  }, 120_000);

  it('the public register shows the demo reversed compensation with the entry it takes back', async () => {
    const reversal = await testDb('register_entry')
      .whereRaw("content->>'kind' = 'compensation-reversed'")
      .orderBy('seq')
      .first();
    expect(reversal).toBeDefined();
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.goto(`${BASE_URL}/register/${reversal.seq}`);
    await hydrated(page);
    const credited = reversal.content.reverses.seq;
    await expect(page.getByText(`takes back the compensation credited in`, { exact: false }).count()).resolves.toBe(1);
    await expect(page.getByRole('link', { name: `entry ${credited}`, exact: true }).count()).resolves.toBeGreaterThan(
      0,
    );
    await screenshotBoth(page, 'register-compensation-reversed');
    await page.goto(`${BASE_URL}/register/${credited}`);
    await expect(page.getByText(/t CO2e credited against this approval/).count()).resolves.toBe(1);
    await context.close();
  });

  it('is for the people who check and decide: a planner is refused', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signInThroughForm(page, DEMO.planner, DEMO_PASSWORD);
    const res = await page.goto(`${BASE_URL}/follow-ups`);
    expect(res?.status()).toBe(403);
    await context.close();
  });
});

/**
 * The board through its pages: the chair builds an agenda, orders it (a stale order shows the 409
 * in words), two members vote, the chair records the decision, and the entry shows on the public
 * register with an intact chain. Screenshots at 1280 and 390 px; nothing wider than the phone.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { assessedProposal } from '../support/board';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { api, DEMO, DEMO_PASSWORD, signIn, type Session } from '../support/http';
import { APPLICANT } from '../support/proposals';

let browser: Browser;
let chairApi: Session;
let a: { id: number; reference: string }, b: { id: number; reference: string };
const OWNER = 'HLD-E2E-3307';
beforeAll(async () => {
  browser = await launchBrowser();
  const [planner, assessor, chair] = await Promise.all([DEMO.planner, DEMO.assessor, DEMO.chair].map((e) => signIn(e)));
  chairApi = chair!;
  await testDb('app_setting').where({ key: 'board.quorum' }).delete();
  a = await assessedProposal(planner!, assessor!, OWNER);
  b = await assessedProposal(planner!, assessor!, OWNER);
}, 180_000);
afterAll(async () => {
  await browser?.close();
  await testDb.destroy();
});

async function as(
  email: string,
): Promise<{ page: Page; seen: ReturnType<typeof watchPage>; close: () => Promise<void> }> {
  const context = await browser.newContext();
  const page = await context.newPage();
  const seen = watchPage(page);
  await signInThroughForm(page, email, DEMO_PASSWORD);
  return { page, seen, close: () => context.close() };
}

/** Nothing on the page is wider than a 390 px phone. */
async function fitsPhone(page: Page): Promise<void> {
  await page.setViewportSize({ width: 390, height: 900 });
  await page.waitForTimeout(150);
  const wide = await page.evaluate(() => document.documentElement.scrollWidth);
  expect(wide).toBeLessThanOrEqual(390);
  await page.setViewportSize({ width: 1280, height: 900 });
}

async function reload(page: Page): Promise<void> {
  await page.waitForLoadState('load');
  await hydrated(page);
}

describe('the board pages', () => {
  it('chair builds and orders the agenda, members vote, the chair decides, the register shows the entry', async () => {
    const chair = await as(DEMO.chair);
    const { page } = chair;
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Board', exact: true }).click();
    await page.waitForURL(`${BASE_URL}/board`);
    await hydrated(page);
    await page.getByLabel('Place').fill('Tarrow Hall, council room');
    await page.getByLabel(new RegExp(a.reference)).check();
    await page.getByLabel(new RegExp(b.reference)).check();
    await page.getByRole('button', { name: `Move ${b.reference} up` }).click();
    await page.getByRole('button', { name: 'Create the meeting' }).click();
    await page.waitForURL(/\/board\/meetings\/\d+$/);
    await reload(page);
    const meetingId = Number(new URL(page.url()).pathname.split('/').pop());
    // Deferred items left by other tests are carried in first; ours keep the order chosen.
    const ours = async () =>
      (await page.locator('article h2').allTextContents())
        .map((t) =>
          t
            .replace(/\s+/g, ' ')
            .trim()
            .replace(/^\d+\. /, '')
            .slice(0, a.reference.length),
        )
        .filter((r) => [a.reference, b.reference].includes(r));
    expect(await ours()).toEqual([b.reference, a.reference]);

    // Order it again: a second page of the chair, still at the old version, gets the 409 in words.
    const stale = await chair.page.context().newPage();
    await stale.goto(page.url());
    await hydrated(stale);
    await page.getByRole('button', { name: `Move ${a.reference} up` }).click();
    await Promise.all([page.waitForEvent('load'), page.getByRole('button', { name: 'Save the order' }).click()]);
    await reload(page);
    await expect.poll(ours, { timeout: 20_000 }).toEqual([a.reference, b.reference]);
    await stale.getByRole('button', { name: `Move ${a.reference} up` }).click();
    await stale.getByRole('button', { name: 'Save the order' }).click();
    await stale.getByText(/Not done: The agenda was changed by someone else/).waitFor();
    await stale.close();

    const m = (await api('GET', `/api/meetings/${meetingId}`, { session: chairApi })).body;
    const itemA = m.items.find((i: { proposalId: number }) => i.proposalId === a.id).id as number;
    const article = page.getByTestId(`item-${itemA}`);
    await expect(article.getByText(/Statutory clock: /).count()).resolves.toBe(1);
    await expect(article.getByRole('img', { name: /Risk level [1-4] of 4/ }).count()).resolves.toBeGreaterThan(0);
    await expect(article.getByTestId(`impact-${itemA}`).textContent()).resolves.toMatch(/budget/);
    await expect(article.getByTestId(`quorum-${itemA}`).textContent()).resolves.toMatch(
      /No quorum yet: 0 eligible votes/,
    );
    await screenshotBoth(page, 'board-meeting');
    await fitsPhone(page);
    await page.goto(`${BASE_URL}/board`);
    await screenshotBoth(page, 'board-list');
    await fitsPhone(page);

    // Two members vote through the page: the board member, then the chair (who is a member too).
    const member = await as(DEMO.board);
    await member.page.goto(`${BASE_URL}/board/meetings/${meetingId}`);
    await hydrated(member.page);
    const mine = member.page.getByTestId(`item-${itemA}`);
    await mine.getByRole('radio', { name: 'Approve with conditions' }).check();
    await mine.getByLabel(/Comment/).fill('Margin along the brook is essential.');
    await mine.getByRole('button', { name: 'Record my vote' }).click();
    await member.page.getByTestId(`tally-${itemA}`).filter({ hasText: '1 approve with conditions' }).waitFor();
    expect(member.seen.errors).toEqual([]);
    await member.close();

    await page.goto(`${BASE_URL}/board/meetings/${meetingId}`);
    await hydrated(page);
    await article.getByRole('radio', { name: 'Approve with conditions' }).check();
    await article.getByRole('button', { name: 'Record my vote' }).click();
    await page.getByTestId(`tally-${itemA}`).filter({ hasText: '2 approve with conditions' }).waitFor();
    await reload(page);
    await expect(article.getByTestId(`quorum-${itemA}`).textContent()).resolves.toMatch(
      /Quorum reached: 2 eligible votes, 2 needed/,
    );

    // The chair records the decision.
    await article.getByLabel('Outcome').selectOption('approved-with-conditions');
    await article.getByLabel(/Reasons/).fill('The margin protects the brook; the loss is within the budget.');
    await article.getByLabel('Condition 1').fill('Keep a 6 m grass margin along the brook.');
    await article.getByLabel('Due').fill('2027-09-30');
    await article.getByLabel('Checked by').fill('Field officer');
    await article.getByRole('button', { name: 'Record the decision' }).click();
    await page.getByTestId(`decision-${itemA}`).waitFor();
    await screenshotBoth(page, 'board-decided');
    const link = page.getByTestId(`decision-${itemA}`).getByRole('link', { name: /register entry \d+/ });
    const seq = Number((await link.textContent())!.match(/\d+/)![0]);
    expect(chair.seen.errors).toEqual([]);
    expect(chair.seen.foreign).toEqual([]);
    await chair.close();

    // The public register, without signing in: the entry, its notice link and an intact chain.
    const pub = await browser.newContext();
    const reader = await pub.newPage();
    await reader.goto(`${BASE_URL}/register/${seq}`);
    await reader.getByText('Keep a 6 m grass margin along the brook.').waitFor();
    await expect(reader.getByRole('link', { name: 'Decision notice (PDF)' }).getAttribute('href')).resolves.toBe(
      `/api/register/${seq}/notice.pdf`,
    );
    await screenshotBoth(reader, 'board-register-entry');
    await fitsPhone(reader);
    const html = await reader.content();
    for (const secret of [
      APPLICANT.name,
      APPLICANT.contact,
      OWNER,
      'Margin along the brook is essential.',
      'Rennick Hale',
    ])
      expect(html).not.toContain(secret);
    await reader.goto(`${BASE_URL}/register`);
    await hydrated(reader);
    await reader.getByText('Chain intact.').waitFor();
    await expect(reader.getByRole('link', { name: a.reference }).count()).resolves.toBeGreaterThan(0);
    await screenshotBoth(reader, 'board-register');
    await fitsPhone(reader);
    await pub.close();
  }, 240_000);
});

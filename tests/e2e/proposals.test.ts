/**
 * A proposal from filing to sign-off in the browser: the demo planner files one on a demo
 * parcel (drawn in free ground of the demo region) through the form (found by reference) and submits it; the demo assessor opens it,
 * runs the assessment, reads the alternatives and the grade's reasons, writes findings and signs
 * off. Screenshots at 1280 and 390 px of the list, the form, the proposal and the assessment
 * go to screenshots/, and no page is wider than the phone screen.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { DEMO, DEMO_PASSWORD, signIn } from '../support/http';
import { allowSignOff, drawParcel } from '../support/proposals';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
  await allowSignOff();
});
let url = '';
afterAll(async () => {
  await testDb('app_setting').where({ key: 'assessment.allow-unconfirmed-sign-off' }).delete();
  await browser?.close();
});

/**
 * A grassland parcel in the demo region, drawn for this test in free ground (cool temperate moist, HAC soil).
 * A signed assessment cannot be deleted, and other browser tests re-upload the demo parcels, so the
 * proposal must not hold one of theirs.
 */
async function demoGrassParcel(): Promise<string> {
  const id = await drawParcel(await signIn(DEMO.planner));
  return (await testDb('parcel').where({ id }).first()).reference as string;
}

/** Nothing on the page is wider than a 390 px phone. */
async function fitsPhone(page: Page): Promise<void> {
  await page.setViewportSize({ width: 390, height: 900 });
  await page.waitForTimeout(150);
  const wide = await page.evaluate(() => document.documentElement.scrollWidth);
  await page.setViewportSize({ width: 1280, height: 900 });
  expect(wide, `page ${page.url()} is wider than the phone`).toBeLessThanOrEqual(390);
}

describe('proposals in the browser', () => {
  it('a planner files a proposal on a demo parcel through the form, meets a stale edit, and submits it', async () => {
    const reference = await demoGrassParcel();
    const planner = await browser.newContext();
    const page = await planner.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.planner, DEMO_PASSWORD);
    await page.getByRole('link', { name: 'Proposals', exact: true }).first().click();
    await page.waitForURL(`${BASE_URL}/proposals`);
    await hydrated(page);
    await page.getByRole('link', { name: 'File a proposal' }).click();
    await page.getByLabel('Title').waitFor();
    await page.getByRole('button', { name: 'Save as draft' }).click();
    // The API's own schema speaks in the form: its 422 issues are shown beside the fields.
    await page.getByText('Give the proposal a title (at least 3 characters).').waitFor();
    await expect(page.getByText('Give the proposal a title (at least 3 characters).').count()).resolves.toBe(1);
    await expect(page.getByText('Name at least one parcel.').count()).resolves.toBe(1);
    await page.getByLabel('Title').fill('Plough the lower pasture for spring barley');
    await page
      .getByLabel('Description of the proposed change')
      .fill('Convert the permanent pasture to an arable rotation with spring barley.');
    await page.getByLabel('Start year').fill('2027');
    await page.getByLabel('Land use').selectOption('cropland');
    await page.getByLabel('Tillage (IPCC F_MG)').selectOption('full');
    await page.getByLabel('Name', { exact: true }).fill('Wren Applicant-Demo');
    await page.getByLabel('Contact (postal address, e-mail or telephone)').fill('wren@holdings.example');
    await page.getByLabel('Interest in the land').selectOption('tenant');
    await page.getByLabel('Add a parcel by reference or field name').fill(reference);
    await page.getByRole('list', { name: 'Matching parcels' }).getByRole('button').first().click();
    await expect(page.getByRole('list', { name: 'Chosen parcels' }).textContent()).resolves.toContain(reference);
    await page.waitForTimeout(600); // the chosen parcel's outline is drawn and the map fits to it
    await screenshotBoth(page, 'proposal-form');
    await fitsPhone(page);
    await page.getByRole('button', { name: 'Save as draft' }).click();
    await page.waitForURL(/\/proposals\/\d+$/);
    url = page.url();
    await expect(page.getByTestId('proposal-state').textContent()).resolves.toBe('Draft');
    await expect(page.locator('main').textContent()).resolves.toContain('Wren Applicant-Demo');
    const proposalRef = (await page.locator('h1').textContent())!.split(' · ')[0]!;

    // Two tabs on the same draft: the second save is refused with "someone else changed it", nothing overwritten.
    const other = await planner.newPage();
    for (const p of [page, other]) await p.goto(`${url}/edit`);
    await other.getByLabel('Title').fill('Plough the lower pasture for winter wheat');
    await other.getByRole('button', { name: 'Save changes' }).click();
    await other.waitForURL(url);
    await page.getByLabel('Title').fill('A title that must not overwrite the other change');
    await page.getByRole('button', { name: 'Save changes' }).click();
    await page.getByText('Someone else changed this proposal while you were editing it.').waitFor();
    await other.close();
    await page.goto(url);
    await expect(page.locator('h1').textContent()).resolves.toContain('winter wheat');

    await hydrated(page);
    await page.getByRole('button', { name: 'Submit for assessment' }).click();
    await page.getByText('Submitted', { exact: true }).waitFor();
    await expect(page.locator('main').textContent()).resolves.toMatch(/\d+ days left/);

    // The list, filtered on the server by state, shows it with its clock.
    await page.goto(`${BASE_URL}/proposals`);
    await hydrated(page);
    await page.getByLabel('State').selectOption('submitted');
    await page.waitForFunction(() => window.location.search.includes('state=submitted'));
    await page.locator('table tbody tr', { hasText: proposalRef }).waitFor();
    await expect(page.locator('table tbody').textContent()).resolves.toMatch(/\d+ days left/);
    await screenshotBoth(page, 'proposals-list');
    await fitsPhone(page);
    // The browser logs the refused stale save (409) as a failed load; nothing else may go wrong.
    // The browser logs the refused empty form (422) and the stale edit (409), nothing else.
    expect(seen.errors.filter((e) => !/status of (409 \(Conflict\)|422)/.test(e))).toEqual([]);
    expect(seen.errors.length).toBe(2);
    expect(seen.foreign).toEqual([]);
    await planner.close();
  }, 150_000);

  it('an assessor runs the assessment, reads the alternatives and the reasons, writes findings and signs off', async () => {
    expect(url).toMatch(/\/proposals\/\d+$/);
    const assessor = await browser.newContext();
    const page = await assessor.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.assessor, DEMO_PASSWORD);
    await page.goto(url);
    await hydrated(page);
    await page.locator('.ol-viewport canvas').first().waitFor();
    await screenshotBoth(page, 'proposal-page');
    await fitsPhone(page);
    await page.getByRole('button', { name: 'Start the assessment' }).click();
    await page.waitForURL(/\/assessments\/\d+$/);
    await hydrated(page);
    // Alternatives side by side, each with its figure and its difference from the proposal.
    const alternatives = page.locator('section', {
      has: page.getByRole('heading', { name: 'Alternatives side by side' }),
    });
    for (const name of ['Keep as it is', 'No tillage', 'Reduced tillage'])
      await expect(alternatives.getByText(name, { exact: false }).count()).resolves.toBeGreaterThan(0);
    await expect(alternatives.textContent()).resolves.toMatch(/−[\d,.]+ t CO2e/);
    // The grade, by shape and words, with its reasons and their citations.
    const reasons = page.getByRole('list', { name: 'Reasons for the grade' });
    const grade = page.locator('section', { has: page.getByRole('heading', { name: 'Risk grade' }) });
    await expect(grade.getByRole('img', { name: /Risk level \d of 4/ }).count()).resolves.toBeGreaterThan(0);
    if (await reasons.count()) await expect(reasons.textContent()).resolves.toContain('Citation:');
    await expect(page.getByText('Davidson & Ackerman', { exact: false }).count()).resolves.toBe(1);
    await expect(page.getByText('licensed professionals', { exact: false }).count()).resolves.toBeGreaterThan(0);
    await screenshotBoth(page, 'assessment-draft');
    await fitsPhone(page);
    await page
      .getByLabel('Findings (what the board reads with the figures)')
      .fill('Tier 1 figures checked against the soil map; the grade stands. Recommend the no-tillage alternative.');
    await page.getByRole('button', { name: 'Save findings' }).click();
    await page.getByText('Findings saved.').waitFor();
    await page.getByRole('button', { name: 'Sign off assessment' }).click();
    await page.getByText('This version is frozen and read-only.', { exact: false }).waitFor();
    await expect(page.getByRole('button', { name: 'Sign off assessment' }).count()).resolves.toBe(0);
    await expect(page.locator('main').textContent()).resolves.toContain('Recommend the no-tillage alternative.');
    await screenshotBoth(page, 'assessment-signed');
    await page.goto(url);
    await expect(page.getByTestId('proposal-state').textContent()).resolves.toBe('Assessed (signed off)');

    // Reopening (with a reason) and running a second version; the two compared side by side.
    await hydrated(page);
    await page.getByRole('button', { name: 'Reopen the assessment' }).click();
    await page.getByLabel(/Reason for .Reopen the assessment/).fill('The applicant sent a corrected soil survey.');
    await page.locator('form').getByRole('button', { name: 'Reopen the assessment' }).click();
    await page.getByText('Being assessed', { exact: true }).waitFor();
    await expect(page.locator('main').textContent()).resolves.toContain('The applicant sent a corrected soil survey.');
    await hydrated(page);
    await page.getByRole('button', { name: 'Start a new assessment version' }).click();
    await page.waitForURL(/\/assessments\/\d+$/);
    await expect(page.locator('h1').textContent()).resolves.toMatch(/^Assessment 2 /);
    await page.getByRole('link', { name: 'compare with assessment 1' }).click();
    await page.getByRole('heading', { name: /^Compare assessments/ }).waitFor();
    await expect(page.locator('main').textContent()).resolves.toMatch(
      /Assessment 1 \(signed .*Assessment 2 \(draft\)/s,
    );
    await screenshotBoth(page, 'assessment-compare');
    await fitsPhone(page);
    expect(seen.errors).toEqual([]);
    expect(seen.foreign).toEqual([]);
    await assessor.close();
  }, 150_000);
});

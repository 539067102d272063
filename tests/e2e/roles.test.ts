/** Each role signs in through the real form and lands on its own home page; screenshots at 1280 and 390 px. */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLE_HOMES } from '~/lib/role-homes';
import { BASE_URL } from '../support/env';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { DEMO, DEMO_PASSWORD } from '../support/http';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

describe('public pages', () => {
  it('landing and sign-in pages render without errors or outside requests', async () => {
    const page = await browser.newPage();
    const seen = watchPage(page);
    await page.goto(`${BASE_URL}/`);
    await expect(page.locator('h1').textContent()).resolves.toMatch(/plough or change grassland/);
    await screenshotBoth(page, 'public-landing');
    await page.goto(`${BASE_URL}/sign-in`);
    await hydrated(page);
    await screenshotBoth(page, 'public-sign-in');
    await page.getByLabel('E-mail address').fill(DEMO.planner);
    await page.getByLabel('Password').fill('wrong password!');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.getByRole('alert').first().textContent()).resolves.toMatch(/not right/);
    await screenshotBoth(page, 'public-sign-in-error');
    expect(seen.foreign).toEqual([]);
    expect(seen.errors.filter((e) => !/401/.test(e))).toEqual([]);
    await page.close();
  });

  it('a signed-out visitor asking for a staff page is sent to sign in', async () => {
    const page = await browser.newPage();
    await page.goto(`${BASE_URL}/admin/users`);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await page.close();
  });
});

describe('role home pages', () => {
  for (const role of ['planner', 'assessor', 'board', 'chair', 'admin'] as const) {
    it(`${role} signs in and sees the ${ROLE_HOMES[role].title}`, async () => {
      const context = await browser.newContext();
      const page = await context.newPage();
      const seen = watchPage(page);
      await signInThroughForm(page, DEMO[role], DEMO_PASSWORD);
      if (role === 'chair') await page.goto(`${BASE_URL}/work/chair`); // the chair also holds "board", listed first
      await expect(page.locator('h1').textContent()).resolves.toBe(ROLE_HOMES[role].title);
      await screenshotBoth(page, `home-${role}`);
      expect(seen.errors).toEqual([]);
      expect(seen.foreign).toEqual([]);
      await context.close();
    });
  }

  it('a planner is refused the admin pages with a 403 page', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signInThroughForm(page, DEMO.planner, DEMO_PASSWORD);
    const res = await page.goto(`${BASE_URL}/admin/users`);
    expect(res?.status()).toBe(403);
    await expect(page.locator('h1').textContent()).resolves.toMatch(/Not available/);
    await context.close();
  });

  it('admin pages render: users, mail box, audit log', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.admin, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/admin/users`);
    await page.getByRole('cell', { name: DEMO.planner }).waitFor();
    await screenshotBoth(page, 'admin-users');
    await page.goto(`${BASE_URL}/admin/mail`);
    await screenshotBoth(page, 'admin-mail');
    await page.goto(`${BASE_URL}/admin/audit`);
    await expect(page.locator('table tbody tr').count()).resolves.toBeGreaterThan(0);
    await screenshotBoth(page, 'admin-audit');
    expect(seen.errors).toEqual([]);
    await context.close();
  });
});

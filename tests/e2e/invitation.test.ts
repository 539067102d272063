/** An admin invites someone through the pages; the invitee opens the mailed link, sets a password and signs in. */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL } from '../support/env';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { lastMailId, linkIn, testDb, waitForMail } from '../support/db';
import { api, DEMO, DEMO_PASSWORD, signIn } from '../support/http';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await testDb.destroy();
});

describe('invitation through the pages', () => {
  const email = `wren.${Date.now()}@tarrow.example`;

  it('admin invites; invitee sets a password from the mailed link and signs in', async () => {
    const admin = await browser.newContext();
    const page = await admin.newPage();
    await signInThroughForm(page, DEMO.admin, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/admin/users`);
    await hydrated(page);
    await page.getByLabel('Name').fill('Wren Holloway');
    await page.getByLabel('E-mail address').fill(email);
    await page.getByRole('checkbox', { name: 'Assessor' }).first().check();
    await page.getByRole('button', { name: 'Send invitation', exact: true }).click();
    await page.getByText(`Invitation sent to ${email}.`).waitFor();

    const mail = await waitForMail(email, /Swardkeep account/);
    await page.goto(`${BASE_URL}/admin/mail`);
    await page.getByText('Your Swardkeep account').first().waitFor();
    await admin.close();

    const invitee = await browser.newContext();
    const p2 = await invitee.newPage();
    const seen = watchPage(p2);
    await p2.goto(linkIn(mail.body_text));
    await hydrated(p2);
    await screenshotBoth(p2, 'welcome-set-password');
    await p2.getByLabel('New password').fill('short');
    await p2.getByLabel('The same password again').fill('short');
    await p2.getByRole('button', { name: 'Set password' }).click();
    await p2.getByText('Use at least 10 characters.').waitFor();
    await p2.getByLabel('New password').fill('curlew over the fen');
    await p2.getByLabel('The same password again').fill('curlew over the fen');
    await p2.getByRole('button', { name: 'Set password' }).click();
    await p2.getByText('Your password is set.').waitFor();
    // The prompt gives way to the confirmation and a sign-in form with the address filled in.
    expect(await p2.getByText('Choose the password you will sign in with.').count()).toBe(0);
    expect(await p2.getByLabel('New password').count()).toBe(0);
    await expect(p2.getByLabel('E-mail address').inputValue()).resolves.toBe(email);
    await screenshotBoth(p2, 'welcome-password-set');
    await p2.getByLabel('Password', { exact: true }).fill('curlew over the fen');
    await p2.getByRole('button', { name: 'Sign in' }).click();
    await p2.waitForURL((url) => url.pathname.startsWith('/work'));
    await expect(p2.locator('h1').textContent()).resolves.toBe('Assessment desk');
    // The page is a plain form post: the refused short password comes back with status 422, which the browser logs.
    expect(seen.errors.filter((e) => !/status of 422/.test(e))).toEqual([]);
    await invitee.close();
  });

  it('the forgotten-password page answers the same for any address', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.goto(`${BASE_URL}/forgot-password`);
    await hydrated(page);
    await page.getByLabel('E-mail address').fill('nobody@tarrow.example');
    await page.getByRole('button', { name: 'Send reset link' }).click();
    await page.getByText('If an account uses that address').waitFor();
    await screenshotBoth(page, 'forgot-password-sent');
    await page.goto(`${BASE_URL}/reset-password?error=INVALID_TOKEN`);
    await expect(page.getByRole('alert').textContent()).resolves.toMatch(/not valid any more/);
    await page.goto(`${BASE_URL}/reset-password?token=no-such-token-at-all`);
    await expect(page.getByRole('alert').textContent()).resolves.toMatch(/not valid any more/);
    await context.close();
  });

  it('a reset link ends in a confirmation and a sign-in form with the address filled in', async () => {
    const who = `sedge.${Date.now()}@tarrow.example`;
    let before = await lastMailId();
    await api('POST', '/api/users', {
      session: await signIn(DEMO.admin),
      body: { name: 'Sedge Marlow', email: who, roles: ['planner'] },
    });
    const invite = new URL(linkIn((await waitForMail(who, /account/, before)).body_text)).searchParams.get('token');
    expect(
      (await api('POST', '/api/invitations/accept', { body: { token: invite, password: 'first reed bed walk' } }))
        .status,
    ).toBe(200);
    before = await lastMailId();
    const asked = await api('POST', '/api/auth/request-password-reset', {
      body: { email: who, redirectTo: '/reset-password' },
    });
    expect(asked.status).toBe(200);
    const link = linkIn((await waitForMail(who, /Reset your Swardkeep password/, before)).body_text);
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.goto(link);
    await hydrated(page);
    await page.getByText('Choose a new password.').waitFor();
    await page.getByLabel('New password').fill('second reed bed walk');
    await page.getByLabel('The same password again').fill('second reed bed walk');
    await page.getByRole('button', { name: 'Change password' }).click();
    await page.getByText('Your password is changed.').waitFor();
    expect(await page.getByText('Choose a new password.').count()).toBe(0);
    await expect(page.getByLabel('E-mail address').inputValue()).resolves.toBe(who);
    await screenshotBoth(page, 'reset-password-done');
    await page.getByLabel('Password', { exact: true }).fill('second reed bed walk');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.locator('header').getByText('Sign out').first().waitFor();
    await context.close();
  });
});

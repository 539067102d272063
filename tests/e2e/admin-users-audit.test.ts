/**
 * Admin pages in words: role changes wait for Save (Cancel, Undo, 409 said), the only role says why it is locked, the
 * audit log filters and reads as before → after.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL } from '../support/env';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { lastMailId, testDb, waitForMail } from '../support/db';
import { api, DEMO, DEMO_PASSWORD, signIn } from '../support/http';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await testDb.destroy();
});

const rolesOf = async (id: string) =>
  (await api('GET', '/api/users', { session: await signIn(DEMO.admin) })).body.items.find(
    (u: { id: string }) => u.id === id,
  );

describe('users page', () => {
  it('a role change is pending until saved, can be cancelled and undone, and a stale one is refused', async () => {
    const name = 'Yarrow Pell';
    const email = `yarrow.${Date.now()}@tarrow.example`;
    const before = await lastMailId();
    const created = await api('POST', '/api/users', {
      session: await signIn(DEMO.admin),
      body: { name, email, roles: ['planner'] },
    });
    await waitForMail(email, /account/, before);
    const id = created.body.id as string;

    const context = await browser.newContext();
    const page: Page = await context.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.admin, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/admin/users`);
    await hydrated(page);
    const group = page.getByRole('group', { name: `Roles of ${name}` });
    await expect(group.getByRole('checkbox', { name: 'Planner' }).isDisabled()).resolves.toBe(true);
    const why = await group.getByRole('checkbox', { name: 'Planner' }).getAttribute('aria-describedby');
    await expect(page.locator(`[id="${why}"]`).textContent()).resolves.toMatch(
      'Planner cannot be unticked: it is the only role, and everyone needs one.',
    );

    await group.getByRole('checkbox', { name: 'Board member' }).check();
    await page.getByText(`Not saved yet: ${name} would have Planner and Board member (now Planner).`).waitFor();
    await screenshotBoth(page, 'admin-users-pending');
    expect((await rolesOf(id)).roles).toEqual(['planner']);
    await page.getByRole('button', { name: 'Cancel' }).click();
    await expect(group.getByRole('checkbox', { name: 'Board member' }).isChecked()).resolves.toBe(false);

    await group.getByRole('checkbox', { name: 'Board member' }).check();
    await page.getByRole('button', { name: `Save roles of ${name}` }).click();
    await page.getByText(`Roles of ${name} changed from Planner to Planner and Board member.`).waitFor();
    expect((await rolesOf(id)).roles).toEqual(['planner', 'board']);
    await screenshotBoth(page, 'admin-users-saved');
    await page.getByRole('button', { name: 'Undo' }).click();
    await page.getByText(`Undone: ${name} has Planner again.`).waitFor();
    expect((await rolesOf(id)).roles).toEqual(['planner']);

    // Someone else changes the person meanwhile: the page says so instead of overwriting.
    const now = await rolesOf(id);
    await api('PATCH', `/api/users/${id}`, {
      session: await signIn(DEMO.admin),
      body: { version: now.version, roles: ['board'] },
    });
    await group.getByRole('checkbox', { name: 'Board member' }).check();
    await page.getByRole('button', { name: `Save roles of ${name}` }).click();
    await expect(page.getByRole('alert').first().textContent()).resolves.toMatch(
      `${name} was changed by someone else meanwhile`,
    );
    expect((await rolesOf(id)).roles).toEqual(['board']);
    expect(seen.errors.filter((e) => !/409/.test(e))).toEqual([]);

    await page.goto(`${BASE_URL}/admin/audit?entityType=user&entityId=${id}`);
    await page.getByTestId('audit-count').getByText('4 entries; page 1 of 1.').waitFor();
    const text = (await page.locator('table').textContent())!.replace(/\s+/g, ' ');
    expect(text).toContain('Roles: planner → planner, board');
    expect(text).not.toContain('{"');
    await screenshotBoth(page, 'admin-audit-filtered');
    await page.goto(`${BASE_URL}/admin/audit?action=user.update&pageSize=2`);
    await page.getByRole('link', { name: 'Older entries' }).waitFor();
    await page.goto(`${BASE_URL}/admin/audit?from=2026-02-30`);
    await expect(page.getByRole('alert').first().textContent()).resolves.toMatch('No such day.');
    await context.close();
  });
});

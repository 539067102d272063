/**
 * A planner's upload survives a reload: the wizard puts the upload in the address, and opening it
 * again restores the step from what the server stored: the columns after the file was read, the
 * stored progress while the check runs (the test holds the staging table for a moment so the reload
 * lands mid-way, then lets go), the report once checked, the saved result with its map link.
 * Screenshots of the restored wizard at 1280 and 390 px go to screenshots/.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { DEMO, DEMO_PASSWORD } from '../support/http';
import { gridGeoJson } from '../support/upload-grid';

const COUNT = 600;
let browser: Browser;
let file: string;
beforeAll(async () => {
  browser = await launchBrowser();
  // 600 squares south of the demo grid (x 700-4300 m, y −6500 to −5960 m), clear of other tests' parcels.
  file = join(mkdtempSync(join(tmpdir(), 'swardkeep-restore-')), 'restore-grid.geojson');
  writeFileSync(file, gridGeoJson('RST', COUNT, [700, -6500], { cols: 60 }));
});
afterAll(async () => {
  await browser?.close();
  await testDb.destroy();
});

const heading = (page: Page) => page.locator('#step-heading');
const text = async (page: Page, selector: string) =>
  ((await page.locator(selector).first().textContent()) ?? '').replace(/\s+/g, ' ').trim();

async function reload(page: Page): Promise<void> {
  await page.reload();
  await hydrated(page);
}

describe('upload wizard after a reload', () => {
  it('restores the columns, the running check, the report and the saved result', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.planner, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/parcels/upload`);
    await hydrated(page);
    await page.setInputFiles('#upload-file', file);
    await page.getByRole('button', { name: 'Upload and read' }).click();
    await expect.poll(() => heading(page).textContent(), { timeout: 20_000 }).toBe('Columns');
    const id = new URL(page.url()).searchParams.get('upload')!;
    expect(id).toMatch(/^[0-9a-f-]{36}$/);

    await reload(page);
    await expect.poll(() => heading(page).textContent(), { timeout: 10_000 }).toBe('Columns');
    await expect(text(page, 'section.panel p')).resolves.toContain(`“restore-grid.geojson”`);
    expect(await page.locator('#map-reference').inputValue()).toBe('ref');
    await page.getByRole('button', { name: 'Next: coordinates' }).click();

    // Hold the staging table so the check waits once its features are read; reload while it waits.
    const hold = await testDb.transaction();
    await hold.raw('lock table upload_staging_feature in share mode');
    let held = true;
    try {
      await page.getByRole('button', { name: 'Check every feature' }).click();
      await expect
        .poll(async () => (await testDb('upload_progress').where({ upload_id: id }).first())?.phase, {
          timeout: 20_000,
        })
        .toBe('keeping');
      // The page that started the check shows the same stored progress while it waits for the answer.
      await expect
        .poll(() => page.getByRole('status').filter({ hasText: 'Checking and recording' }).count(), { timeout: 10_000 })
        .toBe(1);
      await reload(page);
      await expect.poll(() => heading(page).textContent(), { timeout: 10_000 }).toBe('Checking every feature');
      const status = page.getByRole('status').filter({ hasText: 'Checking and recording' });
      await expect(status.textContent()).resolves.toMatch(/Checking and recording: 0 of 600 parcels/);
      await expect(status.textContent()).resolves.toMatch(/started \d{1,2} [A-Z][a-z]{2} \d{4}, \d{2}:\d{2} UTC/);
      await expect(page.locator('[aria-current=step]').textContent()).resolves.toMatch(/Check/);
      await screenshotBoth(page, 'upload-restore-running');
      await hold.commit();
      held = false;
    } finally {
      if (held) await hold.rollback();
    }
    // The page polls the stored progress and shows the report once the check has ended.
    await expect.poll(() => heading(page).textContent(), { timeout: 30_000 }).toBe('Check');
    await expect(page.getByRole('button', { name: 'Save 600 valid parcels' }).count()).resolves.toBe(1);

    // A later visit without the address: the page lists the unfinished upload, and its link restores the report.
    await page.goto(`${BASE_URL}/parcels/upload`);
    await hydrated(page);
    const open = page.getByRole('region', { name: 'Your unfinished uploads' });
    await expect(open.textContent()).resolves.toMatch(/restore-grid\.geojson”: checked, waiting for you to save/);
    await screenshotBoth(page, 'upload-restore-list');
    await open.getByRole('link', { name: '“restore-grid.geojson”' }).click();
    await hydrated(page);
    await expect.poll(() => heading(page).textContent(), { timeout: 10_000 }).toBe('Check');
    await screenshotBoth(page, 'upload-restore-report');

    await page.getByRole('button', { name: 'Save 600 valid parcels' }).click();
    await expect.poll(() => heading(page).textContent(), { timeout: 30_000 }).toBe('Saved');
    await reload(page);
    await expect.poll(() => heading(page).textContent(), { timeout: 10_000 }).toBe('Saved');
    await expect(page.getByRole('status').filter({ hasText: 'Saved 600 parcels' }).count()).resolves.toBe(1);
    const batch = await testDb('upload_batch').where({ file_name: 'restore-grid.geojson' }).first();
    const link = page.getByRole('link', { name: 'See the saved parcels on the map, outlined and listed' });
    await expect(link.getAttribute('href')).resolves.toBe(`/map?upload=${batch.id}`);
    await screenshotBoth(page, 'upload-restore-saved');
    expect(seen.errors).toEqual([]);
    expect(seen.foreign).toEqual([]);
    await context.close();
  });

  it('follows the stored progress when the check’s answer is lost on the way', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInThroughForm(page, DEMO.planner, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/parcels/upload`);
    await hydrated(page);
    const small = join(mkdtempSync(join(tmpdir(), 'swardkeep-lost-')), 'lost-answer.geojson');
    writeFileSync(small, gridGeoJson('LST', 3, [5200, -4200]));
    await page.setInputFiles('#upload-file', small);
    await page.getByRole('button', { name: 'Upload and read' }).click();
    await expect.poll(() => heading(page).textContent(), { timeout: 20_000 }).toBe('Columns');
    await page.getByRole('button', { name: 'Next: coordinates' }).click();
    // The server checks the file, but its answer never reaches the page (as when a proxy gives up on a long request).
    await page.route('**/validation', async (route) => {
      await route.fetch();
      await route.abort('connectionreset');
    });
    await page.getByRole('button', { name: 'Check every feature' }).click();
    await expect.poll(() => heading(page).textContent(), { timeout: 30_000 }).toBe('Check');
    await expect(page.getByRole('button', { name: 'Save 3 valid parcels' }).count()).resolves.toBe(1);
    await expect(page.getByRole('alert').count()).resolves.toBe(0);
    await context.close();
  });

  it('says so when the address names an upload that is not there', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInThroughForm(page, DEMO.planner, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/parcels/upload?upload=00000000-0000-4000-8000-000000000000`);
    await hydrated(page);
    await expect
      .poll(() => page.getByRole('alert').first().textContent(), { timeout: 10_000 })
      .toMatch(/No such upload/);
    expect(await heading(page).textContent()).toBe('File');
    expect(new URL(page.url()).searchParams.has('upload')).toBe(false);
    await context.close();
  });
});

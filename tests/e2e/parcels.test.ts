/**
 * A planner uploads the demo shapefile without .prj through the wizard (columns with samples,
 * CRS search, report, save), then sees the parcels on the map and opens one. Screenshots at
 * 1280 and 390 px go to screenshots/. The admin's reference-layer pages are shot as well.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { DEMO, DEMO_PASSWORD } from '../support/http';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
  // The seed imported these parcels already, and the demo proposals name some of them (so they cannot be
  // deleted): rename them and move them 10 degrees south, so the upload below is not 285 duplicates or overlaps.
  await testDb.raw(
    `update parcel set reference = 'moved-' || reference, reference_key = 'moved-' || reference_key, geom = st_translate(geom, 0, -10)
     where batch_id in (select id from upload_batch where file_name like 'corrowmere-parcels-%')`,
  );
  // Their overlay no longer holds where they now lie: drop it (region figures then leave them out, as after any republication).
  await testDb.raw(
    `delete from parcel_overlay_run where parcel_id in (select id from parcel where reference like 'moved-%')`,
  );
});
afterAll(async () => {
  await browser?.close();
  await testDb.destroy();
});

const heading = (page: Page) => page.locator('#step-heading');

describe('parcel upload and map', () => {
  it('walks file → columns → CRS → report → save, then finds the parcels on the map', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.planner, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/parcels/upload`);
    await hydrated(page);
    await screenshotBoth(page, 'upload-1-file');
    await page.setInputFiles('#upload-file', 'gis/demo/corrowmere-parcels-noprj.zip');
    await page.getByRole('button', { name: 'Upload and read' }).click();
    // Parsing runs in the worker pool; allow for a machine under load.
    await expect.poll(() => heading(page).textContent(), { timeout: 20_000 }).toBe('Columns');
    // The seed mapped a file with the same columns, so the mapping is remembered.
    expect(await page.locator('#map-reference').inputValue()).toBe('field_ref');
    expect(await page.locator('#map-lastTillage').inputValue()).toBe('last_till');
    await expect(page.getByRole('table').first().textContent()).resolves.toMatch(/CM-0001/);
    await screenshotBoth(page, 'upload-2-columns');
    await page.getByRole('button', { name: 'Next: coordinates' }).click();
    await expect(page.getByRole('status').filter({ hasText: 'no .prj' }).count()).resolves.toBe(1);
    await page.locator('#crs-search').fill('32628');
    await page.getByLabel(/EPSG:32628 WGS 84 \/ UTM zone 28N/).check();
    await screenshotBoth(page, 'upload-3-crs');
    await page.getByRole('button', { name: 'Check every feature' }).click();
    await expect.poll(() => heading(page).textContent(), { timeout: 30_000 }).toBe('Check');
    // gis/demo/manifest.json: 303 features, 18 deliberate defects rejected, the unclosed ring repaired.
    const save = page.getByRole('button', { name: 'Save 285 valid parcels' });
    await expect(save.count()).resolves.toBe(1);
    await expect(page.getByText('bow-tie', { exact: false }).count()).resolves.toBe(0);
    await expect(page.locator('table').textContent()).resolves.toMatch(/crosses or touches itself/);
    await screenshotBoth(page, 'upload-4-report');
    await save.click();
    await expect.poll(() => heading(page).textContent(), { timeout: 30_000 }).toBe('Saved');
    await expect(page.getByRole('status').filter({ hasText: 'Saved 285 parcels' }).count()).resolves.toBe(1);
    await screenshotBoth(page, 'upload-5-saved');
    const batch = await testDb('upload_batch').where({ file_name: 'corrowmere-parcels-noprj.zip' }).first();
    expect(batch.source_crs).toMatchObject({ epsg: 32628, source: 'picked' });

    const tiles: number[] = [];
    page.on('response', (r) => r.url().includes('/api/tiles/') && tiles.push(r.status()));
    // The saved step links to the map with this upload's parcels outlined and listed, in words.
    await page.getByRole('link', { name: 'See the saved parcels on the map, outlined and listed' }).click();
    await page.waitForURL(`${BASE_URL}/map?upload=${batch.id}`);
    await page.locator('.ol-viewport canvas').first().waitFor();
    const list = page.getByRole('region', { name: 'Saved by this upload' });
    await list.getByText(/Corrowmere parcels noprj, uploaded \d{1,2} [A-Z][a-z]{2,3} \d{4}/).waitFor();
    await expect(list.textContent()).resolves.toMatch(/: 285 parcels, outlined/);
    await list
      .getByRole('button', { name: /^CM-\d{4}$/ })
      .first()
      .waitFor();
    const legend = page.getByRole('region', { name: 'Layers' });
    await legend.getByText('Small square inside a parcel: a hole in its boundary').waitFor();
    await legend.getByText('Saved by the upload listed above').waitFor();
    expect((await page.locator('#map-area option').allTextContents()).filter((t) => /\.(zip|geojson)/.test(t))).toEqual(
      [],
    );
    await expect.poll(() => tiles.filter((s) => s === 200).length, { timeout: 15_000 }).toBeGreaterThan(0);
    await page.waitForTimeout(800);
    await screenshotBoth(page, 'map-1-parcels');
    const box = (await page.getByRole('region', { name: 'Map of parcels and reference layers' }).boundingBox())!;
    await page.mouse.click(box.x + box.width / 2, box.y + box.height / 2);
    await expect
      .poll(
        () =>
          page
            .locator('#parcel-heading')
            .textContent()
            .catch(() => ''),
        { timeout: 10_000 },
      )
      .toMatch(/^Parcel CM-\d{4}$/);
    await expect(page.getByText('Soil classes (area fractions)').count()).resolves.toBe(1);
    await screenshotBoth(page, 'map-2-parcel');
    await page.locator('#parcel-search').fill('CM-0150');
    await page.getByRole('button', { name: /^CM-0150 / }).click();
    await expect.poll(() => page.locator('#parcel-heading').textContent()).toBe('Parcel CM-0150');
    expect(seen.errors).toEqual([]);
    expect(seen.foreign).toEqual([]);
    await context.close();
  });

  it('shows the admin the reference layers and the reference upload wizard', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.admin, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/admin/reference-layers`);
    // A table from 768 px, one card per version below (both in the page).
    await expect.poll(() => page.locator('table').getByText('● Current').count()).toBe(6);
    await expect(page.locator('ul').getByText('● Current').count()).resolves.toBe(6);
    await screenshotBoth(page, 'reference-layers');
    await page.goto(`${BASE_URL}/admin/reference-layers/upload`);
    await hydrated(page);
    await page.setInputFiles('#upload-file', 'gis/demo/soil-units.geojson');
    await page.getByRole('button', { name: 'Upload and read' }).click();
    await expect.poll(() => heading(page).textContent()).toBe('Columns');
    expect(await page.locator('#map-kind').inputValue()).toBe('soil');
    await screenshotBoth(page, 'reference-upload-columns');
    await page.getByRole('button', { name: 'Cancel upload' }).click();
    await expect.poll(() => heading(page).textContent()).toBe('File');
    expect(seen.errors).toEqual([]);
    await context.close();
  });
});

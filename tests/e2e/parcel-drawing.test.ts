/**
 * The demo planner draws parcels on the map with the mouse: a self-intersecting boundary is
 * refused with the validator's message, a square is saved, a corner is dragged and the area of
 * record grows; then a tillage is recorded through the panel form and the flags follow.
 * Screenshots at 1280 and 390 px go to screenshots/.
 */
import { formatDate } from '~/lib/format/dates';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { yearsBefore } from '~/lib/gis/land-use-history';
import { hydrated, launchBrowser, screenshotBoth, signInThroughForm, watchPage } from '../support/browser';
import { BASE_URL } from '../support/env';
import { DEMO, DEMO_PASSWORD } from '../support/http';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(() => browser?.close());

type Pt = [number, number];
const mapRegion = (page: Page) => page.getByRole('region', { name: 'Map of parcels and reference layers' });
const note = (page: Page, role: 'status' | 'alert') => page.locator(`[role=${role}].notice`).first();

/** Pixel offsets from the middle of the map, as page coordinates (recomputed: screenshots resize the page). */
async function fromCentre(page: Page, offsets: Pt[]): Promise<Pt[]> {
  const box = (await mapRegion(page).boundingBox())!;
  return offsets.map(([dx, dy]) => [box.x + box.width / 2 + dx, box.y + box.height / 2 + dy]);
}

/** Places corners one click at a time (moving there first, as a hand would) and closes the ring on the first corner. */
async function drawRing(page: Page, offsets: Pt[]): Promise<void> {
  const pts = await fromCentre(page, [...offsets, offsets[0]!]);
  for (const [x, y] of pts) {
    await page.mouse.move(x, y, { steps: 5 });
    await page.mouse.click(x, y);
    await page.waitForTimeout(350); // longer than a double-click, so every click is its own corner
  }
}

async function startDrawing(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Draw a new parcel' }).click();
  await page.getByRole('heading', { name: 'New parcel' }).waitFor();
}

/** At 1280 px the panel scrolls on its own (a full-page shot shows only its top): shoot it scrolled to the history. */
async function panelShot(page: Page, name: string): Promise<void> {
  await page.locator('#history-heading').scrollIntoViewIfNeeded();
  await page
    .locator('aside', { has: page.locator('#history-heading') })
    .screenshot({ path: `screenshots/${name}-panel-desktop.png` });
}

const apiGet = (page: Page, path: string) => page.evaluate(async (p) => (await fetch(p)).json(), path);

describe('drawing and editing parcels on the map', () => {
  it('refuses a bow-tie, saves a drawn square, enlarges it by dragging a corner and records a tillage', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const seen = watchPage(page);
    await signInThroughForm(page, DEMO.planner, DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/map`);
    await hydrated(page);
    await page.locator('.ol-viewport canvas').first().waitFor();

    // Go to the south-west corner field, then pan four arrow-key steps (128 px each, OpenLayers' default) west into open ground.
    await page.locator('#parcel-search').fill('CM-0001');
    await page.getByRole('button', { name: /^CM-0001 / }).click();
    await expect.poll(() => page.locator('#parcel-heading').textContent()).toBe('Parcel CM-0001');
    await mapRegion(page).focus();
    for (let i = 0; i < 4; i++) {
      await page.keyboard.press('ArrowLeft');
      await page.waitForTimeout(200);
    }

    // A bow-tie: the second and third corners are swapped, so two edges cross.
    await startDrawing(page);
    await drawRing(page, [
      [-60, -60],
      [60, 60],
      [60, -60],
      [-60, 60],
    ]);
    await page.getByLabel('Parcel reference (required)').fill('DRAWN-BOWTIE');
    await expect.poll(() => page.getByRole('button', { name: 'Save parcel' }).isEnabled()).toBe(true);
    await page.getByRole('button', { name: 'Save parcel' }).click();
    await expect
      .poll(() => note(page, 'alert').textContent())
      .toMatch(/The boundary is not valid: The boundary crosses or touches itself near/);
    await screenshotBoth(page, 'draw-1-refused');
    expect(await apiGet(page, '/api/parcels/search?q=DRAWN-BOWTIE')).toEqual({ items: [] });
    await page.getByRole('button', { name: 'Cancel', exact: true }).click();

    // A 120 px square (about 87 m a side at zoom 17 here).
    const reference = `DRAWN-${Date.now().toString(36).toUpperCase()}`;
    await startDrawing(page);
    await drawRing(page, [
      [-60, -60],
      [60, -60],
      [60, 60],
      [-60, 60],
    ]);
    await page.getByLabel('Parcel reference (required)').fill(reference);
    await page.getByLabel('Evidence').fill('Drawn on the map from the 2025 field survey sketch');
    await screenshotBoth(page, 'draw-2-sketch');
    await page.getByRole('button', { name: 'Save parcel' }).click();
    await expect
      .poll(() => page.locator('#parcel-heading').textContent(), { timeout: 15_000 })
      .toBe(`Parcel ${reference}`);
    await expect.poll(() => note(page, 'status').textContent()).toContain(`Parcel ${reference} saved.`);
    const found = (await apiGet(page, `/api/parcels/search?q=${reference}`)).items;
    expect(found).toHaveLength(1);
    const drawnHa: number = found[0].areaHa;
    // 120 px at zoom 17 is 143 m of Web Mercator, × cos(52.38°) ≈ 87 m on the ground: about 0.76 ha (from memory: Web Mercator scale).
    expect(drawnHa).toBeGreaterThan(0.5);
    expect(drawnHa).toBeLessThan(1.1);
    await screenshotBoth(page, 'draw-3-saved');

    // Drag the north-east corner 50 px further out: the area must grow.
    await page.getByRole('button', { name: 'Edit boundary' }).click();
    await page.getByRole('heading', { name: `Edit boundary of ${reference}` }).waitFor();
    const [[fromX, fromY], [toX, toY]] = await fromCentre(page, [
      [60, -60],
      [110, -110],
    ]);
    await page.mouse.move(fromX, fromY, { steps: 5 });
    await page.waitForTimeout(100);
    await page.mouse.down();
    await page.mouse.move(toX, toY, { steps: 10 });
    await page.mouse.up();
    await page.getByLabel('Why does the boundary change? (required)').fill('Hedge line checked on site');
    await screenshotBoth(page, 'draw-4-edit');
    await page.getByRole('button', { name: 'Save boundary' }).click();
    await expect
      .poll(() => note(page, 'status').textContent(), { timeout: 15_000 })
      .toMatch(new RegExp(`Boundary of ${reference} saved; area now \\d+\\.\\d\\d ha\\.`));
    const edited: number = (await apiGet(page, `/api/parcels/search?q=${reference}`)).items[0].areaHa;
    expect(edited).toBeGreaterThan(drawnHa * 1.1);

    // Record a tillage with the keyboard-usable form: an empty form is refused in place, then the flags change.
    const neverTilled = () =>
      page.locator('dt', { hasText: 'Never tilled (history)' }).locator('xpath=following-sibling::dd[1]').textContent();
    expect(await neverTilled()).toMatch(/^✓ Yes\./);
    await page.locator('summary', { hasText: 'Record a land-use event' }).focus();
    await page.keyboard.press('Enter');
    await page.getByLabel('Kind').selectOption('tillage');
    await page.getByLabel('Evidence (required)').press('Enter');
    await expect.poll(() => page.locator('#event-evidence-error').textContent()).toMatch(/Say where this comes from/);
    await expect(page.locator('#event-date-error').textContent()).resolves.toBe('Give the date of the event.');
    await screenshotBoth(page, 'draw-5-event-form');
    await panelShot(page, 'draw-5-event-form');
    const tilledOn = yearsBefore(new Date().toISOString().slice(0, 10), 2);
    await page.getByLabel('Date', { exact: true }).fill(tilledOn);
    await page.getByLabel('Method (optional)').selectOption('ploughing');
    await page.getByLabel('Evidence (required)').fill('Aerial image two springs ago');
    await page.getByLabel('Evidence (required)').press('Enter');
    await expect
      .poll(() => page.locator('form[aria-label="Record a land-use event"] [role=status]').textContent())
      .toContain(`Recorded tillage (Ploughing) on ${formatDate(tilledOn)}.`);
    await expect.poll(neverTilled).toMatch(new RegExp(`^✕ No\\. Tilled on ${formatDate(tilledOn)} \\(ploughing\\)\\.`));
    const history = page.getByRole('list', { name: 'Events, newest first' }).locator('li');
    await expect(history.first().textContent()).resolves.toMatch(/Land use: Grassland/);
    await expect(history.last().textContent()).resolves.toMatch(
      new RegExp(
        `${formatDate(tilledOn)} Tillage: Ploughing.*Aerial image two springs ago · recorded .* by Tomas Brevin`,
      ),
    );
    await screenshotBoth(page, 'draw-6-event-recorded');
    await panelShot(page, 'draw-6-event-recorded');

    // The only console errors are the browser's own notes of the refused bow-tie (422).
    expect(seen.errors.filter((e) => !/status of 422/.test(e))).toEqual([]);
    expect(seen.foreign).toEqual([]);
    await context.close();
  });
});

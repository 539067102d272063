/**
 * Accessibility sweep: every page (tests/support/pages.ts) for every role that may open it, at
 * 1280 and 390 px, checked with axe-core (WCAG 2.1 A and AA rules and axe's best practices).
 * Fails on any serious or critical violation and on any page wider than the window.
 */
import { mkdirSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, signInThroughForm, WIDTHS } from '../support/browser';
import { BASE_URL } from '../support/env';
import { DEMO, DEMO_PASSWORD } from '../support/http';
import { allPages, type PageCase, type Viewer } from '../support/pages';

const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
const VIEWERS: Viewer[] = ['public', 'planner', 'assessor', 'board', 'chair', 'admin'];

type Found = { id: string; impact: string; help: string; nodes: string[] };

let browser: Browser;
let pages: PageCase[];
beforeAll(async () => {
  browser = await launchBrowser();
  pages = await allPages();
  mkdirSync('screenshots', { recursive: true });
});
afterAll(async () => {
  await browser?.close();
});

async function axeProblems(page: Page): Promise<Found[]> {
  // Injected through the DevTools protocol, which the page's Content-Security-Policy does not govern.
  await page.evaluate(AXE_SOURCE);
  const violations = await page.evaluate(async () => {
    const axe = (
      window as unknown as {
        axe: {
          run: (
            ctx: Document,
            o: object,
          ) => Promise<{
            violations: { id: string; impact: string | null; help: string; nodes: { target: unknown[] }[] }[];
          }>;
        };
      }
    ).axe;
    const r = await axe.run(document, {
      runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'best-practice'] },
      resultTypes: ['violations'],
    });
    return r.violations.map((v) => ({
      id: v.id,
      impact: v.impact ?? 'minor',
      help: v.help,
      nodes: v.nodes.slice(0, 4).map((n) => JSON.stringify(n.target)),
    }));
  });
  return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}

async function sweep(context: BrowserContext, viewer: Viewer): Promise<string[]> {
  const problems: string[] = [];
  const page = await context.newPage();
  page.on('pageerror', (e) => problems.push(`${page.url()}: script error ${e.message}`));
  for (const p of pages.filter((x) => x.viewers.includes(viewer))) {
    for (const [label, width] of Object.entries(WIDTHS)) {
      await page.setViewportSize({ width, height: 900 });
      const res = await page.goto(`${BASE_URL}${p.path}`);
      if (res?.status() !== (p.status ?? 200)) {
        problems.push(`${p.path} as ${viewer}: status ${res?.status()}`);
        break;
      }
      // Islands hydrated when visible: bring each into view, so the sweep checks them hydrated too.
      // (one inside a closed <details> cannot come into view and stays as the server drew it).
      for (const island of await page.locator('astro-island[client="visible"]').all())
        await island.scrollIntoViewIfNeeded({ timeout: 2_000 }).catch(() => undefined);
      await page.waitForFunction(
        () => document.querySelectorAll('astro-island[ssr]:not([client="visible"])').length === 0,
      );
      await page.waitForTimeout(200);
      await page.evaluate(() => window.scrollTo(0, 0));
      await page.waitForLoadState('networkidle', { timeout: 10_000 }).catch(() => undefined);
      const where = `${p.path} as ${viewer} at ${label} (${width} px)`;
      if (viewer === p.viewers[0])
        await page.screenshot({
          path: `screenshots/page${p.path.replace(/[^a-z0-9]+/gi, '-').replace(/-$/, '')}-${label}.png`,
          fullPage: true,
        });
      const scrollWidth = await page.evaluate(() => document.documentElement.scrollWidth);
      if (scrollWidth > width) problems.push(`${where}: the page is ${scrollWidth} px wide`);
      for (const v of await axeProblems(page))
        problems.push(`${where}: ${v.impact} ${v.id} (${v.help}) at ${v.nodes.join(' ')}`);
    }
  }
  await page.close();
  return problems;
}

describe('accessibility of every page', () => {
  for (const viewer of VIEWERS) {
    it(`has no serious or critical axe violation and no sideways scrolling, as ${viewer}`, async () => {
      const context = await browser.newContext();
      if (viewer !== 'public') {
        const page = await context.newPage();
        await signInThroughForm(page, DEMO[viewer], DEMO_PASSWORD);
        await page.close();
      }
      const problems = await sweep(context, viewer);
      await context.close();
      expect(problems, problems.join('\n')).toEqual([]);
    }, 600_000);
  }

  it('the sweep sees a violation when there is one', async () => {
    // A page of our own made worse on purpose: an image without a text alternative and a button without a name.
    const page = await browser.newPage();
    await page.goto(`${BASE_URL}/`);
    await page.evaluate(() => {
      const main = document.querySelector('main')!;
      main.insertAdjacentHTML('beforeend', '<img src="/favicon.svg"><button></button>');
    });
    const ids = (await axeProblems(page)).map((v) => v.id);
    expect(ids).toEqual(expect.arrayContaining(['image-alt', 'button-name']));
    await page.close();
  });
});

/**
 * In a real browser (Debian's Chromium): the pages run under their Content-Security-Policy
 * with no violation (islands hydrate, the map draws), and a page on another port of the same
 * host cannot frame a signed-in page (issue: security hardening, item 6).
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL } from '../support/env';
import { hydrated, launchBrowser, signInThroughForm, watchPage } from '../support/browser';
import { DEMO, DEMO_PASSWORD } from '../support/http';

let browser: Browser;
let framer: http.Server;
let framerUrl = '';

beforeAll(async () => {
  browser = await launchBrowser();
  framer = http.createServer((_req, res) => {
    res.writeHead(200, { 'content-type': 'text/html' });
    res.end(
      `<!doctype html><title>framer</title><iframe id="f" src="${BASE_URL}/admin/users" width="800" height="600"></iframe>`,
    );
  });
  await new Promise<void>((r) => framer.listen(0, '127.0.0.1', () => r()));
  framerUrl = `http://127.0.0.1:${(framer.address() as AddressInfo).port}/`;
});
afterAll(async () => {
  await browser?.close();
  await new Promise((r) => framer.close(r));
});

describe('framing and CSP in the browser', () => {
  it('signed-in pages with islands run under the CSP without a single violation', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    const seen = watchPage(page);
    const violations: string[] = [];
    await page.exposeFunction('reportViolation', (v: string) => violations.push(v));
    await page.addInitScript(() =>
      document.addEventListener('securitypolicyviolation', (e) =>
        (window as unknown as { reportViolation: (v: string) => void }).reportViolation(
          `${e.violatedDirective} ${e.blockedURI}`,
        ),
      ),
    );
    await signInThroughForm(page, DEMO.admin, DEMO_PASSWORD);
    for (const path of ['/admin/users', '/calculator', '/admin/factor-sets', '/map']) {
      const res = await page.goto(`${BASE_URL}${path}`);
      expect(res?.headers()['content-security-policy'], path).toMatch(/frame-ancestors 'none'/);
      await hydrated(page);
    }
    await page.locator('canvas').first().waitFor(); // the map drew (OpenLayers, client-only island)
    expect(violations).toEqual([]);
    expect(seen.errors.filter((e) => /Content Security Policy/i.test(e))).toEqual([]);
    await context.close();
  });

  it('a page on another port of the same host cannot frame the signed-in admin users page', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signInThroughForm(page, DEMO.admin, DEMO_PASSWORD);
    await page.goto(framerUrl);
    await page.waitForTimeout(1500);
    const frame = page.frames().find((f) => f !== page.mainFrame());
    // Blocked by frame-ancestors: the frame shows the browser's error page, never our content.
    const framedText = frame ? await frame.evaluate(() => document.body?.innerText ?? '').catch(() => '') : '';
    expect(framedText).not.toMatch(/Users|Invite/);
    await context.close();
  });
});

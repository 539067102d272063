/**
 * Script budgets: what each page makes the browser fetch before anyone scrolls, after Brotli, for
 * every role that may open it, against its budget (tests/support/pages.ts; DEVELOPERS.md, "Script
 * budgets"). Fails naming the page, the role and its biggest modules.
 */
import { describe, expect, it } from 'vitest';
import type { Role } from '../../src/lib/auth/roles';
import { BASE_URL } from '../support/env';
import { DEMO, signIn, type Session } from '../support/http';
import { pageScript } from '../support/page-scripts';
import { allPages, BUDGET_KB, type Viewer } from '../support/pages';

const kB = (n: number) => (n / 1000).toFixed(1);

async function fetchPage(path: string, session: Session | null): Promise<{ status: number; html: string }> {
  const res = await fetch(`${BASE_URL}${path}`, {
    headers: session ? { cookie: session.cookie } : {},
    redirect: 'manual',
  });
  return { status: res.status, html: await res.text() };
}

describe('script budgets', () => {
  it('finds islands, module scripts and their static imports in a page', async () => {
    const { html } = await fetchPage('/proposals', await signIn(DEMO.planner));
    const s = await pageScript(html);
    // The list island and React's renderer are found, and their shared chunks followed.
    expect(s.modules.some((m) => /ProposalList\./.test(m.url))).toBe(true);
    expect(s.modules.some((m) => /client\./.test(m.url))).toBe(true);
    expect(s.modules.length).toBeGreaterThan(3);
    expect(s.totalBytes).toBeGreaterThan(10_000);
  });

  it('keeps every page, for every role that opens it, within its budget', async () => {
    const sessions = new Map<Viewer, Session | null>([['public', null]]);
    for (const r of Object.keys(DEMO) as Role[]) sessions.set(r, await signIn(DEMO[r]));
    const over: string[] = [];
    const lines: string[] = [];
    for (const p of await allPages()) {
      for (const v of p.viewers) {
        const { status, html } = await fetchPage(p.path, sessions.get(v)!);
        if (status !== (p.status ?? 200)) {
          over.push(`${p.path} as ${v}: status ${status}`);
          continue;
        }
        const s = await pageScript(html);
        const budget = BUDGET_KB[p.budget] * 1000;
        lines.push(
          `${p.path} (${v}): ${kB(s.totalBytes)} kB of ${BUDGET_KB[p.budget]} kB; later ${s.deferred.length} modules`,
        );
        if (s.totalBytes > budget) {
          const biggest = s.modules
            .slice(0, 4)
            .map((m) => `${m.url.replace('/_astro/', '')} ${kB(m.bytes)} kB`)
            .join(', ');
          over.push(`${p.path} as ${v}: ${kB(s.totalBytes)} kB > ${BUDGET_KB[p.budget]} kB (biggest: ${biggest})`);
        }
      }
    }
    console.log(`script per page (Brotli):\n${lines.join('\n')}`);
    expect(over, over.join('\n')).toEqual([]);
  }, 120_000);
});

/**
 * Every API route, called anonymously and as each role, answers with the status its contract
 * promises: 401 without a session, 403 without the role, anything else (200, 404, 422 …) with it.
 * Routes come from the contract list, and a route file without a contract fails the last test.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { allSpecs } from '~/lib/api';
import { ROLES, type Role } from '~/lib/auth/roles';
import { testDb } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';

const sessions: Partial<Record<Role, Session>> = {};
const callers: (Role | 'anonymous')[] = ['anonymous', ...ROLES];

beforeAll(async () => {
  for (const role of ROLES) if (role !== 'chair') sessions[role] = await signIn(DEMO[role]);
  sessions.chair = await signIn(DEMO.chair); // the demo chair also holds "board"
});
afterAll(() => testDb.destroy());

function expected(
  access: (typeof allSpecs)[number]['access'],
  caller: Role | 'anonymous',
): 'denied-401' | 'denied-403' | 'allowed' {
  if (access === 'public') return 'allowed';
  if (caller === 'anonymous') return 'denied-401';
  if (access === 'signed-in') return 'allowed';
  const held: Role[] = caller === 'chair' ? ['board', 'chair'] : [caller];
  return access.some((r) => held.includes(r)) ? 'allowed' : 'denied-403';
}

// Bodies are deliberately empty: an allowed caller then gets 422 (or 415), never a side effect.
const concrete = (p: string) => p.replace(/\{[^}]+\}/g, 'no-such-id');

describe('role matrix', () => {
  for (const spec of allSpecs) {
    // better-auth's public endpoints are called anonymously only: sign-out would end the shared sessions.
    for (const caller of spec.path.startsWith('/api/auth/') ? (['anonymous'] as const) : callers) {
      const want = expected(spec.access, caller);
      it(`${spec.method} ${spec.path} as ${caller} → ${want}`, async () => {
        const body = spec.method === 'GET' || spec.method === 'DELETE' ? undefined : {};
        const res = await api(spec.method, concrete(spec.path), {
          session: caller === 'anonymous' ? undefined : sessions[caller],
          body,
        });
        if (want === 'denied-401') expect(res.status).toBe(401);
        else if (want === 'denied-403') expect(res.status).toBe(403);
        else expect([401, 403]).not.toContain(res.status);
        if (res.status >= 400 && !spec.path.startsWith('/api/auth')) {
          expect(res.body.error.code).toBeTypeOf('string');
          expect(res.body.error.message).toBeTypeOf('string');
        }
      });
    }
  }
});

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    return statSync(full).isDirectory() ? routeFiles(full) : [full];
  });
}

function routeOf(file: string): string {
  const rel = path
    .relative('src/pages', file)
    .replace(/\.ts$/, '')
    .replace(/\/index$/, '');
  return '/' + rel.replace(/\[\.\.\.[^\]]+\]/g, '*').replace(/\[([^\]]+)\]/g, '{$1}');
}

describe('route contracts', () => {
  it('every method exported by a file under src/pages/api has a contract, and every contract a file', () => {
    const declared = new Set(allSpecs.map((s) => `${s.method} ${s.path}`));
    const found = new Set<string>();
    for (const file of routeFiles('src/pages/api')) {
      const route = routeOf(file);
      if (route === '/api/auth/*') continue; // better-auth's own endpoints
      for (const m of readFileSync(file, 'utf8').matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g))
        found.add(`${m[1]} ${route}`);
    }
    expect([...found].filter((r) => !declared.has(r))).toEqual([]);
    // better-auth's endpoints are served by the catch-all route file.
    expect([...declared].filter((r) => !found.has(r) && !r.includes(' /api/auth/'))).toEqual([]);
  });
});

/**
 * Hardening of the HTTP edge, through the real server (issue: security hardening, items 2, 3, 6,
 * 7, 8 and the API half of 9): where a sign-in may send the browser, how much body anyone can
 * make us read, what the browser is told about framing and scripts, who may write, and that
 * odd input gets a 4xx in our error shape instead of a 500.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL } from '../support/env';
import { api, DEMO, signIn, type Session } from '../support/http';
import { testDb } from '../support/db';
import { rawRequest } from '../support/raw-http';

let admin: Session;
let planner: Session;
beforeAll(async () => {
  admin = await signIn(DEMO.admin);
  planner = await signIn(DEMO.planner);
});
afterAll(() => testDb.destroy());

describe('open redirect (item 2)', () => {
  const hostile = [
    '/%09/evil.example',
    '/%0A/evil.example',
    '//evil.example',
    '/%5Cevil.example',
    '/..//evil.example',
    'https://evil.example/',
    '/a%0D%0ASet-Cookie:%20x=1',
  ];

  it('a signed-in visit to /sign-in never redirects to another host, whatever next says', async () => {
    for (const next of hostile) {
      const res = await api('GET', `/sign-in?next=${next}`, { session: planner });
      expect(res.status, next).toBe(302);
      expect(res.headers.get('location'), next).toBe('/work');
    }
    const fine = await api('GET', '/sign-in?next=%2Fcalculator%3Fx%3D1', { session: planner });
    expect(fine.headers.get('location')).toBe('/calculator?x=1');
  });

  it('the plain sign-in form post sends the browser to the same site only, and a newline in next is no 500', async () => {
    const headers = { 'content-type': 'application/x-www-form-urlencoded' };
    for (const next of ['/%09/evil.example', '/a%0Ab']) {
      const res = await api('POST', `/sign-in?next=${next}`, {
        body: new URLSearchParams({ email: DEMO.planner, password: 'meadow-lark-2026' }).toString(),
        headers,
      });
      expect(res.status, next).toBe(303);
      expect(res.headers.get('location'), next).toBe('/work');
    }
  });
});

describe('bounded bodies (item 3)', () => {
  const json = { 'content-type': 'application/json', origin: BASE_URL };

  it('a chunked body over the limit gets 413 before it ends, on an API route, auth routes and the sign-in form', async () => {
    const targets = [
      { path: '/api/users', headers: { ...json, cookie: admin.cookie }, bytes: 1_100_000 },
      { path: '/api/auth/sign-in/email', headers: json, bytes: 20_000 },
      { path: '/api/auth/request-password-reset', headers: json, bytes: 20_000 },
      {
        path: '/sign-in',
        headers: { 'content-type': 'application/x-www-form-urlencoded', origin: BASE_URL },
        bytes: 20_000,
      },
    ];
    for (const t of targets) {
      // The request is never finished: only a server that stops reading at its cap can answer.
      const res = await rawRequest({
        method: 'POST',
        path: t.path,
        headers: t.headers,
        totalBytes: t.bytes,
        holdOpen: true,
      });
      expect(res.status, t.path).toBe(413);
    }
  });

  it('a declared Content-Length over the limit is refused with 413 before any of the body is sent', async () => {
    const res = await rawRequest({
      method: 'POST',
      path: '/api/estimates',
      headers: { ...json, cookie: planner.cookie },
      declaredLength: 2_000_000,
      holdOpen: true,
    });
    expect(res.status).toBe(413);
    expect(JSON.parse(res.body).error.code).toBe('PAYLOAD_TOO_LARGE');
    const auth = await rawRequest({
      method: 'POST',
      path: '/api/auth/sign-in/email',
      headers: json,
      declaredLength: 100_000,
      holdOpen: true,
    });
    expect(auth.status).toBe(413);
  });
});

describe('framing and scripts (item 6)', () => {
  it('pages carry a CSP with script hashes, no inline scripts or style elements, and frame-ancestors none', async () => {
    for (const path of ['/sign-in', '/admin/users']) {
      const res = await fetch(`${BASE_URL}${path}`, { headers: { cookie: admin.cookie } });
      expect(res.status, path).toBe(200);
      const csp = res.headers.get('content-security-policy') ?? '';
      expect(csp, path).toMatch(/frame-ancestors 'none'/);
      expect(csp, path).toMatch(/script-src 'self' 'sha256-[A-Za-z0-9+/=]+'/);
      // No inline or eval allowance for scripts or style elements; only style attributes (set by React islands and the maps) may be inline.
      const directives = Object.fromEntries(
        csp
          .split(';')
          .map((d) => d.trim())
          .filter(Boolean)
          .map((d) => [d.split(/\s+/)[0], d]),
      );
      for (const [name, value] of Object.entries(directives)) {
        if (name !== 'style-src-attr') expect(value, `${path} ${name}`).not.toMatch(/unsafe-inline|unsafe-eval/);
      }
      expect(directives['style-src-attr'] ?? '', path).not.toMatch(/unsafe-eval/);
      expect(res.headers.get('x-frame-options')).toBe('DENY');
      expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    }
  });

  it('the map page admits a configured basemap host for images and nothing more', async () => {
    const cspOfMap = async () =>
      (await fetch(`${BASE_URL}/map`, { headers: { cookie: planner.cookie } })).headers.get(
        'content-security-policy',
      ) ?? '';
    expect(await cspOfMap()).toMatch(/img-src 'self' data: blob:;/);
    await testDb('app_setting')
      .insert({ key: 'map.basemap-url', value: JSON.stringify('https://tiles.example/{z}/{x}/{y}.png') })
      .onConflict('key')
      .merge();
    try {
      const csp = await cspOfMap();
      expect(csp).toMatch(/img-src 'self' data: blob: https:\/\/tiles\.example;/);
      expect(csp).toMatch(/frame-ancestors 'none'/);
      expect(csp.match(/style-src-attr/g)).toHaveLength(1);
      expect(csp).not.toMatch(/script-src[^;]*(unsafe|tiles\.example)/);
    } finally {
      await testDb('app_setting').where({ key: 'map.basemap-url' }).del();
    }
  });

  it('static files (icon, bundled scripts) are sent with nosniff and may not be framed', async () => {
    // The sign-in page ships no script; the public register's list does.
    const page = await (await fetch(`${BASE_URL}/register`)).text();
    const script = /\/_astro\/[^"' ]+\.js/.exec(page)?.[0];
    expect(script).toBeTruthy();
    for (const path of ['/favicon.svg', script!]) {
      const res = await fetch(`${BASE_URL}${path}`);
      expect(res.status, path).toBe(200);
      expect(res.headers.get('x-content-type-options'), path).toBe('nosniff');
      expect(res.headers.get('content-security-policy'), path).toMatch(/frame-ancestors 'none'/);
    }
  });
});

describe('cross-origin writes (item 7)', () => {
  const body = { name: 'Cross Site', email: `cross.${Date.now()}@tarrow.example`, roles: ['planner'] };

  it('a write from a foreign, null, other-port or missing Origin is refused, and nothing is written', async () => {
    for (const origin of ['http://evil.example', 'null', 'http://127.0.0.1:9']) {
      const res = await api('POST', '/api/users', { session: admin, body, headers: { origin } });
      expect(res.status, origin).toBe(403);
      expect(res.body.error.code).toBe('FORBIDDEN');
    }
    const none = await rawRequest({
      method: 'POST',
      path: '/api/users',
      headers: { cookie: admin.cookie, 'content-type': 'application/json' },
    });
    expect(none.status).toBe(403);
    const crossSite = await rawRequest({
      method: 'POST',
      path: '/api/users',
      headers: { cookie: admin.cookie, 'content-type': 'application/json', 'sec-fetch-site': 'same-site' },
    });
    expect(crossSite.status).toBe(403);
    expect(await testDb('user').where({ email: body.email }).first()).toBeUndefined();
    // Without Origin, the browser's own Sec-Fetch-Site: same-origin is enough (then the empty object is a 422).
    const same = await rawRequest({
      method: 'POST',
      path: '/api/users',
      headers: { cookie: admin.cookie, 'content-type': 'application/json', 'sec-fetch-site': 'same-origin' },
      body: '{}',
    });
    expect(same.status).toBe(422);
  });

  it('the media type is parsed exactly: only application/json (UTF-8) is JSON', async () => {
    for (const type of [
      'text/plain; charset=application/json',
      'application/jsonx',
      'application/json; charset=latin1',
      'application/json;;',
    ]) {
      const res = await api('POST', '/api/users', {
        session: admin,
        body: JSON.stringify(body),
        headers: { 'content-type': type },
      });
      expect(res.status, type).toBe(415);
    }
    const ok = await api('POST', '/api/users', {
      session: admin,
      body: JSON.stringify({}),
      headers: { 'content-type': 'Application/JSON; charset="UTF-8"' },
    });
    expect(ok.status).toBe(422);
  });
});

describe('odd input is a 4xx, never a 500 (item 8)', () => {
  it('a NUL character in a text field, a query or a sign-in is refused with 400', async () => {
    const res = await api('POST', '/api/users', {
      session: admin,
      body: { name: 'Nul\u0000Person', email: `nul.${Date.now()}@tarrow.example`, roles: ['planner'] },
    });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/NUL/);
    expect((await api('GET', '/api/parcels/search?q=a%00b', { session: planner })).status).toBe(400);
    expect(
      (await api('POST', '/api/auth/sign-in/email', { body: { email: 'a\u0000@tarrow.example', password: 'x' } }))
        .status,
    ).toBe(400);
  });

  it('an integer beyond PostgreSQL integer range is a 422', async () => {
    const res = await api('GET', '/api/factor-sets/ipcc-2006?version=2147483648', { session: planner });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/2147483647/);
    const parcel = await api('GET', '/api/parcels/2147483648', { session: planner });
    expect(parcel.status).toBe(422);
    expect(parcel.body.error.message).toMatch(/whole numbers/);
  });

  it('TRACE is answered 405 with Allow, on pages and API routes alike', async () => {
    for (const path of ['/', '/api/health', '/sign-in']) {
      const res = await rawRequest({ method: 'TRACE', path });
      expect(res.status, path).toBe(405);
      expect(res.headers.allow).toBeTruthy();
    }
  });
});

describe('API misses (item 9)', () => {
  it('an unknown API route answers 404 in the JSON error shape', async () => {
    for (const path of ['/api/no-such-thing', '/api/users/x/y/z', '/api/auth/update-user']) {
      const res = await api('GET', path, { session: planner });
      expect(res.status, path).toBe(404);
      expect(res.headers.get('content-type'), path).toMatch(/application\/json/);
      expect(res.body.error.code, path).toBe('NOT_FOUND');
    }
  });

  it('a wrong method answers 405 with Allow in the JSON error shape', async () => {
    const res = await api('DELETE', '/api/me', { session: planner });
    expect(res.status).toBe(405);
    expect(res.headers.get('allow')).toBe('GET, HEAD');
    expect(res.body.error.code).toBe('METHOD_NOT_ALLOWED');
    const users = await api('PUT', '/api/users', { session: admin, body: {} });
    expect(users.status).toBe(405);
    expect(users.headers.get('allow')).toBe('GET, HEAD, POST');
    const auth = await api('GET', '/api/auth/sign-in/email');
    expect(auth.status).toBe(405);
    expect(auth.headers.get('allow')).toBe('POST');
  });
});

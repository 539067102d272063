/**
 * The direct lane (src/lib/http/direct-lane.ts): scripts/serve.mjs serves POST /api/estimates
 * without Astro's pipeline. The test app runs the lane; a second instance runs with DIRECT_LANE=off,
 * so every answer goes through Astro as before. Both must refuse and answer alike: the same status,
 * JSON and headers (request id, date and the framing of the body aside).
 */
import type { ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import http from 'node:http';
import { gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { WORKED_EXAMPLES } from '../fixtures/worked-examples';
import { APP_PORT, appEnv, BASE_URL, SECOND_APP_PORT } from '../support/env';
import { DEMO, signIn, type Session } from '../support/http';
import { startAppInstance, stopProcess } from '../support/processes';

const ASTRO = `http://127.0.0.1:${SECOND_APP_PORT}`;
const APP_LOG = `.data/test-app-${APP_PORT}.log`;
const BODY = WORKED_EXAMPLES[0]!.request;
/** Headers that differ between any two answers, or only in how the body is framed. */
const FRAMING = new Set(['date', 'x-request-id', 'content-length', 'transfer-encoding', 'connection', 'keep-alive']);

let lane: Session;
let astro: Session;
let second: ChildProcess;
beforeAll(async () => {
  second = await startAppInstance(
    { ...appEnv(SECOND_APP_PORT), MAIL_WORKER: 'off', JOB_QUEUE: 'off', DIRECT_LANE: 'off' },
    SECOND_APP_PORT,
  );
  [lane, astro] = await Promise.all([signIn(DEMO.planner), signIn(DEMO.planner, undefined, ASTRO)]);
});
afterAll(async () => {
  await stopProcess(second);
});

type Answer = { status: number; headers: Record<string, string>; text: string; length: string | null };

async function post(
  base: string,
  session: Session | null,
  body: string,
  headers: Record<string, string> = {},
): Promise<Answer> {
  const res = await fetch(`${base}/api/estimates`, {
    method: 'POST',
    headers: {
      origin: base,
      'content-type': 'application/json',
      ...(session ? { cookie: session.cookie } : {}),
      ...headers,
    },
    body,
  });
  const kept = Object.fromEntries([...res.headers].filter(([k]) => !FRAMING.has(k)));
  return { status: res.status, headers: kept, text: await res.text(), length: res.headers.get('content-length') };
}

/** The same request to the lane and to Astro; both answers, after checking they are the same. */
async function both(body: string, headers: Record<string, string> = {}, signedIn = true) {
  const a = await post(BASE_URL, signedIn ? lane : null, body, headers);
  const b = await post(ASTRO, signedIn ? astro : null, body, headers);
  expect(a.status).toBe(b.status);
  expect(a.headers).toEqual(b.headers);
  expect(a.text).toBe(b.text);
  return a;
}

/** A POST through node:http, which (unlike fetch) sends only the headers given. */
function rawPost(
  base: string,
  session: Session,
  headers: Record<string, string>,
): Promise<{ status: number; headers: Record<string, string>; body: Buffer }> {
  return new Promise((resolve, reject) => {
    const req = http.request(
      `${base}/api/estimates`,
      {
        method: 'POST',
        headers: { origin: base, cookie: session.cookie, 'content-type': 'application/json', ...headers },
      },
      (r) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () =>
          resolve({
            status: r.statusCode ?? 0,
            headers: Object.fromEntries(
              Object.entries(r.headers).filter(([k]) => !FRAMING.has(k)) as [string, string][],
            ),
            body: Buffer.concat(chunks),
          }),
        );
      },
    );
    req.on('error', reject);
    req.end(JSON.stringify(BODY));
  });
}

describe('the direct lane answers as the Astro route does', () => {
  it('an estimate: same JSON, same headers, security headers included, sent with its length', async () => {
    // Without compression, so the framing of the body shows.
    const a = await both(JSON.stringify(BODY), { 'accept-encoding': 'identity' });
    expect(a.status).toBe(200);
    expect(JSON.parse(a.text).factorSet).toEqual({ id: 'ipcc-2006', version: 1 });
    expect(a.headers).toMatchObject({
      'content-type': 'application/json; charset=utf-8',
      'cache-control': 'no-store',
      'x-content-type-options': 'nosniff',
      'x-frame-options': 'DENY',
      'referrer-policy': 'same-origin',
      'content-security-policy': "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'",
    });
    // The lane writes the body in one piece with its length (Astro streams it in chunks).
    expect(Number(a.length)).toBe(Buffer.byteLength(a.text));
  });

  it('without Accept-Encoding: the same headers too (Vary included), nothing compressed', async () => {
    const [a, b] = await Promise.all([rawPost(BASE_URL, lane, {}), rawPost(ASTRO, astro, {})]);
    expect(a.status).toBe(200);
    expect(a.headers).toEqual(b.headers);
    expect(a.headers['content-encoding']).toBeUndefined();
    expect(a.headers.vary).toMatch(/accept-encoding/i);
    expect(a.body.toString()).toBe(b.body.toString());
  });

  it('compresses when the client asks', async () => {
    const res = await rawPost(BASE_URL, lane, { 'accept-encoding': 'gzip' });
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.headers.vary).toMatch(/accept-encoding/i);
    expect(JSON.parse(gunzipSync(res.body).toString()).factorSet.id).toBe('ipcc-2006');
  });

  it('logs the request with its id and route', async () => {
    const id = `lane-test-${Date.now()}`;
    const a = await post(BASE_URL, lane, JSON.stringify(BODY), { 'x-request-id': id });
    expect(a.status).toBe(200);
    let line: Record<string, unknown> | undefined;
    for (let i = 0; i < 40 && !line; i++) {
      line = readFileSync(APP_LOG, 'utf8')
        .split('\n')
        .filter((l) => l.startsWith('{'))
        .map((l) => JSON.parse(l) as Record<string, unknown>)
        .find((l) => l.reqId === id && l.msg === 'request');
      if (!line) await new Promise((r) => setTimeout(r, 50));
    }
    expect(line).toMatchObject({ method: 'POST', route: '/api/estimates', status: 200 });
  });
});

describe('the direct lane still refuses', () => {
  it('no session: 401', async () => {
    const a = await both(JSON.stringify(BODY), {}, false);
    expect(a.status).toBe(401);
    expect(JSON.parse(a.text).error.code).toBe('UNAUTHORIZED');
  });

  it('a foreign or missing Origin: 403', async () => {
    for (const origin of ['http://evil.example', 'null']) {
      const a = await both(JSON.stringify(BODY), { origin });
      expect(a.status, origin).toBe(403);
    }
    const res = await fetch(`${BASE_URL}/api/estimates`, {
      method: 'POST',
      headers: { cookie: lane.cookie, 'content-type': 'application/json' },
      body: JSON.stringify(BODY),
    });
    expect(res.status).toBe(403);
  });

  it('a bad body: 422 with issues naming the field; bad JSON 400; another media type 415', async () => {
    const a = await both(JSON.stringify({ ...BODY, areaHa: -3 }));
    expect(a.status).toBe(422);
    const error = JSON.parse(a.text).error;
    expect(error.code).toBe('UNPROCESSABLE_CONTENT');
    expect(error.issues.map((i: { path: unknown[] }) => i.path.join('.'))).toContain('areaHa');
    const big = await both(JSON.stringify({ ...BODY, factorSetVersion: 2 ** 40 }));
    expect(big.status).toBe(422);
    expect((await both('{"climate":')).status).toBe(400);
    expect((await both(JSON.stringify({ ...BODY, climate: 'cool\u0000' }))).status).toBe(400);
    expect((await both(JSON.stringify(BODY), { 'content-type': 'text/plain' })).status).toBe(415);
  });

  it('an oversized body: 413, declared or streamed', async () => {
    const huge = JSON.stringify({ ...BODY, pad: 'x'.repeat(1_000_100) });
    const a = await both(huge);
    expect(a.status).toBe(413);
    // Sent in chunks without a declared length: cut off at the cap while reading.
    const status = await new Promise<number>((resolve, reject) => {
      const req = http.request(`${BASE_URL}/api/estimates`, {
        method: 'POST',
        headers: {
          origin: BASE_URL,
          cookie: lane.cookie,
          'content-type': 'application/json',
          'transfer-encoding': 'chunked',
        },
      });
      req.on('response', (r) => {
        r.resume();
        resolve(r.statusCode ?? 0);
      });
      req.on('error', reject);
      for (let i = 0; i < 11; i++) req.write('x'.repeat(100_000));
      req.end();
    });
    expect(status).toBe(413);
  });

  it('other methods and paths still go through Astro: 405 with Allow, 404', async () => {
    const get = await fetch(`${BASE_URL}/api/estimates`, { headers: { cookie: lane.cookie } });
    expect(get.status).toBe(405);
    expect(get.headers.get('allow')).toBe('POST');
    const none = await fetch(`${BASE_URL}/api/estimatesx`, { method: 'POST', headers: { origin: BASE_URL } });
    expect(none.status).toBe(404);
  });
});

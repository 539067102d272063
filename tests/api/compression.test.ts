/** Compressed answers: precompressed static files, Brotli/gzip for pages, JSON, CSV and vector tiles, identity when not accepted. */
import { readFileSync, statSync } from 'node:fs';
import http from 'node:http';
import zlib from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { APP_PORT, BASE_URL, DIST } from '../support/env';
import { api, DEMO, signIn } from '../support/http';

type Raw = { status: number; headers: http.IncomingHttpHeaders; bytes: Buffer };
function get(path: string, headers: Record<string, string>, method = 'GET'): Promise<Raw> {
  return new Promise((resolve, reject) => {
    const req = http.request({ host: '127.0.0.1', port: APP_PORT, method, path, headers }, (res) => {
      const parts: Buffer[] = [];
      res.on('data', (d: Buffer) => parts.push(d));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, bytes: Buffer.concat(parts) }));
    });
    req.on('error', reject);
    req.end();
  });
}
const decode = (r: Raw) =>
  r.headers['content-encoding'] === 'br'
    ? zlib.brotliDecompressSync(r.bytes)
    : r.headers['content-encoding'] === 'gzip'
      ? zlib.gunzipSync(r.bytes)
      : r.bytes;

describe('compression', () => {
  it('serves a script from its precompressed copy, Brotli first, gzip second, plain when neither is accepted', async () => {
    // The sign-in page ships no script; the public register's list does.
    const page = await (await fetch(`${BASE_URL}/register`)).text();
    const script = /\/_astro\/[^"]+\.js/.exec(page)?.[0];
    expect(script).toBeDefined();
    const plain = readFileSync(`${DIST}/client${script}`);
    const br = await get(script!, { 'accept-encoding': 'gzip, deflate, br' });
    expect(br.status).toBe(200);
    expect(br.headers['content-encoding']).toBe('br');
    expect(br.headers.vary).toMatch(/accept-encoding/i);
    expect(br.headers['cache-control']).toContain('immutable');
    expect(Number(br.headers['content-length'])).toBe(statSync(`${DIST}/client${script}.br`).size);
    expect(decode(br).equals(plain)).toBe(true);
    const gz = await get(script!, { 'accept-encoding': 'gzip' });
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(decode(gz).equals(plain)).toBe(true);
    const none = await get(script!, {});
    expect(none.headers['content-encoding']).toBeUndefined();
    expect(none.bytes.equals(plain)).toBe(true);
    const head = await get(script!, { 'accept-encoding': 'br' }, 'HEAD');
    expect(head.status).toBe(200);
    expect(head.bytes.length).toBe(0);
    // No way out of the build folder.
    const out = await get('/_astro/..%2f..%2fpackage.json', { 'accept-encoding': 'br' });
    expect(out.status).toBe(404);
    expect(decode(out).toString()).not.toContain('"swardkeep"');
  });

  it('compresses pages, JSON, CSV and vector tiles on the fly and keeps the security headers', async () => {
    const pg = await get('/sign-in', { 'accept-encoding': 'br' });
    expect(pg.headers['content-encoding']).toBe('br');
    expect(decode(pg).toString()).toContain('<html');
    expect(pg.headers['x-content-type-options']).toBe('nosniff');
    expect(pg.headers['content-security-policy']).toBeDefined();
    const json = await get('/api/openapi.json', { 'accept-encoding': 'gzip' });
    expect(json.headers['content-encoding']).toBe('gzip');
    expect(JSON.parse(decode(json).toString()).openapi).toMatch(/^3\./);
    expect(json.bytes.length).toBeLessThan(decode(json).length / 3);
    const csv = await get('/api/register.csv', { 'accept-encoding': 'br' });
    expect(csv.status).toBe(200);
    expect(decode(csv).toString()).toMatch(/^\uFEFF?[a-z_]+,/i);
    const session = await signIn(DEMO.planner);
    const map = await api('GET', '/api/map', { session });
    const version = map.body.dataVersion as number;
    // The tile over the demo fields of Corrowmere (slippy-map numbering, common practice).
    const [x, y] = [
      Math.floor(((-16.0 + 180) / 360) * 2 ** 14),
      Math.floor(
        ((1 - Math.log(Math.tan((52.39 * Math.PI) / 180) + 1 / Math.cos((52.39 * Math.PI) / 180)) / Math.PI) / 2) *
          2 ** 14,
      ),
    ];
    const tile = await get(`/api/tiles/14/${x}/${y}.mvt?v=${version}`, {
      'accept-encoding': 'br',
      cookie: session.cookie,
    });
    expect(tile.status).toBe(200);
    expect(tile.headers['content-encoding']).toBe('br');
    const etag = tile.headers.etag!;
    const again = await get(`/api/tiles/14/${x}/${y}.mvt?v=${version}`, {
      'accept-encoding': 'br',
      cookie: session.cookie,
      'if-none-match': etag,
    });
    expect(again.status).toBe(304);
  });
});

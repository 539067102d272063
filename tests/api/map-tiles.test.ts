/**
 * Parcel vector tiles authorised by the tile token of GET /api/map (no session look-up), immutable
 * per data version and kept in process by version: a second instance on the same database that
 * changes the parcels bumps the version, and neither instance serves the old data for the new
 * version. Tiles are decoded with @mapbox/vector-tile (the reference MVT reader) and hold no
 * personal data.
 */
import type { ChildProcess } from 'node:child_process';
import { VectorTile } from '@mapbox/vector-tile';
import { PbfReader } from 'pbf';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fromWgs84, toWgs84 } from '~/lib/gis/crs';
import { crsFromEpsg } from '~/lib/gis/crs-catalogue.server';
import { CORROWMERE } from '../../gis/lib/regions';
import { testDb } from '../support/db';
import { appEnv, BASE_URL, SECOND_APP_PORT } from '../support/env';
import { api, DEMO, signIn, type Session } from '../support/http';
import { personalSecrets } from '../support/personal-data';
import { startAppInstance, stopProcess } from '../support/processes';

const SECOND = `http://127.0.0.1:${SECOND_APP_PORT}`;
/** Slippy-map tile of a lon/lat at zoom z (OSM convention, common practice): over the Corrowmere demo fields. */
const tileOf = (lon: number, lat: number, z: number) => {
  const n = 2 ** z;
  const r = (lat * Math.PI) / 180;
  return [
    Math.floor(((lon + 180) / 360) * n),
    Math.floor(((1 - Math.log(Math.tan(r) + 1 / Math.cos(r)) / Math.PI) / 2) * n),
  ] as const;
};
const [X, Y] = tileOf(-16.0, 52.39, 14);
const ALLOWED = ['id', 'reference', 'land_use', 'area_ha', 'screening_level'];

let planner: Session;
let second: ChildProcess;
beforeAll(async () => {
  planner = await signIn(DEMO.planner);
  second = await startAppInstance(
    { ...appEnv(SECOND_APP_PORT), MAIL_WORKER: 'off', JOB_QUEUE: 'off' },
    SECOND_APP_PORT,
  );
});
afterAll(async () => {
  await stopProcess(second);
  await testDb.destroy();
});

async function config(base = BASE_URL) {
  const r = await api('GET', '/api/map', { session: planner, base });
  expect(r.status).toBe(200);
  return r.body as { dataVersion: number; tileToken: string };
}

/** A tile fetched with the token only (no cookie). */
async function tile(
  base: string,
  c: { dataVersion: number; tileToken: string },
  headers: Record<string, string> = {},
  [x, y]: readonly [number, number] = [X, Y],
) {
  const res = await fetch(
    `${base}/api/tiles/14/${x}/${y}.mvt?v=${c.dataVersion}&t=${encodeURIComponent(c.tileToken)}`,
    { headers },
  );
  const bytes = new Uint8Array(await res.arrayBuffer());
  return { res, bytes };
}

function parcelRefs(bytes: Uint8Array): string[] {
  const layer = new VectorTile(new PbfReader(bytes)).layers.parcels;
  if (!layer) return [];
  return Array.from({ length: layer.length }, (_, i) => String(layer.feature(i).properties.reference));
}

describe('tile tokens', () => {
  it('authorise tiles without a session, on every instance, with only the allowed properties and no personal data', async () => {
    const c = await config();
    for (const base of [BASE_URL, SECOND]) {
      const { res, bytes } = await tile(base, c);
      expect(res.status).toBe(200);
      expect(res.headers.get('etag')).toBe(`"m${c.dataVersion}"`);
      expect(res.headers.get('cache-control')).toMatch(/private, max-age=86400, immutable/);
      const layer = new VectorTile(new PbfReader(bytes)).layers.parcels!;
      expect(layer.length).toBeGreaterThan(0);
      for (let i = 0; i < layer.length; i++)
        for (const k of Object.keys(layer.feature(i).properties)) expect(ALLOWED).toContain(k);
      const text = Buffer.from(bytes).toString('latin1');
      for (const secret of await personalSecrets()) expect(text).not.toContain(secret);
    }
  });

  it('refuse a changed or missing token, and work for tiles only', async () => {
    const c = await config();
    const last = c.tileToken.at(-1) === 'A' ? 'B' : 'A';
    expect((await tile(BASE_URL, { ...c, tileToken: c.tileToken.slice(0, -1) + last })).res.status).toBe(401);
    expect((await tile(BASE_URL, { ...c, tileToken: '' })).res.status).toBe(401);
    expect((await fetch(`${BASE_URL}/api/map?t=${encodeURIComponent(c.tileToken)}`)).status).toBe(401);
    expect((await fetch(`${BASE_URL}/api/parcels/search?q=CM&t=${encodeURIComponent(c.tileToken)}`)).status).toBe(401);
  });

  it('answer 304 to a matching If-None-Match on a versioned URL', async () => {
    const c = await config();
    const first = await tile(BASE_URL, c);
    const again = await tile(BASE_URL, c, { 'if-none-match': first.res.headers.get('etag')! });
    expect(again.res.status).toBe(304);
  });
});

describe('tiles kept by data version across instances', () => {
  it('a change on one instance gives a new version whose tiles show it on both, while the old URL stays the old version', async () => {
    // A free spot west of the demo grid (UTM 28N metres from its origin, as gis/lib/demo-parcels.ts lays it out) and its tile.
    const utm = await crsFromEpsg(32628);
    const o = fromWgs84(CORROWMERE.originLonLat, utm).map((n) => Math.round(n));
    const ring = [
      [-650, 520],
      [-560, 520],
      [-560, 600],
      [-650, 600],
      [-650, 520],
    ].map(([dx, dy]) => toWgs84([o[0]! + dx!, o[1]! + dy!], utm));
    const at = tileOf(ring[0]![0]!, ring[0]![1]!, 14);
    const before = await config();
    const old = { A: await tile(BASE_URL, before, {}, at), B: await tile(SECOND, before, {}, at) };
    // A parcel drawn through instance B bumps the map version.
    const made = await api('POST', '/api/parcels', {
      session: planner,
      base: SECOND,
      body: {
        reference: 'TEST-TILEV-1',
        geometry: { type: 'Polygon', coordinates: [ring] },
        evidence: 'tile version test',
      },
    });
    expect(made.status).toBeLessThan(300);
    const after = await config(BASE_URL);
    expect(after.dataVersion).toBeGreaterThan(before.dataVersion);
    for (const base of [BASE_URL, SECOND]) {
      const fresh = await tile(base, after, {}, at);
      expect(fresh.res.headers.get('etag')).toBe(`"m${after.dataVersion}"`);
      expect(parcelRefs(fresh.bytes)).toContain('TEST-TILEV-1');
      // Unversioned (session) request: the current data too.
      const current = await fetch(`${base}/api/tiles/14/${at[0]}/${at[1]}.mvt`, {
        headers: { cookie: planner.cookie },
      });
      expect(parcelRefs(new Uint8Array(await current.arrayBuffer()))).toContain('TEST-TILEV-1');
    }
    for (const [base, was] of [
      [BASE_URL, old.A],
      [SECOND, old.B],
    ] as const) {
      const stale = await tile(base, before, {}, at);
      expect(stale.res.headers.get('etag')).toBe(`"m${before.dataVersion}"`);
      expect(Buffer.from(stale.bytes).equals(Buffer.from(was.bytes))).toBe(true);
      expect(parcelRefs(stale.bytes)).not.toContain('TEST-TILEV-1');
    }
  });
});

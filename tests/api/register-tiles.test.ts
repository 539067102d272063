/**
 * Public vector tiles of the register: decoded with @mapbox/vector-tile (the reference MVT
 * reader), they hold the parcels of the entries in force with seq, outcome, year, risk level and
 * area only, and no personal data; the ETag follows the register head.
 */
import { VectorTile } from '@mapbox/vector-tile';
import * as turf from '@turf/turf';
import { PbfReader } from 'pbf';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { decidedProposal } from '../support/board';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { api, DEMO, signIn, type Session } from '../support/http';
import { personalSecrets } from '../support/personal-data';

/** Slippy-map tile of a lon/lat at zoom z (OSM convention, common practice). */
const tileOf = (lon: number, lat: number, z: number) => {
  const n = 2 ** z;
  const r = (lat * Math.PI) / 180;
  return [
    Math.floor(((lon + 180) / 360) * n),
    Math.floor(((1 - Math.log(Math.tan(r) + 1 / Math.cos(r)) / Math.PI) / 2) * n),
  ] as const;
};
const ALLOWED = ['seq', 'outcome', 'year', 'risk_level', 'area_ha'];

let s: { planner: Session; assessor: Session; board: Session; chair: Session };
beforeAll(async () => {
  const [planner, assessor, board, chair] = await Promise.all(
    [DEMO.planner, DEMO.assessor, DEMO.board, DEMO.chair].map((e) => signIn(e)),
  );
  s = { planner, assessor, board, chair };
  await testDb('app_setting').where({ key: 'board.quorum' }).delete();
});
afterAll(() => testDb.destroy());

async function tileAround(seq: number, z = 14) {
  const c = (await testDb('register_entry').where({ seq }).first()).content;
  const [lon, lat] = turf.pointOnFeature(c.parcels[0].geometry).geometry.coordinates as [number, number];
  const [x, y] = tileOf(lon, lat, z);
  const res = await fetch(`${BASE_URL}/api/register/tiles/${z}/${x}/${y}.mvt`);
  const bytes = new Uint8Array(await res.arrayBuffer());
  return {
    res,
    bytes,
    tile: new VectorTile(new PbfReader(bytes)),
    point: [lon, lat] as [number, number],
    x,
    y,
    z,
    content: c,
  };
}

describe('GET /api/register/tiles/{z}/{x}/{y}.mvt', () => {
  it('is public; the "register" layer holds the entry’s parcel with only seq, outcome, year, risk level and area', async () => {
    const seq = Number(
      (
        await testDb.raw(
          'select max(seq) as m from register_entry e where not exists (select 1 from register_entry s where s.supersedes_seq = e.seq)',
        )
      ).rows[0].m,
    );
    const t = await tileAround(seq);
    expect(t.res.status).toBe(200);
    expect(t.res.headers.get('content-type')).toBe('application/vnd.mapbox-vector-tile');
    expect(Object.keys(t.tile.layers)).toEqual(['register']);
    const layer = t.tile.layers.register!;
    const features = Array.from({ length: layer.length }, (_, i) => layer.feature(i));
    for (const f of features) expect(Object.keys(f.properties).every((k) => ALLOWED.includes(k))).toBe(true);
    const mine = features.filter((f) => f.properties.seq === seq);
    expect(mine.length).toBeGreaterThan(0);
    expect(mine[0]!.properties).toMatchObject({
      outcome: t.content.outcome,
      year: Number(t.content.decidedOn.slice(0, 4)),
      risk_level: t.content.risk.level,
      area_ha: t.content.areaHa,
    });
    // The decoded polygon (back to lon/lat) holds the point we asked around.
    expect(mine.some((f) => turf.booleanPointInPolygon(t.point, f.toGeoJSON(t.x, t.y, t.z) as never))).toBe(true);
  });

  it('superseded entries are left out (their replacement carries the parcels)', async () => {
    const old = await testDb.raw(
      'select e.supersedes_seq as old, e.seq from register_entry e where e.supersedes_seq is not null order by e.seq limit 1',
    );
    const { old: oldSeq, seq: newSeq } = old.rows[0];
    const t = await tileAround(Number(newSeq));
    const layer = t.tile.layers.register!;
    const seqs = Array.from({ length: layer.length }, (_, i) => layer.feature(i).properties.seq);
    expect(seqs).toContain(Number(newSeq));
    expect(seqs).not.toContain(Number(oldSeq));
  });

  it('holds no personal data: every value and the raw bytes are free of applicants, owners, holdings and staff', async () => {
    const secrets = await personalSecrets();
    const seqs = (await testDb('register_entry').select('seq').orderBy('seq')).map((r) => Number(r.seq));
    for (const seq of seqs) {
      const t = await tileAround(seq, 13);
      const text = new TextDecoder().decode(t.bytes);
      const layer = t.tile.layers.register!;
      const values = Array.from({ length: layer.length }, (_, i) =>
        Object.values(layer.feature(i).properties).join(' '),
      ).join(' ');
      for (const secret of secrets) {
        expect(text.includes(secret), `tile around entry ${seq} contains "${secret}"`).toBe(false);
        expect(values.includes(secret)).toBe(false);
      }
    }
  });

  it('ETag is the register head: 304 on a match, a new ETag after a new entry; missing tiles are refused', async () => {
    const d = await testDb('register_entry').orderBy('seq', 'desc').first();
    const t = await tileAround(Number(d.seq));
    const etag = t.res.headers.get('etag')!;
    expect(etag).toContain(`r${d.seq}-`);
    const path = `/api/register/tiles/${t.z}/${t.x}/${t.y}.mvt`;
    expect((await api('GET', path, { headers: { 'if-none-match': etag } })).status).toBe(304);
    expect((await api('GET', `${path}?v=${d.seq}`)).headers.get('cache-control')).toMatch(/immutable/);
    await decidedProposal(s, 'refused');
    const after = await api('GET', path, { headers: { 'if-none-match': etag } });
    expect(after.status).toBe(200);
    expect(after.headers.get('etag')).not.toBe(etag);
    expect((await api('GET', '/api/register/tiles/3/8/1.mvt')).status).toBe(400);
    expect((await api('GET', '/api/register/tiles/x/1/1.mvt')).status).toBe(422);
  }, 120_000);
});

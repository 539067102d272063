/**
 * Upload flow end to end (stage → validate → save, cancel) and the PostGIS overlay against the
 * seeded demo reference layers, with hand-computed fractions; boundary edits; vector tiles.
 */
import { createHash } from 'node:crypto';
import type { Position } from 'geojson';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fromWgs84, toWgs84 } from '~/lib/gis/crs';
import { crsFromEpsg } from '~/lib/gis/crs-catalogue.server';
import { CORROWMERE } from '../../gis/lib/regions';
import { layerEntries, sampleFiles, zipOf } from '../unit/gis/shapefile-fixtures';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { api, DEMO, signIn, type Session } from '../support/http';
import { uploadFile, uploadRowCounts } from '../support/uploads';

let planner: Session;
let origin: Position;
const utm = await crsFromEpsg(32628);
beforeAll(async () => {
  planner = await signIn(DEMO.planner);
  // Grid origin of the demo region, as gis/lib/demo-parcels.ts regionOrigin() computes it.
  origin = fromWgs84(CORROWMERE.originLonLat, utm).map((n) => Math.round(n));
});
afterAll(() => testDb.destroy());

/** A rectangle [x0, y0, x1, y1] in metres from the demo grid origin (UTM 28N), as lon/lat. */
function rect([x0, y0, x1, y1]: [number, number, number, number]) {
  const c = [
    [x0, y0],
    [x1, y0],
    [x1, y1],
    [x0, y1],
    [x0, y0],
  ].map(([x, y]) => toWgs84([origin[0]! + x!, origin[1]! + y!], utm));
  return { type: 'Polygon' as const, coordinates: [c] };
}

describe('upload flow', () => {
  const zip = zipOf(layerEntries('flow_parcels', sampleFiles({ names: ['Test Alpha', 'Test Beta'] })));
  const mapping = {
    reference: 'field_ref',
    name: 'name',
    lastTillage: 'last_till',
    statedArea: 'stated_ha',
    statedAreaUnit: 'ha',
  };

  it('stages, reports per feature, saves in one go and keeps the original file with its SHA-256', async () => {
    const staged = await uploadFile(planner, 'flow.zip', zip);
    expect(staged.status).toBe(201);
    expect(staged.body.layers[0]).toMatchObject({
      name: 'flow_parcels',
      featureCount: 2,
      crs: { epsg: 32628, source: 'prj' },
    });
    expect(staged.body.layers[0].columns.find((c: { name: string }) => c.name === 'name').samples).toEqual([
      'Test Alpha',
      'Test Beta',
    ]);
    const id = staged.body.id;
    const noRef = await api('POST', `/api/uploads/${id}/validation`, {
      session: planner,
      body: { layer: 'flow_parcels', mapping: { name: 'name' } },
    });
    expect(noRef.status).toBe(422);
    expect(noRef.body.error.message).toMatch(/mapping\.reference/);
    const badCol = await api('POST', `/api/uploads/${id}/validation`, {
      session: planner,
      body: { layer: 'flow_parcels', mapping: { reference: 'nope' } },
    });
    expect(badCol.body.error.message).toBe('Layer "flow_parcels" has no column "nope".');
    const report = await api('POST', `/api/uploads/${id}/validation`, {
      session: planner,
      body: { layer: 'flow_parcels', mapping },
    });
    expect(report.status).toBe(200);
    // T-1 is 100 m × 100 m in UTM: 1 ha stated; T-2 has a 20 m × 20 m pond: 0.96 ha stated. Both within tolerance.
    expect(report.body.summary).toMatchObject({ total: 2, ok: 2, rejected: 0 });
    const saved = await api('POST', `/api/uploads/${id}/save`, { session: planner });
    expect(saved.status).toBe(201);
    expect(saved.body).toMatchObject({ saved: 2, rejected: 0, purpose: 'parcels' });
    const batch = await testDb('upload_batch').where({ id: saved.body.batchId }).first();
    expect(batch.sha256).toBe(createHash('sha256').update(zip).digest('hex'));
    expect(Buffer.compare(batch.file_bytes, Buffer.from(zip))).toBe(0);
    expect(batch.source_crs.epsg).toBe(32628);
    const parcels = await testDb('parcel').where({ batch_id: saved.body.batchId }).orderBy('reference');
    expect(parcels.map((p) => p.reference)).toEqual(['T-1', 'T-2']);
    // 1 ha in UTM grid metres; ellipsoidal area = grid area / k², k ≈ 0.9996 (1 + (Δλ cos φ)²/2) ≈ 0.99966 here (from memory: UTM point scale).
    expect(parcels[0].area_ha).toBeGreaterThan(1.0004);
    expect(parcels[0].area_ha).toBeLessThan(1.0011);
    const events = await testDb('land_use_event').where({ batch_id: saved.body.batchId });
    expect(events.map((e) => [e.kind, e.event_date.toISOString().slice(0, 10)])).toEqual([['tillage', '2019-03-04']]);
    expect((await api('POST', `/api/uploads/${id}/save`, { session: planner })).status).toBe(404);
  });

  it('remembers the column mapping for the next file with the same columns', async () => {
    const staged = await uploadFile(planner, 'flow-again.zip', zip);
    expect(staged.body.layers[0].rememberedMapping).toMatchObject({ reference: 'field_ref', lastTillage: 'last_till' });
    const report = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
      session: planner,
      body: { layer: 'flow_parcels', mapping },
    });
    expect(report.body.summary.rejected).toBe(2);
    expect(report.body.features[0].issues.map((i: { code: string }) => i.code)).toContain('reference-in-register');
    const before = await uploadRowCounts();
    expect((await api('DELETE', `/api/uploads/${staged.body.id}`, { session: planner })).status).toBe(204);
    const after = await uploadRowCounts();
    expect(after.upload_staging).toBe(before.upload_staging - 1);
    expect(after.parcel).toBe(before.parcel);
  });

  it('asks for a CRS when the .prj is missing, and reprojects with the EPSG code chosen', async () => {
    const staged = await uploadFile(planner, 'noprj.zip', zipOf(layerEntries('noprj', sampleFiles({ prj: null }))));
    expect(staged.body.layers[0].crs).toBeNull();
    expect(staged.body.layers[0].crsNote).toMatch(/no \.prj.*Choose/);
    const without = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
      session: planner,
      body: { layer: 'noprj', mapping: { reference: 'field_ref' } },
    });
    expect(without.status).toBe(422);
    const wrong = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
      session: planner,
      body: { layer: 'noprj', epsg: 27700, mapping: { reference: 'field_ref' } },
    });
    expect(wrong.body.summary.byCode['outside-crs-area']).toBe(2);
    await api('DELETE', `/api/uploads/${staged.body.id}`, { session: planner });
  });

  it('only admins upload reference layers', async () => {
    const res = await uploadFile(planner, 'soil.geojson', '{"type":"FeatureCollection","features":[]}', 'reference');
    expect(res.status).toBe(403);
  });
});

describe('overlay with the demo reference layers (hand-computed shares)', () => {
  let id: number;

  it('a parcel across the hac/spodic soil boundary (y = 1600 m) gets 60 % / 40 %', async () => {
    // Demo soil boxes (gis/lib/regions.ts): hac [-1000,-1000,1830,1600], spodic [-1000,1600,1830,4150].
    // Rectangle x -800 to -600 m (west of the demo fields, which start at x = 0), y 1540–1640 m:
    // 60 m of its 100 m height lie in hac, 40 m in spodic.
    const res = await api('POST', '/api/parcels', {
      session: planner,
      body: {
        reference: 'TEST-OVERLAY-1',
        geometry: rect([-800, 1540, -600, 1640]),
        landUse: 'grassland',
        evidence: 'overlay test',
      },
    });
    expect(res.status).toBe(201);
    id = res.body.id;
    const p = (await api('GET', `/api/parcels/${id}`, { session: planner })).body;
    const soil = Object.fromEntries(
      p.overlay.soil.classes.map((c: { class: string; share: number }) => [c.class, c.share]),
    );
    expect(soil.hac).toBeCloseTo(0.6, 3);
    expect(soil.spodic).toBeCloseTo(0.4, 3);
    expect(p.overlay.soil.flag).toBeNull();
    expect(p.overlay.climate.dominant).toBe('cool-temperate-moist');
    // slope: moderate covers y 1200–2400 (regions.ts), so the whole parcel.
    expect(p.overlay.slope.classes).toEqual([
      expect.objectContaining({ class: 'moderate', share: expect.closeTo(1, 3) }),
    ]);
    expect(p.overlay.sensitive.classes).toEqual([]);
    // 200 m × 100 m = 2 ha of grid area; ellipsoidal ≈ 2 / k² with k ≈ 0.99966 (see above).
    expect(p.areaHa).toBeCloseTo(2.0014, 3);
    expect(p.history.map((e: { kind: string; value: string }) => [e.kind, e.value])).toEqual([
      ['land-use', 'grassland'],
    ]);
  });

  it('a parcel half outside every soil unit is flagged with the uncovered share, not guessed', async () => {
    // Soil leaves x ≥ 4940, y ≥ 2730 uncovered; hac box [4500,2730,4940,4150]. Rectangle x 4840–5040: half in, half out
    // (y 3300–3400: north of the demo fields, 15 rows of 210 m).
    const res = await api('POST', '/api/parcels', {
      session: planner,
      body: { reference: 'TEST-OVERLAY-2', geometry: rect([4840, 3300, 5040, 3400]), evidence: 'overlay test' },
    });
    const p = (await api('GET', `/api/parcels/${res.body.id}`, { session: planner })).body;
    expect(p.overlay.soil.classes).toEqual([expect.objectContaining({ class: 'hac', share: expect.closeTo(0.5, 3) })]);
    expect(p.overlay.soil.uncoveredShare).toBeCloseTo(0.5, 3);
    expect(p.overlay.soil.flag).toMatch(/^50\.0 % of the parcel lies outside every unit of the soil units/);
  });

  it('editing the boundary recomputes area and overlay, and refuses a stale version or a bow-tie', async () => {
    const before = (await api('GET', `/api/parcels/${id}`, { session: planner })).body;
    const bowtie = {
      type: 'Polygon',
      coordinates: [
        rect([-800, 1000, -600, 1100]).coordinates[0]!.map((p, i, a) => (i === 1 ? a[2]! : i === 2 ? a[1]! : p)),
      ],
    };
    const bad = await api('PUT', `/api/parcels/${id}/boundary`, {
      session: planner,
      body: { geometry: bowtie, version: before.version, reason: 'test' },
    });
    expect(bad.status).toBe(422);
    expect(bad.body.error.message).toMatch(/crosses or touches itself/);
    const ok = await api('PUT', `/api/parcels/${id}/boundary`, {
      session: planner,
      body: { geometry: rect([-800, 1000, -600, 1100]), version: before.version, reason: 'moved south, fully in hac' },
    });
    expect(ok.status).toBe(200);
    const after = (await api('GET', `/api/parcels/${id}`, { session: planner })).body;
    expect(after.overlay.soil.classes).toEqual([
      expect.objectContaining({ class: 'hac', share: expect.closeTo(1, 3) }),
    ]);
    const stale = await api('PUT', `/api/parcels/${id}/boundary`, {
      session: planner,
      body: { geometry: rect([-800, 1000, -590, 1100]), version: before.version, reason: 'stale' },
    });
    expect(stale.status).toBe(409);
    const audit = await testDb('audit_event')
      .where({ action: 'parcel.edit-boundary', entity_id: String(id) })
      .first();
    expect(audit.details.geometryBefore.type).toBe('MultiPolygon');
  });

  it('hides the owner reference from roles other than planner and admin', async () => {
    const board = await signIn(DEMO.board);
    const cm = await testDb('parcel').where({ reference: 'CM-0001' }).first();
    expect((await api('GET', `/api/parcels/${cm.id}`, { session: board })).body.ownerRef).toBeNull();
    expect((await api('GET', `/api/parcels/${cm.id}`, { session: planner })).body.ownerRef).toMatch(/^HLD-/);
  });
});

describe('vector tiles', () => {
  /** Slippy-map tile of a lon/lat at zoom z (OSM convention, common practice). */
  const tileOf = (lon: number, lat: number, z: number) => {
    const n = 2 ** z;
    const r = (lat * Math.PI) / 180;
    return [
      Math.floor(((lon + 180) / 360) * n),
      Math.floor(((1 - Math.log(Math.tan(r) + 1 / Math.cos(r)) / Math.PI) / 2) * n),
    ];
  };

  it('answers MVT bytes with an ETag of the data version, 304 on a match, and a new ETag after a change', async () => {
    const [x, y] = tileOf(-16.0, 52.39, 14);
    const t = await fetch(`${BASE_URL}/api/tiles/14/${x}/${y}.mvt`, { headers: { cookie: planner.cookie } });
    expect(t.status).toBe(200);
    expect(t.headers.get('content-type')).toBe('application/vnd.mapbox-vector-tile');
    expect((await t.arrayBuffer()).byteLength).toBeGreaterThan(1000);
    const etag = t.headers.get('etag')!;
    expect(t.headers.get('cache-control')).toMatch(/private/);
    const again = await api('GET', `/api/tiles/14/${x}/${y}.mvt`, {
      session: planner,
      headers: { 'if-none-match': etag },
    });
    expect(again.status).toBe(304);
    await api('POST', '/api/parcels', {
      session: planner,
      body: { reference: 'TEST-TILE-1', geometry: rect([-500, 100, -400, 200]), evidence: 'tile test' },
    });
    const changed = await api('GET', `/api/tiles/14/${x}/${y}.mvt`, {
      session: planner,
      headers: { 'if-none-match': etag },
    });
    expect(changed.status).toBe(200);
    expect(changed.headers.get('etag')).not.toBe(etag);
  });

  it('refuses tiles that do not exist', async () => {
    expect((await api('GET', '/api/tiles/3/8/1.mvt', { session: planner })).status).toBe(400);
    expect((await api('GET', '/api/tiles/abc/1/1.mvt', { session: planner })).status).toBe(422);
    expect((await api('GET', '/api/tiles/1/1/1.mvt')).status).toBe(401);
  });
});

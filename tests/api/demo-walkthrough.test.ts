/**
 * The README's "first ten minutes": the unseeded demo file gis/demo/corrowmere-north-block.geojson
 * is uploaded, checked and saved by the demo planner, and its parcels are on the map with their
 * status flags known from the first save. Its two deliberate defects (gis/make-demo-north.ts)
 * are reported, the rest is saved.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';
import { uploadFile } from '../support/uploads';

let planner: Session;
beforeAll(async () => {
  planner = await signIn(DEMO.planner);
});
afterAll(() => testDb.destroy());

describe('the demo walk-through', () => {
  it('uploads, checks and saves the neighbouring block, then finds it on the map', async () => {
    const staged = await uploadFile(
      planner,
      'corrowmere-north-block.geojson',
      readFileSync('gis/demo/corrowmere-north-block.geojson'),
    );
    expect(staged.status).toBe(201);
    expect(staged.body.layers[0]).toMatchObject({ featureCount: 41, crs: { epsg: 4326, source: 'geojson' } });
    const mapping = {
      reference: 'field_ref',
      name: 'name',
      landUse: 'land_use',
      management: 'management',
      lastTillage: 'last_till',
      grassSince: 'in_grass',
      ownerRef: 'owner_ref',
    };
    const report = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
      session: planner,
      body: { layer: staged.body.layers[0].name, mapping },
    });
    expect(report.status).toBe(200);
    expect(report.body.summary).toMatchObject({ total: 41, rejected: 2 });
    const rejected = report.body.features
      .filter((f: { status: string }) => f.status === 'rejected')
      .map((f: { reference: string; issues: { code: string }[] }) => [f.reference, f.issues.map((i) => i.code)]);
    // CN-0041 lies half over CN-0039 and half over CN-0040: 120 m × 200 m with each, 50 % of either.
    expect(rejected).toEqual([
      ['CN-0017', ['bad-land-use']],
      ['CN-0041', ['overlap', 'overlap']],
    ]);
    const annex = report.body.features.find((f: { reference: string }) => f.reference === 'CN-0041');
    expect(
      annex.issues.map((i: { message: string }) => i.message.match(/overlaps feature (\d+) \((CN-\d+)\)/)![2]),
    ).toEqual(['CN-0039', 'CN-0040']);
    const saved = await api('POST', `/api/uploads/${staged.body.id}/save`, { session: planner });
    expect(saved.body).toMatchObject({ saved: 39, rejected: 2 });
    const map = await api('GET', '/api/map', { session: planner });
    expect(
      map.body.areas.find((a: { label: string }) => a.label.startsWith('Corrowmere north block, uploaded ')),
    ).toMatchObject({ count: 39 });
    const found = await api('GET', '/api/parcels/search?q=CN-0001', { session: planner });
    const detail = (await api('GET', `/api/parcels/${found.body.items[0].id}`, { session: planner })).body;
    // CN-0001: grassland, in grass since 2002-12-29 (the file), so more than 5 years out of rotation.
    expect(detail.flags.permanentGrassland.value).toBe(true);
  });
});

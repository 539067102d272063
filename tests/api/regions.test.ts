/** Accounting regions through the API: the demo districts, a new version of the layer uploaded and published, reference ratios entered by admins. */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';
import { uploadFile } from '../support/uploads';

let admin: Session;
let assessor: Session;
let planner: Session;

beforeAll(async () => {
  [admin, assessor, planner] = await Promise.all([signIn(DEMO.admin), signIn(DEMO.assessor), signIn(DEMO.planner)]);
});
afterAll(() => testDb.destroy());

const byKey = (items: { key: string }[]) => Object.fromEntries(items.map((i) => [i.key, i])) as Record<string, any>;

describe('the demo districts', () => {
  it('cover the demo parcels, with consistent figures and the seeded reference ratios', async () => {
    const res = await api('GET', '/api/regions?asOf=2026-06-30', { session: assessor });
    expect(res.status).toBe(200);
    const r = byKey(res.body.items);
    expect(Object.keys(r).sort()).toEqual(['fenbrook', 'skarrow', 'tembiri']);
    expect(r.skarrow.label).toBe('Skarrow district');
    for (const k of ['fenbrook', 'skarrow', 'tembiri']) {
      expect(r[k].permanentGrasslandHa).toBeLessThanOrEqual(r[k].agriculturalHa);
      // (Other test files may replace the demo parcels without their history: then a district has no agricultural area and no ratio.)
      const expected = r[k].agriculturalHa > 0 ? r[k].permanentGrasslandHa / r[k].agriculturalHa : null;
      expect(r[k].ratio === null ? null : r[k].ratio.toFixed(12)).toBe(expected === null ? null : expected.toFixed(12));
      // The invented history starts after 2018, so the reference comes from the entered census figure.
      expect(r[k].reference).toMatchObject({
        origin: 'entered',
        referenceYear: 2018,
        source: expect.stringMatching(/census/),
      });
    }
    expect(r.fenbrook.reference.ratio).toBe(0.72);
    const parcels = Number(
      (await testDb('parcel')
        .where('reference', 'like', 'CM-%')
        .orWhere('reference', 'like', 'VM-%')
        .count('* as n')
        .first())!.n,
    );
    expect(r.fenbrook.parcels + r.skarrow.parcels + r.tembiri.parcels).toBeGreaterThanOrEqual(parcels);
  });

  it('planners do not read region figures; a bad date is refused', async () => {
    expect((await api('GET', '/api/regions', { session: planner })).status).toBe(403);
    const bad = await api('GET', '/api/regions?asOf=2026-02-30', { session: assessor });
    expect(bad.status).toBe(422);
  });
});

describe('the region kind of reference layer', () => {
  it('uploads, validates, saves and publishes like any layer; figures stay the same for the same districts', async () => {
    const before = byKey((await api('GET', '/api/regions?asOf=2026-06-30', { session: assessor })).body.items);
    const staged = await uploadFile(
      admin,
      'districts.geojson',
      readFileSync('gis/demo/districts.geojson'),
      'reference',
    );
    expect(staged.status).toBe(201);
    const layer = staged.body.layers[0].name;
    const report = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
      session: admin,
      body: { layer, mapping: { kind: 'region', classAttribute: 'class', labelAttribute: 'name' } },
    });
    expect(report.status).toBe(200);
    const saved = await api('POST', `/api/uploads/${staged.body.id}/save`, { session: admin });
    expect(saved.status).toBe(201);
    expect(saved.body.referenceVersion).toMatchObject({ kind: 'region', version: 2 });
    const pub = await api('POST', `/api/reference-layers/${saved.body.referenceVersion.id}/publish`, {
      session: admin,
      body: { note: 'Same districts, re-issued' },
    });
    expect(pub.status).toBe(200);
    const after = await api('GET', '/api/regions?asOf=2026-06-30', { session: assessor });
    expect(after.body.layerVersion).toBe(2);
    const a = byKey(after.body.items);
    for (const k of ['fenbrook', 'skarrow', 'tembiri']) {
      expect(a[k].parcels).toBe(before[k].parcels);
      expect(a[k].agriculturalHa).toBeCloseTo(before[k].agriculturalHa, 9);
      expect(a[k].permanentGrasslandHa).toBeCloseTo(before[k].permanentGrasslandHa, 9);
    }
  });
});

describe('entering a reference ratio', () => {
  it('is for admins, names its source, and the newest entry counts (history kept, audited)', async () => {
    const body = { referenceYear: 2018, ratio: 0.78, source: 'Upper Tarrow farm census 2018, table 3, re-checked' };
    expect((await api('POST', '/api/regions/tembiri/reference-ratio', { session: assessor, body })).status).toBe(403);
    expect((await api('POST', '/api/regions/no-such-district/reference-ratio', { session: admin, body })).status).toBe(
      404,
    );
    const over = await api('POST', '/api/regions/tembiri/reference-ratio', {
      session: admin,
      body: { ...body, ratio: 1.2 },
    });
    expect(over.status).toBe(422);
    expect(over.body.error.issues[0].path).toEqual(['ratio']);
    const noSource = await api('POST', '/api/regions/tembiri/reference-ratio', {
      session: admin,
      body: { ...body, source: '' },
    });
    expect(noSource.status).toBe(422);
    const ok = await api('POST', '/api/regions/tembiri/reference-ratio', { session: admin, body });
    expect(ok.status).toBe(201);
    const t = byKey((await api('GET', '/api/regions', { session: assessor })).body.items).tembiri;
    expect(t.reference).toMatchObject({
      origin: 'entered',
      ratio: 0.78,
      source: body.source,
      enteredBy: expect.any(String),
    });
    expect(t.entered).toHaveLength(2);
    const audit = await testDb('audit_event')
      .where({ action: 'region.reference-ratio', entity_id: 'tembiri' })
      .orderBy('id', 'desc')
      .first();
    expect(audit.details.source).toBe(body.source);
  });
});

/**
 * A returning planner uploads again after earlier uploads. Between the two, the statistics of the
 * staging table are taken while it is empty (what autovacuum leaves after any earlier upload):
 * each bulk step must refresh them in its own transaction so that the planner does not join the
 * new batch as if it held one row (the nested-loop plans seen on 20,000-parcel saves).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';
import { rect } from '../support/proposals';
import { uploadFile } from '../support/uploads';

let planner: Session;
beforeAll(async () => {
  planner = await signIn(DEMO.planner);
});
afterAll(async () => {
  await testDb.destroy();
});

/**
 * A grid of 25 m squares (30 m apart) south of the demo parcel grid (y < 0 m from the Corrowmere
 * grid origin, UTM 28N), inside the demo's reference layers and clear of other test parcels.
 */
function gridFile(prefix: string, rows: number, cols: number, x0: number, y0: number): string {
  const features = [];
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      const [x, y] = [x0 + c * 30, y0 + r * 30];
      features.push({
        type: 'Feature',
        properties: { ref: `${prefix}-${r}-${c}`, use: 'grassland', till: '2001-04-01' },
        geometry: rect([x, y, x + 25, y + 25]),
      });
    }
  }
  return JSON.stringify({ type: 'FeatureCollection', features });
}

async function reltuples(table: string): Promise<number> {
  const r = await testDb.raw('select reltuples::float8 as n from pg_class where oid = ?::regclass', [table]);
  return Number(r.rows[0].n);
}

async function uploadAndSave(name: string, body: string): Promise<{ saved: number; stagedEstimate: number }> {
  const staged = await uploadFile(planner, name, body);
  expect(staged.status, JSON.stringify(staged.body)).toBe(201);
  const mapping = { reference: 'ref', landUse: 'use', lastTillage: 'till' };
  const report = await api('POST', `/api/uploads/${staged.body.id}/validation`, {
    session: planner,
    body: { layer: staged.body.layers[0].name, mapping },
  });
  expect(report.status, JSON.stringify(report.body).slice(0, 400)).toBe(200);
  // The validation's own transaction refreshed the staging statistics (pg_class.reltuples is what the planner reads).
  const stagedEstimate = await reltuples('upload_staging_feature');
  const saved = await api('POST', `/api/uploads/${staged.body.id}/save`, { session: planner });
  expect(saved.status, JSON.stringify(saved.body).slice(0, 400)).toBe(201);
  return { saved: saved.body.saved, stagedEstimate };
}

describe('uploading again after earlier uploads', () => {
  it('the second upload saves all its parcels and history, with statistics refreshed inside each step', async () => {
    const first = await uploadAndSave('repeat-a.geojson', gridFile('RPA', 30, 25, 0, -990));
    expect(first.saved).toBe(750);
    // The state an earlier upload leaves: staging emptied, its statistics taken while empty.
    await testDb.raw('analyze upload_staging_feature');
    await testDb.raw('analyze parcel');
    expect(await reltuples('upload_staging_feature')).toBeLessThan(100);
    const parcelsBefore = Number((await testDb('parcel').count('* as n').first())?.n);
    const eventsBefore = Number((await testDb('land_use_event').count('* as n').first())?.n);

    const second = await uploadAndSave('repeat-b.geojson', gridFile('RPB', 25, 40, 1000, -900));
    expect(second.saved).toBe(1000);
    expect(second.stagedEstimate).toBeGreaterThanOrEqual(1000);
    expect(await reltuples('parcel')).toBeGreaterThanOrEqual(parcelsBefore + 1000);
    expect(Number((await testDb('parcel').count('* as n').first())?.n)).toBe(parcelsBefore + 1000);
    // Each new parcel got its current land use and its dated ploughing.
    expect(Number((await testDb('land_use_event').count('* as n').first())?.n)).toBe(eventsBefore + 2000);
    const overlaid = await testDb('parcel as p')
      .join('parcel_overlay_run as r', 'r.parcel_id', 'p.id')
      .where('p.reference', 'like', 'RPB-%')
      .countDistinct('p.id as n')
      .first();
    expect(Number(overlaid?.n)).toBe(1000);
  }, 120_000);
});

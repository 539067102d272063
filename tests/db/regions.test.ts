/**
 * regionStats and referenceRatio on hand-built parcels and histories (in a transaction that is
 * rolled back). Permanent grassland: grassland out of the rotation for 5 years or more
 * (Reg. (EU) 2021/2115 Art. 4(3)(c), the app's default window). The reference year 2018 is the
 * GAEC 1 reference year (Reg. (EU) 2021/2115 Annex III, recalled from memory).
 */
import type { Knex } from 'knex';
import { afterAll, describe, expect, it } from 'vitest';
import { computeOverlay } from '~/lib/db/overlay';
import { referenceRatio, regionStats } from '~/lib/db/regions';
import { referenceKey } from '~/lib/gis/references';
import { testDb } from '../support/db';

afterAll(() => testDb.destroy());

// Two regions side by side over open ocean (lon -30.00..-29.98, lat -40.00..-39.99).
const env = (x0: number, x1: number, y0 = -39.999, y1 = -39.998) =>
  testDb.raw('st_multi(st_makeenvelope(?, ?, ?, ?, 4326))', [x0, y0, x1, y1]);

async function build(trx: Knex.Transaction) {
  for (const [key, value] of [
    ['land-use.permanent-grassland-years', 5],
    ['land-use.uncultivated-years', 15],
    ['land-use.tillage-ends-grassland', false],
    ['region.reference-year', 2018],
  ] as const) {
    await trx('app_setting')
      .insert({ key, value: JSON.stringify(value) })
      .onConflict('key')
      .merge();
  }
  const next =
    Number((await trx('reference_layer_version').where({ kind: 'region' }).max('version as m').first())?.m ?? 0) + 1;
  const [v] = await trx('reference_layer_version')
    .insert({
      kind: 'region',
      version: next,
      status: 'published',
      class_attribute: 'class',
      label_attribute: 'name',
      classes: ['test-a', 'test-b'],
      feature_count: 2,
    })
    .returning('id');
  await trx('reference_feature').insert([
    { version_id: v.id, class: 'test-a', label: 'Test district A', geom: env(-30.0, -29.99, -40.0, -39.99) },
    { version_id: v.id, class: 'test-b', label: 'Test district B', geom: env(-29.99, -29.98, -40.0, -39.99) },
  ]);
  const parcels: [string, number, [number, number]][] = [
    ['RT-A1', 10, [-29.999, -29.998]],
    ['RT-A2', 20, [-29.997, -29.996]],
    ['RT-A3', 5, [-29.995, -29.994]],
    ['RT-A4', 4, [-29.993, -29.992]],
    ['RT-B1', 8, [-29.989, -29.988]],
    ['RT-B2', 12, [-29.9903, -29.9893]], // 0.0003° in A, 0.0007° in B: 70 % in B, so region B
    ['RT-B3', 6, [-29.985, -29.984]],
  ];
  const ids: Record<string, number> = {};
  for (const [reference, areaHa, [x0, x1]] of parcels) {
    const [row] = await trx('parcel')
      .insert({ reference, reference_key: referenceKey(reference), area_ha: areaHa, geom: env(x0, x1) })
      .returning('id');
    ids[reference] = Number(row.id);
  }
  await computeOverlay(trx, { parcelIds: Object.values(ids) }, [Number(v.id)]);
  const ev = (ref: string, date: string, kind: string, value: string) => ({
    parcel_id: ids[ref],
    event_date: date,
    kind,
    value,
    evidence: 'region test',
  });
  await trx('land_use_event').insert([
    ev('RT-A1', '2010-04-01', 'land-use', 'grassland'), // permanent from 2015 on
    ev('RT-A2', '2015-03-01', 'land-use', 'arable'),
    ev('RT-A2', '2023-03-01', 'land-use', 'grassland'), // grassland again, but < 5 years by 2026
    ev('RT-A3', '2000-01-01', 'land-use', 'woodland'), // not agricultural
    ev('RT-A4', '2001-06-01', 'land-use', 'grassland'),
    ev('RT-A4', '2024-05-01', 'tillage', 'ploughing'), // ends the spell only when the setting says so
    ev('RT-B1', '2012-04-01', 'land-use', 'arable'),
    ev('RT-B2', '2005-05-01', 'land-use', 'pasture'),
    ev('RT-B3', '2024-01-01', 'land-use', 'grassland'), // history too short: undecided, never guessed
  ]);
}

async function inRollback<T>(fn: (trx: Knex.Transaction) => Promise<T>): Promise<T> {
  const trx = await testDb.transaction();
  try {
    await build(trx);
    return await fn(trx);
  } finally {
    await trx.rollback();
  }
}

const pick = (rows: Awaited<ReturnType<typeof regionStats>>) =>
  Object.fromEntries(
    rows.map((r) => [
      r.key,
      {
        agri: r.agriculturalHa,
        pg: r.permanentGrasslandHa,
        undecided: r.undecidedHa,
        unknown: r.unknownUseHa,
        n: r.parcels,
        label: r.label,
      },
    ]),
  );

describe('regionStats', () => {
  it('as of 2026-06-30: hand-computed agricultural area and permanent grassland per region', async () => {
    const s = await inRollback((trx) => regionStats(trx, '2026-06-30'));
    // A: agricultural A1 10 + A2 20 + A4 4 = 34 ha (A3 woodland); permanent A1 10 + A4 4 = 14 ha.
    // B: agricultural B1 8 + B2 12 + B3 6 = 26 ha; permanent B2 12 ha; B3 6 ha undecided.
    expect(pick(s)).toEqual({
      'test-a': { agri: 34, pg: 14, undecided: 0, unknown: 0, n: 4, label: 'Test district A' },
      'test-b': { agri: 26, pg: 12, undecided: 6, unknown: 0, n: 3, label: 'Test district B' },
    });
  });

  it('as of 2020-06-30: the history of that date (A2 arable, B3 not yet recorded)', async () => {
    const s = await inRollback((trx) => regionStats(trx, '2020-06-30'));
    expect(pick(s)['test-a']).toMatchObject({ agri: 34, pg: 14 });
    expect(pick(s)['test-b']).toMatchObject({ agri: 20, pg: 12, unknown: 6 });
  });

  it('follows the land-use settings: with tillage ending the spell, A4 (ploughed 2024) is not permanent in 2026', async () => {
    const s = await inRollback(async (trx) => {
      await trx('app_setting').where({ key: 'land-use.tillage-ends-grassland' }).update({ value: 'true' });
      return regionStats(trx, '2026-06-30');
    });
    expect(pick(s)['test-a']).toMatchObject({ agri: 34, pg: 10 });
  });
});

describe('referenceRatio', () => {
  it('is computed from the history when it covers the reference date, else the entered figure with its source, else null', async () => {
    const [a, bNone, b] = await inRollback(async (trx) => {
      const ra = await referenceRatio(trx, 'test-a');
      const none = await referenceRatio(trx, 'test-b');
      await trx('region_reference_ratio').insert({
        region_key: 'test-b',
        reference_year: 2018,
        ratio: 0.5,
        source: 'Older census, superseded',
      });
      await trx('region_reference_ratio').insert({
        region_key: 'test-b',
        reference_year: 2018,
        ratio: 0.55,
        source: 'District farm census 2018, table 4',
      });
      return [ra, none, await referenceRatio(trx, 'test-b')];
    });
    // A on 2018-12-31: A1 and A4 permanent (14 ha) of 34 ha agricultural; every parcel decided.
    expect(a).toMatchObject({ origin: 'computed', referenceYear: 2018 });
    expect(a!.ratio).toBeCloseTo(14 / 34, 12);
    // B on 2018-12-31: B3 has no recorded use, so the history does not cover it.
    expect(bNone).toBeNull();
    expect(b).toMatchObject({
      origin: 'entered',
      ratio: 0.55,
      referenceYear: 2018,
      source: 'District farm census 2018, table 4',
    });
  });
});

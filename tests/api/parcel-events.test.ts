/**
 * POST /api/parcels/{id}/events: a recorded tillage changes the derived status flags, every event
 * is audited, and each bad input is refused with 422 naming the field and writes nothing.
 */
import { formatDate } from '~/lib/format/dates';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { yearsBefore } from '~/lib/gis/land-use-history';
import { testDb } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';

let planner: Session;
let parcelId: number;
const today = new Date().toISOString().slice(0, 10);
const tilledOn = yearsBefore(today, 2);

/** A 0.002° × 0.001° box west of the demo fields (about 1.5 ha), away from every other test parcel. */
const BOX = {
  type: 'Polygon',
  coordinates: [
    [
      [-16.062, 52.371],
      [-16.06, 52.371],
      [-16.06, 52.372],
      [-16.062, 52.372],
      [-16.062, 52.371],
    ],
  ],
};

const flags = async () => (await api('GET', `/api/parcels/${parcelId}`, { session: planner })).body.flags;
const counts = async () => ({
  events: Number((await testDb('land_use_event').where({ parcel_id: parcelId }).count('* as n'))[0]!.n),
  audits: Number(
    (
      await testDb('audit_event')
        .where({ entity_type: 'parcel', entity_id: String(parcelId) })
        .count('* as n')
    )[0]!.n,
  ),
  version: (await testDb('parcel').where({ id: parcelId }).first('version')).version as number,
});
const record = (body: object, session = planner, id = parcelId) =>
  api('POST', `/api/parcels/${id}/events`, { session, body });

beforeAll(async () => {
  planner = await signIn(DEMO.planner);
  const drawn = await api('POST', '/api/parcels', {
    session: planner,
    body: { reference: 'TEST-EVENTS-1', geometry: BOX, landUse: 'grassland', evidence: 'events test' },
  });
  expect(drawn.status).toBe(201);
  parcelId = drawn.body.id;
});
afterAll(() => testDb.destroy());

describe('recording land-use events', () => {
  it('makes a parcel permanent grassland with a long grass history, then a tillage ends "uncultivated" and "never tilled"', async () => {
    const grass = await record({
      date: '2001-04-01',
      kind: 'land-use',
      value: 'grassland',
      evidence: 'Farm survey 2001',
    });
    expect(grass.status).toBe(201);
    const before = await flags();
    // EU Reg. (EU) 2021/2115 Art. 4(3)(c): grassland out of the crop rotation for 5 years or more is permanent grassland.
    expect(before.permanentGrassland.value).toBe(true);
    // England EIA (Agriculture) Regulations screening guidance: uncultivated = no cultivation in the last 15 years.
    expect(before.uncultivated).toEqual({
      value: true,
      reason: `No cultivation recorded between ${formatDate(yearsBefore(today, 15))} and ${formatDate(today)}.`,
    });
    expect(before.neverTilled.value).toBe(true);

    const tilled = await record({
      date: tilledOn,
      kind: 'tillage',
      value: 'Ploughing',
      evidence: 'Aerial image of spring 2 years ago',
    });
    expect(tilled.status).toBe(201);
    const after = await flags();
    // England EIA (Agriculture) Regulations, 15-year window: a ploughing 2 years ago is inside it.
    expect(after.uncultivated).toEqual({
      value: false,
      reason: `Cultivated on ${formatDate(tilledOn)} (tillage: ploughing), within the last 15 years.`,
    });
    expect(after.neverTilled).toEqual({ value: false, reason: `Tilled on ${formatDate(tilledOn)} (ploughing).` });
    // EU Reg. (EU) 2021/2115 Art. 4(3)(c): ploughing alone does not put grass into the crop rotation, so the
    // 5-year spell runs on unless the Member State counts ploughing (setting land-use.tillage-ends-grassland, default off).
    expect(after.permanentGrassland.value).toBe(true);

    const row = await testDb('land_use_event').where({ id: tilled.body.id }).first();
    expect(row).toMatchObject({
      parcel_id: String(parcelId),
      kind: 'tillage',
      value: 'ploughing',
      evidence: 'Aerial image of spring 2 years ago',
    });
    const who = await testDb('user').where({ email: DEMO.planner }).first('id', 'name');
    expect(row.recorded_by).toBe(who.id);
    const audit = await testDb('audit_event')
      .where({ action: 'parcel.record-event', entity_type: 'parcel', entity_id: String(parcelId) })
      .orderBy('id', 'desc')
      .first();
    expect(audit.actor_id).toBe(who.id);
    expect(audit.details).toMatchObject({
      eventId: tilled.body.id,
      reference: 'TEST-EVENTS-1',
      date: tilledOn,
      kind: 'tillage',
      value: 'ploughing',
    });
    const history = (await api('GET', `/api/parcels/${parcelId}`, { session: planner })).body.history;
    expect(history.map((e: { date: string; kind: string }) => [e.date, e.kind])).toEqual([
      ['2001-04-01', 'land-use'],
      [tilledOn, 'tillage'],
      [today, 'land-use'],
    ]);
    expect(history[1].recordedBy).toBe(who.name);
  });

  it('ends permanent grassland at the tillage when the Member-State option is on', async () => {
    await testDb('app_setting')
      .insert({ key: 'land-use.tillage-ends-grassland', value: JSON.stringify(true) })
      .onConflict('key')
      .merge();
    try {
      // EU Reg. (EU) 2021/2115 Art. 4(3)(c), Member-State option: ploughed, tilled or reseeded within 5 years → not permanent.
      expect((await flags()).permanentGrassland).toEqual({
        value: false,
        reason: `Grassland only since ${formatDate(tilledOn)} (since the tillage of ${formatDate(tilledOn)}): less than 5 years before ${formatDate(today)}.`,
      });
    } finally {
      await testDb('app_setting').where({ key: 'land-use.tillage-ends-grassland' }).delete();
    }
    expect((await flags()).permanentGrassland.value).toBe(true);
  });

  it('marks liming as cultivation even when the caller does not', async () => {
    const limed = await record({
      date: today,
      kind: 'management',
      value: 'lime',
      cultivation: false,
      evidence: 'Contractor invoice',
    });
    expect(limed.status).toBe(201);
    expect((await testDb('land_use_event').where({ id: limed.body.id }).first()).cultivation).toBe(true);
  });

  const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
  const bad: [string, object, string, RegExp][] = [
    ['a future date', { date: tomorrow, kind: 'tillage', evidence: 'survey' }, 'date', /future/],
    ['a date before 1900', { date: '1899-12-31', kind: 'tillage', evidence: 'survey' }, 'date', /1900/],
    ['a date that is no date', { date: '2020-02-30', kind: 'tillage', evidence: 'survey' }, 'date', /YYYY-MM-DD/],
    ['no evidence', { date: '2020-01-01', kind: 'tillage' }, 'evidence', /.+/],
    ['blank evidence', { date: '2020-01-01', kind: 'tillage', evidence: '   ' }, 'evidence', /at least 3 characters/],
    [
      'a land use without value',
      { date: '2020-01-01', kind: 'land-use', evidence: 'survey' },
      'value',
      /Choose the land use/,
    ],
    [
      'a value of another kind',
      { date: '2020-01-01', kind: 'tillage', value: 'grassland', evidence: 'survey' },
      'value',
      /"grassland" is not a tillage value/,
    ],
    ['an unknown kind', { date: '2020-01-01', kind: 'burning', value: 'stubble', evidence: 'survey' }, 'kind', /.+/],
  ];
  it.each(bad)('refuses %s with 422 naming the field and writes nothing', async (_what, body, field, message) => {
    const before = await counts();
    const res = await record(body);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('UNPROCESSABLE_CONTENT');
    expect(res.body.error.message).toContain(`(${field})`);
    expect(res.body.error.issues[0].path).toEqual([field]);
    expect(res.body.error.issues[0].message).toMatch(message);
    expect(await counts()).toEqual(before);
  });

  it('lets only planners and admins record, and answers 404 for a missing parcel', async () => {
    const body = { date: '2020-01-01', kind: 'reseeding', evidence: 'survey' };
    const before = await counts();
    expect((await record(body, await signIn(DEMO.assessor))).status).toBe(403);
    expect((await record(body, await signIn(DEMO.board))).status).toBe(403);
    expect(await counts()).toEqual(before);
    expect((await record(body, planner, 999_999_999)).status).toBe(404);
    expect((await record(body, await signIn(DEMO.admin))).status).toBe(201);
  });
});

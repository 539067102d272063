/**
 * Verify with recorded blocks (register_verified_block), here of 2 entries (the app uses 10,000):
 * a block verified in full is not hashed again while its stored rows give the same SHA-256 digest;
 * content edited by hand inside such a block (trigger disabled by the owner) changes the digest, so
 * verify hashes that block again and names exactly the edited entry. The hash rule itself is
 * checked against the `canonicalize` package and node:crypto in tests/api/register.test.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '~/lib/db/client';
import { appendEntry } from '~/lib/db/register';
import type { RegisterContent } from '~/lib/register/content';
import { verifyRegister } from '~/lib/services/register';
import { editRegisterByHand, testDb } from '../support/db';

const today = new Date().toISOString().slice(0, 10);
/** A square of 1.5 ha at 39.9° S: 122.47 m a side; a degree of latitude is about 111.32 km and of longitude that times cos(latitude) (common practice). */
const square = (i: number) => {
  const [x0, y0, dx, dy] = [
    -29.9 + i * 0.01,
    -39.9,
    122.47 / (111_320 * Math.cos((39.9 * Math.PI) / 180)),
    122.47 / 111_320,
  ];
  return [
    [
      [
        [x0, y0],
        [x0 + dx, y0],
        [x0 + dx, y0 + dy],
        [x0, y0 + dy],
        [x0, y0],
      ].map((p) => p.map((c) => Math.round(c * 1e7) / 1e7)),
    ],
  ];
};
const content = (i: number): RegisterContent => ({
  kind: 'decision',
  proposal: {
    reference: `PR-VB${i}`,
    title: `Verified block test ${i}`,
    proposedUse: 'cropland, long-term-cultivated, full, medium',
    startYear: 2031,
  },
  parcels: [
    { reference: `VB-${i}`, areaHa: 1.5, part: false, geometry: { type: 'MultiPolygon', coordinates: square(i) } },
  ],
  areaHa: 1.5,
  region: null,
  outcome: 'refused',
  reasons: 'Test entry for verified blocks.',
  conditions: [],
  figures: { co2eTotal: 12.5, co2eLow: 8, co2eHigh: 19, socChangeTotal: -3.4, runs: 1000, gwp: 'AR5', unit: 't CO2e' },
  risk: { level: 2, label: 'Closer look' },
  factorSet: { id: 'ipcc-2006', version: 1 },
  ruleSet: null,
  assessment: { number: 1 },
  meeting: null,
  votes: null,
  appealUntil: null,
  effectiveDate: today,
  decidedOn: today,
  recordedAt: `${today}T10:00:00.000Z`,
  supersedes: null,
  note: null,
});

const blockOf = (first: number) =>
  testDb('register_verified_block')
    .where({ first_seq: first, last_seq: first + 1 })
    .first();

beforeAll(async () => {
  await db.transaction(async (trx) => {
    for (let i = 1; i <= 5; i++) await appendEntry(trx, content(i));
  });
});
afterAll(async () => {
  await db.destroy();
  await testDb.destroy();
});

describe('verify with recorded blocks', () => {
  it('records every complete block, then takes unchanged blocks as checked', async () => {
    const first = await verifyRegister(2);
    expect(first).toMatchObject({ ok: true, firstBrokenEntry: null });
    const n = Number(
      (
        await testDb.raw(
          'select count(*)::int as n from register_verified_block where last_seq - first_seq = 1 and (first_seq - 1) % 2 = 0',
        )
      ).rows[0].n,
    );
    expect(n).toBe(Math.floor(first.entries / 2));
    const before = await blockOf(1);
    const again = await verifyRegister(2);
    expect(again).toMatchObject({ ok: true, entries: first.entries, headHash: first.headHash });
    // Not hashed again, so not recorded again.
    expect((await blockOf(1)).verified_at).toEqual(before.verified_at);
  });

  it('hashes a block again when its rows changed, naming exactly the edited entry', async () => {
    const original = (await testDb.raw('select content::text as c from register_entry where seq = 1')).rows[0].c;
    const before = await blockOf(1);
    await editRegisterByHand(
      `update register_entry set content = jsonb_set(content, '{reasons}', '"Changed by hand"') where seq = 1`,
      [],
    );
    try {
      const v = await verifyRegister(2);
      expect(v).toMatchObject({ ok: false, firstBrokenEntry: 1 });
      expect(v.problem).toMatch(/content of entry 1 /);
    } finally {
      await editRegisterByHand('update register_entry set content = ?::jsonb where seq = 1', [original]);
    }
    // A broken chain records nothing: the block keeps the digest of the rows as verified, which
    // the restored rows give again.
    expect((await blockOf(1)).digest).toBe(before.digest);
    expect(await verifyRegister(2)).toMatchObject({ ok: true, firstBrokenEntry: null });
  });
});

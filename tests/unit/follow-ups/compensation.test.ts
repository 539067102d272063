/** Pure parts of follow-ups and compensation: dates, what breaks the sward, the reversal entry and the chain. */
import { describe, expect, it } from 'vitest';
import { addYears, followUpSettingsSchema } from '~/lib/follow-ups/settings';
import { swardBroken } from '~/lib/follow-ups/sward';
import { reversalContent } from '~/lib/register/build';
import { ChainVerifier, entryHash, GENESIS_HASH } from '~/lib/register/chain';
import { registerContentSchema, type RegisterContent } from '~/lib/register/content';

describe('permanence period', () => {
  it('defaults to 5 years and adds whole calendar years', () => {
    // 5 years: the period re-converted land had to stay permanent grassland under the earlier EU rules,
    // Reg. (EU) No 1307/2013 Art. 45 with Delegated Reg. (EU) No 639/2014 Art. 44 (from memory).
    expect(followUpSettingsSchema.parse({})['compensation.permanence-years']).toBe(5);
    expect(addYears('2024-10-28', 5)).toBe('2029-10-28');
    // 29 February plus one year: 28 February of the common year (Gregorian calendar, common practice).
    expect(addYears('2024-02-29', 1)).toBe('2025-02-28');
    expect(addYears('2024-02-29', 4)).toBe('2028-02-29');
  });
});

describe('what breaks the sward', () => {
  it('ploughing, rotavating, discing and a non-grass use do; harrowing, reseeding and grass uses do not', () => {
    expect(swardBroken('tillage', 'ploughing')).toBe('ploughing');
    expect(swardBroken('tillage', 'rotavating')).toBe('rotavating');
    expect(swardBroken('tillage', 'discing')).toBe('discing');
    expect(swardBroken('land-use', 'arable')).toBe('a change of use to arable');
    expect(swardBroken('tillage', 'harrowing')).toBeNull();
    expect(swardBroken('tillage', null)).toBeNull();
    expect(swardBroken('reseeding', 'overseeding')).toBeNull();
    for (const grass of ['grassland', 'meadow', 'pasture', 'temporary-grassland', 'rough-grazing'])
      expect(swardBroken('land-use', grass)).toBeNull();
  });
});

const ring = [
  [-16.5, 28.1],
  [-16.49, 28.1],
  [-16.49, 28.11],
  [-16.5, 28.11],
  [-16.5, 28.1],
];
const credited: RegisterContent = registerContentSchema.parse({
  kind: 'decision',
  proposal: { reference: 'P-2024-0042', title: 'Spring cereals', proposedUse: 'cropland', startYear: 2024 },
  parcels: [
    { reference: 'CM-0001', areaHa: 3.2, part: false, geometry: { type: 'MultiPolygon', coordinates: [[ring]] } },
  ],
  areaHa: 3.2,
  region: 'fenbrook',
  outcome: 'approved',
  reasons: 'Weighed.',
  conditions: [],
  figures: {
    co2eTotal: 900,
    co2eLow: 700,
    co2eHigh: 1100,
    socChangeTotal: -200,
    runs: 1000,
    gwp: 'ar5',
    unit: 't CO2e',
  },
  risk: { level: 2, label: 'Moderate' },
  factorSet: { id: 'ipcc-2006', version: 1 },
  ruleSet: null,
  assessment: { number: 1 },
  meeting: null,
  votes: null,
  appealUntil: '2024-02-01',
  effectiveDate: '2024-02-02',
  decidedOn: '2024-01-04',
  recordedAt: '2024-01-04T10:00:00.000Z',
  supersedes: null,
  note: null,
  compensation: { parcelReference: 'CM-0002', areaHa: 4.1, creditedCo2e: 245.045, permanenceUntil: '2029-02-02' },
});

describe('the reversal entry', () => {
  const content = reversalContent({
    credited: { seq: 1, content: credited },
    parcel: {
      reference: 'CM-0002',
      areaHa: 4.12345,
      part: false,
      geometry: { type: 'MultiPolygon', coordinates: [[ring.map(([x, y]) => [x! + 0.02, y!])]] },
    },
    creditedCo2e: 245.0449,
    creditedSocT: 60.06084,
    permanenceUntil: '2029-02-02',
    event: { date: '2025-12-02', what: 'ploughing' },
    recordedAt: '2026-12-02T17:00:00.000Z',
  });

  it('is valid register content naming the entry it reverses, not superseding it', () => {
    expect(registerContentSchema.parse(content)).toEqual(content);
    expect(content).toMatchObject({
      kind: 'compensation-reversed',
      supersedes: null,
      outcome: 'approved',
      meeting: null,
      votes: null,
    });
    expect(content.reverses).toEqual({
      seq: 1,
      parcelReference: 'CM-0002',
      creditedCo2e: 245.045,
      eventDate: '2025-12-02',
      permanenceUntil: '2029-02-02',
      budgetYear: 2025,
    });
    expect(content.figures).toMatchObject({
      co2eTotal: 245.045,
      co2eLow: 245.045,
      co2eHigh: 245.045,
      socChangeTotal: -60.061,
      runs: 0,
    });
    expect(content.parcels.map((p) => p.reference)).toEqual(['CM-0002']);
    // RFC 7946 section 3.1.6: exterior rings counter-clockwise, as in every register entry.
    const r = content.parcels[0]!.geometry.coordinates[0]![0]!;
    const twiceArea = r.reduce((s, p, i) => {
      const q = r[(i + 1) % r.length]!;
      return s + p[0]! * q[1]! - q[0]! * p[1]!;
    }, 0);
    expect(twiceArea).toBeGreaterThan(0);
  });

  it('chains after the crediting entry and verifies', () => {
    const h1 = entryHash(1, GENESIS_HASH, credited);
    const h2 = entryHash(2, h1, content);
    const v = new ChainVerifier();
    v.add({ seq: 1, prev_hash: GENESIS_HASH, hash: h1, content: credited });
    v.add({ seq: 2, prev_hash: h1, hash: h2, content });
    expect(v.result()).toMatchObject({ ok: true, entries: 2, headHash: h2 });
  });

  it('a decision entry without compensation keeps no compensation key (older hashes stay as they were)', () => {
    const { compensation: _c, ...plain } = credited;
    expect('compensation' in registerContentSchema.parse(plain)).toBe(false);
  });
});

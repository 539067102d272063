import { describe, expect, it } from 'vitest';
import {
  IPCC_2006,
  IPCC_2019,
  canSignOff,
  diffFactorSets,
  tablesUsed,
  unconfirmedTables,
  type FactorSetDocument,
} from '~/lib/carbon';

describe('diffFactorSets', () => {
  it('finds the 2006 -> 2019 changes the reference describes (Table 5.5 tropical F_LU 0.48 -> 0.83; paddy 1.10 -> 1.35)', () => {
    const d = diffFactorSets(IPCC_2006, IPCC_2019);
    const find = (t: string, e: string) => d.find((x) => x.table === t && x.entry === e);
    expect(find('cropland-stock-factors', 'f-lu/long-term-cultivated/tropical-moist-wet')).toMatchObject({
      presence: 'both',
      a: { value: 0.48 },
      b: { value: 0.83 },
    });
    expect(find('cropland-stock-factors', 'f-lu/paddy-rice/tropical-dry')!.changed).toContain('value');
    // 2006 LAC tropical wet 60 -> 2019 44 (Table 2.3 vs Table 2.3 (Updated))
    expect(find('soc-ref', 'tropical-wet/lac')).toMatchObject({ a: { value: 60 }, b: { value: 44 } });
    // Spodic warm temperate moist: NA in 2006, 143 in 2019 -> value and status differ.
    expect(find('soc-ref', 'warm-temperate-moist/spodic')!.changed).toEqual(
      expect.arrayContaining(['value', 'status', 'uncertainty']),
    );
    // Nominal grassland F_MG: same value, confirmed in 2006 (S3) but not in 2019 -> status only.
    expect(find('grassland-stock-factors', 'f-mg/nominal/tropical-dry')!.changed).toEqual(['status']);
    // F_I is carried over with the same value; only its stand-in uncertainty note differs. Entries only in 2019 are listed as such.
    expect(find('cropland-stock-factors', 'f-i/low/tropical-dry')!.changed).toEqual(['uncertainty']);
    expect(find('n2o-mineralisation', 'ef1/aggregated')).toMatchObject({ presence: 'only-b' });
    expect(find('gwp', 'ar5/n2o')).toBeUndefined();
  });
  it('a set compared with itself has no differences; a clone with one edit has exactly one', () => {
    expect(diffFactorSets(IPCC_2006, IPCC_2006)).toEqual([]);
    const clone: FactorSetDocument = structuredClone(IPCC_2006);
    clone.id = 'example-country';
    clone.tables.find((t) => t.key === 'soc-ref')!.entries.find((e) => e.key === 'cold-temperate-moist/hac')!.value =
      91;
    const d = diffFactorSets(IPCC_2006, clone);
    expect(d).toEqual([
      expect.objectContaining({ table: 'soc-ref', entry: 'cold-temperate-moist/hac', changed: ['value'] }),
    ]);
  });
});

describe('sign-off', () => {
  it('is blocked while a used table is unconfirmed, and allowed once it is confirmed', () => {
    const clone: FactorSetDocument = structuredClone(IPCC_2006);
    expect(canSignOff(clone, ['soc-ref', 'gwp'])).toBe(false);
    for (const t of clone.tables) {
      t.status = 'confirmed';
      for (const e of t.entries) if (e.status === 'unconfirmed') delete e.status;
    }
    expect(unconfirmedTables(clone)).toEqual([]);
    expect(canSignOff(clone)).toBe(true);
  });
  it('an unconfirmed entry keeps a table unconfirmed', () => {
    const clone: FactorSetDocument = structuredClone(IPCC_2006);
    const gwp = clone.tables.find((t) => t.key === 'gwp')!;
    gwp.entries[0]!.status = 'unconfirmed';
    expect(unconfirmedTables(clone)).toContain('gwp');
  });
  it("tablesUsed reads the table keys out of a result's factors", () => {
    expect(
      tablesUsed([
        { key: 'soc-ref/boreal/hac' },
        { key: 'gwp/ar5/n2o' },
        { key: 'constant/c-to-co2' },
        { key: 'soc-ref/boreal/lac' },
      ]),
    ).toEqual(['soc-ref', 'gwp']);
  });
});

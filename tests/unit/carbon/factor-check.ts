import { expect } from 'vitest';
import type { FactorSetDocument, Uncertainty } from '~/lib/carbon';
import { entryStatus } from '~/lib/carbon';

/**
 * Helper for the data-file tests: checks one entry against a value transcribed from the
 * published table (as ipcc-tier1.md gives it) and records it, so a final test can prove
 * every shipped entry was checked.
 */
export function checker(set: FactorSetDocument) {
  const checked = new Set<string>();
  function entry(table: string, key: string) {
    const t = set.tables.find((x) => x.key === table);
    expect(t, `table ${table}`).toBeDefined();
    const e = t!.entries.find((x) => x.key === key);
    expect(e, `${table}/${key}`).toBeDefined();
    checked.add(`${table}/${key}`);
    return { t: t!, e: e!, status: entryStatus(t!, e!) };
  }
  return {
    checked,
    /** Value, unit, uncertainty and status of one entry. */
    value(
      table: string,
      key: string,
      value: number,
      unit: string,
      uncertainty: Uncertainty | { kind: 'none' },
      status: 'confirmed' | 'unconfirmed',
    ) {
      const { e, status: s } = entry(table, key);
      expect(e.value, `${table}/${key}`).toBe(value);
      expect(e.unit, `${table}/${key} unit`).toBe(unit);
      if (uncertainty.kind === 'none') expect(e.uncertainty.kind, `${table}/${key} uncertainty`).toBe('none');
      else expect(e.uncertainty, `${table}/${key} uncertainty`).toMatchObject(uncertainty);
      expect(s, `${table}/${key} status`).toBe(status);
      return e;
    },
    /** An explicit not-applicable entry. */
    na(table: string, key: string) {
      const { e, status } = entry(table, key);
      expect(e.value, `${table}/${key}`).toBeNull();
      expect(status, `${table}/${key}`).toBe('not-applicable');
    },
    allKeys: () => set.tables.flatMap((t) => t.entries.map((e) => `${t.key}/${e.key}`)),
  };
}

export const pct = (p: number, basis: 'two-sd' | 'ci95') => ({ kind: 'percent' as const, plusMinusPercent: p, basis });
export const range = (low: number, high: number) => ({ kind: 'range' as const, low, high, basis: 'ci95' as const });
export const NONE = { kind: 'none' as const };
export const SOILS = ['hac', 'lac', 'sandy', 'spodic', 'volcanic', 'wetland'] as const;
export const REGIMES = [
  'temperate-boreal-dry',
  'temperate-boreal-moist',
  'tropical-dry',
  'tropical-moist-wet',
  'tropical-montane',
] as const;

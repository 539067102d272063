import {
  entryStatus,
  type FactorEntry,
  type FactorSetDocument,
  type FactorTable,
  type Uncertainty,
} from './factor-set-schema';
import type { ValueStatus } from './types';

export interface EntrySide {
  value: number | null;
  unit: string;
  uncertainty: Uncertainty;
  status: ValueStatus;
}

/** One entry that differs between two sets (or exists in only one of them). */
export interface EntryDifference {
  table: string;
  entry: string;
  presence: 'both' | 'only-a' | 'only-b';
  /** Fields that differ when the entry is in both sets. */
  changed: ('value' | 'unit' | 'uncertainty' | 'status')[];
  a: EntrySide | null;
  b: EntrySide | null;
}

function side(t: FactorTable, e: FactorEntry): EntrySide {
  return { value: e.value, unit: e.unit, uncertainty: e.uncertainty, status: entryStatus(t, e) };
}

/** Stable JSON of an uncertainty (key order independent) for comparison. */
function sameUncertainty(x: Uncertainty, y: Uncertainty): boolean {
  const norm = (u: Uncertainty) => JSON.stringify(Object.entries(u).sort(([p], [q]) => p.localeCompare(q)));
  return norm(x) === norm(y);
}

/**
 * Entries whose value, unit, uncertainty or effective status differ between sets `a` and
 * `b`, plus entries found in only one of them; in table order of `a`, then `b`'s extras.
 */
export function diffFactorSets(a: FactorSetDocument, b: FactorSetDocument): EntryDifference[] {
  const out: EntryDifference[] = [];
  const tablesB = new Map(b.tables.map((t) => [t.key, t]));
  const seenTables = new Set<string>();
  for (const ta of a.tables) {
    seenTables.add(ta.key);
    const tb = tablesB.get(ta.key);
    const entriesB = new Map((tb?.entries ?? []).map((e) => [e.key, e]));
    for (const ea of ta.entries) {
      const eb = entriesB.get(ea.key);
      entriesB.delete(ea.key);
      if (!tb || !eb) {
        out.push({ table: ta.key, entry: ea.key, presence: 'only-a', changed: [], a: side(ta, ea), b: null });
        continue;
      }
      const sa = side(ta, ea);
      const sb = side(tb, eb);
      const changed: EntryDifference['changed'] = [];
      if (sa.value !== sb.value) changed.push('value');
      if (sa.unit !== sb.unit) changed.push('unit');
      if (!sameUncertainty(sa.uncertainty, sb.uncertainty)) changed.push('uncertainty');
      if (sa.status !== sb.status) changed.push('status');
      if (changed.length > 0) out.push({ table: ta.key, entry: ea.key, presence: 'both', changed, a: sa, b: sb });
    }
    if (tb)
      for (const eb of entriesB.values())
        out.push({ table: ta.key, entry: eb.key, presence: 'only-b', changed: [], a: null, b: side(tb, eb) });
  }
  for (const tb of b.tables) {
    if (seenTables.has(tb.key)) continue;
    for (const eb of tb.entries)
      out.push({ table: tb.key, entry: eb.key, presence: 'only-b', changed: [], a: null, b: side(tb, eb) });
  }
  return out;
}

/** Keys of tables not yet confirmed: the table itself, or any of its entries, is unconfirmed. */
export function unconfirmedTables(set: FactorSetDocument): string[] {
  return set.tables
    .filter((t) => t.status === 'unconfirmed' || t.entries.some((e) => entryStatus(t, e) === 'unconfirmed'))
    .map((t) => t.key);
}

/**
 * Whether a signed assessment may rest on this set: false while any table used is
 * unconfirmed. `usedTables` (table keys, e.g. from `tablesUsed(result.factors)`) narrows
 * the check to the tables a calculation used; without it every table counts.
 */
export function canSignOff(set: FactorSetDocument, usedTables?: Iterable<string>): boolean {
  const open = new Set(unconfirmedTables(set));
  if (!usedTables) return open.size === 0;
  for (const t of usedTables) if (open.has(t)) return false;
  return true;
}

/** Table keys named by a result's factors (`<table>/<entry>` keys; constants excluded). */
export function tablesUsed(factors: readonly { key: string }[]): string[] {
  return [...new Set(factors.map((f) => f.key.split('/')[0]!).filter((t) => t !== 'constant'))];
}

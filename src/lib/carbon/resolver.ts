import {
  entryStatus,
  type FactorEntry,
  type FactorSetDocument,
  type FactorTable,
  type Uncertainty,
} from './factor-set-schema';
import type { EstimateInputIssue } from './errors';
import type { SourceRef, UsedFactor } from './types';

/** A factor chosen for a calculation: provenance plus the published uncertainty. */
export interface PlanFactor extends UsedFactor {
  uncertainty: Uncertainty;
  /** Table key, e.g. `soc-ref`. */
  table: string;
}

type Index = Map<string, { table: FactorTable; entries: Map<string, FactorEntry> }>;
const indexCache = new WeakMap<FactorSetDocument, Index>();

function indexOf(set: FactorSetDocument): Index {
  let idx = indexCache.get(set);
  if (!idx) {
    idx = new Map(set.tables.map((t) => [t.key, { table: t, entries: new Map(t.entries.map((e) => [e.key, e])) }]));
    indexCache.set(set, idx);
  }
  return idx;
}

/** Drops unknown (null) fields: a result never carries null. */
function sourceRef(s: FactorTable['source']): SourceRef {
  return {
    document: s.document,
    table: s.table,
    ...(s.volume !== null ? { volume: s.volume } : {}),
    ...(s.chapter !== null ? { chapter: s.chapter } : {}),
    ...(s.page !== null ? { page: s.page } : {}),
  };
}

/**
 * Looks values up in ONE factor set (never mixing sets), records each value used with its
 * source and role, and collects an issue (rather than throwing at once) for every value that
 * is missing or marked not applicable, so the caller can report all problems together.
 */
export class Resolver {
  readonly issues: EstimateInputIssue[] = [];
  readonly factors = new Map<string, PlanFactor>();
  constructor(readonly set: FactorSetDocument) {}

  /**
   * Returns the factor key `<table>/<entry>`. `path` and `notApplicable` describe the
   * request field to blame when the table marks the combination not applicable.
   */
  use(tableKey: string, entryKey: string, role: string, path: (string | number)[], notApplicable: string): string {
    const key = `${tableKey}/${entryKey}`;
    const known = this.factors.get(key);
    if (known) {
      if (!known.role.includes(role)) known.role = `${known.role}; ${role}`;
      return key;
    }
    const hit = indexOf(this.set).get(tableKey);
    const entry = hit?.entries.get(entryKey);
    if (!hit || !entry) {
      this.issues.push({
        path: ['factorSet'],
        message: `Factor set "${this.set.id}" v${this.set.version} has no value "${entryKey}" in table "${tableKey}".`,
      });
      return key;
    }
    const status = entryStatus(hit.table, entry);
    if (status === 'not-applicable' || entry.value === null) {
      this.issues.push({
        path,
        message: `${notApplicable} (${this.set.id}, ${hit.table.source.table}: not applicable).`,
      });
      return key;
    }
    this.factors.set(key, {
      key,
      table: tableKey,
      value: entry.value,
      unit: entry.unit,
      source: sourceRef(entry.source ?? hit.table.source),
      status,
      role,
      uncertainty: entry.uncertainty,
    });
    return key;
  }

  /** Value of a factor already resolved by `use`. */
  value(key: string): number {
    const f = this.factors.get(key);
    if (!f) throw new Error(`factor ${key} was not resolved`);
    return f.value;
  }
}

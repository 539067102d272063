/** Pure helpers over factor-set documents: merging confirmations, editing one entry, re-identifying a clone. */
import { sameJsonContent } from '../canonical-json';
import { factorSetDocumentSchema, type FactorSetDocument, type Uncertainty } from '../carbon';

export type TableConfirmation = { tableKey: string; by: string; at: string; document: string; page: string };

/** A confirmed table is confirmed as a whole: its entries lose their own "unconfirmed" marks. */
export function withConfirmations(doc: FactorSetDocument, confirmations: TableConfirmation[]): FactorSetDocument {
  const byKey = new Map(confirmations.map((c) => [c.tableKey, c]));
  return {
    ...doc,
    tables: doc.tables.map((t) => {
      const c = byKey.get(t.key);
      if (!c) return t;
      return {
        ...t,
        status: 'confirmed' as const,
        confirmation: { by: c.by, at: c.at, document: c.document, page: c.page },
        entries: t.entries.map((e) => (e.status === 'unconfirmed' ? { ...e, status: undefined } : e)),
      };
    }),
  };
}

/** Returns a copy with one entry's value (and optionally uncertainty) replaced; the entry and its table become unconfirmed. */
export function withEditedEntry(
  doc: FactorSetDocument,
  edit: { tableKey: string; entryKey: string; value: number; uncertainty?: Uncertainty; note: string },
): { document: FactorSetDocument; before: unknown; after: unknown } {
  const table = doc.tables.find((t) => t.key === edit.tableKey);
  if (!table) throw new RangeError(`No table "${edit.tableKey}" in this set.`);
  const entry = table.entries.find((e) => e.key === edit.entryKey);
  if (!entry) throw new RangeError(`No entry "${edit.entryKey}" in table "${edit.tableKey}".`);
  if (entry.status === 'not-applicable')
    throw new RangeError(
      `Entry "${edit.entryKey}" is marked not applicable in the source table; it has no value to change.`,
    );
  const changed = {
    ...entry,
    value: edit.value,
    uncertainty: edit.uncertainty ?? entry.uncertainty,
    note: edit.note,
    status: undefined,
  };
  const document = factorSetDocumentSchema.parse({
    ...doc,
    tables: doc.tables.map((t) =>
      t.key !== edit.tableKey
        ? t
        : {
            ...t,
            status: 'unconfirmed',
            confirmation: undefined,
            entries: t.entries.map((e) => (e.key === edit.entryKey ? changed : e)),
          },
    ),
  });
  return {
    document,
    before: { value: entry.value, uncertainty: entry.uncertainty },
    after: { value: changed.value, uncertainty: changed.uncertainty },
  };
}

/** A clone keeps every value and source, under a new id and title, as version 1. */
export function cloneDocument(
  doc: FactorSetDocument,
  id: string,
  title: string,
  description: string,
): FactorSetDocument {
  return { ...doc, id, version: 1, title, description };
}

/** Same content after a round trip through jsonb (which reorders keys): compared in canonical form. */
export function sameDocument(a: FactorSetDocument, b: FactorSetDocument): boolean {
  return sameJsonContent(a, b);
}

/**
 * The stored form of an assessment result (pure): the long per-parcel lists (`parcels`,
 * `facts.parcels`, `overlayUsed`) are kept by column instead of as one object per parcel, so the
 * names of the fields are written once and a field with the same value for every parcel once.
 * `unpackResult(packResult(x))` gives back the same JSON value; results stored before this form
 * (no `packed` mark) are read as they are.
 */

type Json = unknown;
/** One column: plain values, a packed list of objects, lists of objects (their lengths and all their items packed as one list), or one value for every row. */
type Column = ['v', Json[]] | ['p', Packed] | ['a', number[], Packed] | ['c', Json];
export type Packed = { n: number; keys: string[]; cols: Column[] };

const PACK_MARK = 1;

const isPlain = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** The keys every item shares in the same order, or null when the items are not such objects. */
function sharedKeys(items: unknown[]): string[] | null {
  if (!items.length || !items.every(isPlain)) return null;
  const keys = Object.keys(items[0] as object);
  for (const o of items as Record<string, unknown>[]) {
    const k = Object.keys(o);
    if (k.length !== keys.length || k.some((x, i) => x !== keys[i])) return null;
    if (k.some((x) => o[x] === undefined)) return null;
  }
  return keys;
}

function column(values: unknown[]): Column {
  const first = values[0];
  if (first === null || ['string', 'number', 'boolean'].includes(typeof first)) {
    if (values.every((v) => v === first)) return ['c', first];
    return ['v', values];
  }
  if (sharedKeys(values)) return ['p', packRows(values as Record<string, unknown>[])];
  if (values.every(Array.isArray)) {
    const items = (values as unknown[][]).flat();
    if (items.length && sharedKeys(items))
      return ['a', (values as unknown[][]).map((v) => v.length), packRows(items as Record<string, unknown>[])];
  }
  return ['v', values];
}

/** A list of objects with the same keys, by column (any other list is kept as it is by `column`). */
export function packRows(rows: Record<string, unknown>[]): Packed {
  const keys = rows.length ? sharedKeys(rows) : [];
  if (keys === null) throw new Error('packRows: the rows do not share their keys');
  return { n: rows.length, keys, cols: keys.map((k) => column(rows.map((r) => r[k]))) };
}

function columnValues(c: Column, n: number): unknown[] {
  switch (c[0]) {
    case 'v':
      return c[1];
    case 'p':
      return unpackRows(c[1]);
    case 'a': {
      const items = unpackRows(c[2]);
      let at = 0;
      return c[1].map((len) => items.slice(at, (at += len)));
    }
    case 'c':
      return Array.from({ length: n }, () => c[1]);
  }
}

export function unpackRows(p: Packed): Record<string, unknown>[] {
  const cols = p.cols.map((c) => columnValues(c, p.n));
  return Array.from({ length: p.n }, (_, i) => Object.fromEntries(p.keys.map((k, j) => [k, cols[j]![i]])));
}

/** A list packed when its items share their keys, else as it is (`{ list }`). */
const packList = (v: unknown) =>
  Array.isArray(v) && (v.length === 0 || sharedKeys(v))
    ? { rows: packRows(v as Record<string, unknown>[]) }
    : { list: v };
const unpackList = (v: { rows?: Packed; list?: unknown }) => (v.rows ? unpackRows(v.rows) : v.list);

type ResultLike = {
  parcels: unknown;
  overlayUsed: Record<string, unknown>;
  facts: { parcels: unknown } & Record<string, unknown>;
} & Record<string, unknown>;

/** The form written to `assessment.result`. */
export function packResult<T extends ResultLike>(r: T): Record<string, unknown> {
  const overlay = Object.entries(r.overlayUsed).map(([parcelId, rows]) => ({ parcelId, rows }));
  return {
    ...r,
    packed: PACK_MARK,
    parcels: packList(r.parcels),
    overlayUsed: packList(overlay),
    facts: { ...r.facts, parcels: packList(r.facts.parcels) },
  };
}

/** The result as computed, from its stored form (either form). */
export function unpackResult<T>(stored: unknown): T {
  const s = stored as Record<string, unknown> & { packed?: number };
  if (s?.packed !== PACK_MARK) return stored as T;
  const { packed: _p, parcels, overlayUsed, facts, ...rest } = s as Record<string, never>;
  const overlay = unpackList(overlayUsed) as { parcelId: string; rows: unknown }[];
  return {
    ...rest,
    parcels: unpackList(parcels),
    overlayUsed: Object.fromEntries(overlay.map((o) => [o.parcelId, o.rows])),
    facts: { ...(facts as Record<string, unknown>), parcels: unpackList((facts as { parcels: never }).parcels) },
  } as T;
}

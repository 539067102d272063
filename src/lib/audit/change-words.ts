/**
 * An audit entry's details in words: one line per field, "before → after" where the entry records
 * both (`{ before, after }`, or the older `{ before, patch }`), else the value. Shows what the entry
 * holds, no more (pure).
 */
export type ChangeLine = { field: string; before?: string; after: string };

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** "entityId" → "Entity id", "grass_since" → "Grass since". */
export function fieldWords(key: string): string {
  const words = key
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/[_-]+/g, ' ')
    .toLowerCase()
    .trim();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/** A value in words: lists joined, nested objects as "field: value; …", nothing as a dash. */
export function valueWords(v: unknown, depth = 0): string {
  if (v === null || v === undefined || v === '') return '—';
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  if (typeof v === 'number') return String(v);
  if (typeof v === 'string') return v;
  if (Array.isArray(v)) return v.length ? v.map((x) => valueWords(x, depth + 1)).join(', ') : 'none';
  if (isObject(v)) {
    const parts = Object.entries(v).map(([k, x]) => `${fieldWords(k).toLowerCase()}: ${valueWords(x, depth + 1)}`);
    return depth > 0 ? `(${parts.join('; ')})` : parts.join('; ');
  }
  return String(v);
}

export function changeLines(details: Record<string, unknown> | null | undefined): ChangeLine[] {
  if (!details) return [];
  const { before, after, patch, ...rest } = details;
  const next = isObject(after) ? after : isObject(patch) ? patch : null;
  const lines: ChangeLine[] = [];
  if (isObject(before) && next) {
    for (const k of [...new Set([...Object.keys(next), ...Object.keys(before)])]) {
      lines.push({
        field: fieldWords(k),
        before: valueWords(before[k]),
        after: k in next ? valueWords(next[k]) : '(unchanged)',
      });
    }
  } else {
    for (const [k, v] of Object.entries({ before, after, patch }))
      if (v !== undefined) lines.push({ field: fieldWords(k), after: valueWords(v) });
  }
  for (const [k, v] of Object.entries(rest)) lines.push({ field: fieldWords(k), after: valueWords(v) });
  return lines;
}

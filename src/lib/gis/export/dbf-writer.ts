import type { AttributeValue } from '../types';

/**
 * Writes a dBASE III table (.dbf) from plain rows (pure: rows → bytes). Field names are
 * ASCII, at most 10 characters (dBASE III limit). Text is written as UTF-8 (pair it with a
 * .cpg saying "UTF-8") or as Latin-1/windows-1252 single bytes.
 */
export interface DbfFieldSpec {
  name: string;
  type: 'C' | 'N' | 'D' | 'L';
  /** Field width in bytes (C ≤ 254, N ≤ 18, D is always 8, L is always 1). */
  length: number;
  /** Digits after the decimal point, N fields only. */
  decimals?: number;
}

export type DbfTextEncoding = 'utf-8' | 'windows-1252';

function encodeText(text: string, encoding: DbfTextEncoding, max: number): Uint8Array {
  if (encoding === 'windows-1252') {
    // Latin-1 code points coincide with windows-1252 for 0x20-0x7E and 0xA0-0xFF.
    return Uint8Array.from([...text].slice(0, max).map((c) => (c.charCodeAt(0) < 256 ? c.charCodeAt(0) : 0x3f)));
  }
  let bytes = new TextEncoder().encode(text);
  let chars = [...text];
  while (bytes.length > max) {
    chars = chars.slice(0, -1); // drop whole characters so no UTF-8 sequence is cut
    bytes = new TextEncoder().encode(chars.join(''));
  }
  return bytes;
}

function formatValue(field: DbfFieldSpec, value: AttributeValue): string {
  if (value === null || value === undefined) return '';
  switch (field.type) {
    case 'N':
      return typeof value === 'number' && Number.isFinite(value) ? value.toFixed(field.decimals ?? 0) : '';
    case 'D':
      return String(value).replace(/-/g, '').slice(0, 8);
    case 'L':
      return value === true ? 'T' : value === false ? 'F' : '?';
    default:
      return String(value);
  }
}

export function writeDbf(
  fields: DbfFieldSpec[],
  rows: Record<string, AttributeValue>[],
  encoding: DbfTextEncoding = 'utf-8',
): Uint8Array {
  for (const f of fields) {
    if (!/^[A-Za-z_][A-Za-z0-9_]{0,9}$/.test(f.name))
      throw new Error(`DBF field name "${f.name}" must be 1-10 ASCII letters, digits or _.`);
  }
  const headerLength = 32 + 32 * fields.length + 1;
  const recordLength = 1 + fields.reduce((s, f) => s + f.length, 0);
  const out = new Uint8Array(headerLength + recordLength * rows.length + 1);
  const dv = new DataView(out.buffer);
  out[0] = 0x03; // dBASE III without memo
  out[1] = 95; // last update 1995-07-26: fixed for byte-identical output
  out[2] = 7;
  out[3] = 26;
  dv.setUint32(4, rows.length, true);
  dv.setUint16(8, headerLength, true);
  dv.setUint16(10, recordLength, true);
  fields.forEach((f, i) => {
    const at = 32 + 32 * i;
    out.set(new TextEncoder().encode(f.name), at);
    out[at + 11] = f.type.charCodeAt(0);
    out[at + 16] = f.length;
    out[at + 17] = f.decimals ?? 0;
  });
  out[headerLength - 1] = 0x0d;
  rows.forEach((row, r) => {
    let at = headerLength + r * recordLength;
    out[at++] = 0x20; // not deleted
    for (const f of fields) {
      out.fill(0x20, at, at + f.length);
      const text = formatValue(f, row[f.name] ?? null);
      if (f.type === 'N' && text.length > f.length)
        throw new Error(`Value ${text} does not fit DBF field ${f.name} (${f.length} characters).`);
      const bytes = encodeText(text, encoding, f.length);
      // Numbers are right-aligned, everything else left-aligned (dBASE convention).
      out.set(bytes, f.type === 'N' ? at + f.length - bytes.length : at);
      at += f.length;
    }
  });
  out[out.length - 1] = 0x1a; // end-of-file marker
  return out;
}

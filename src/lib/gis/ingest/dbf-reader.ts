import { GisInputError } from '../errors';
import type { AttributeValue } from '../types';

/**
 * A bounded dBase III/IV (.dbf) reader. The header is checked against the real byte length
 * BEFORE any record is read, so a forged record count cannot make us loop or allocate
 * beyond the file (shpjs's parsedbf trusts the header). Values are returned as plain data:
 * C → string | null, N/F → number | null, D → "YYYY-MM-DD" | null, L → boolean | null.
 * Layout: dBASE file header (32 B), 32-B field descriptors ended by 0x0D, then records of
 * recLen bytes each starting with a deletion flag (common practice, dBASE III+ format).
 */
export interface DbfField {
  name: string;
  type: string;
  length: number;
}

export interface DbfHeader {
  records: number;
  headerLength: number;
  recordLength: number;
  fields: DbfField[];
}

const DESCRIPTOR_BYTES = 32;
const TERMINATOR = 0x0d;
/** dBASE III/IV/5 (low bits 3,4,5) and Visual FoxPro (0x30-0x32) version bytes. */
function isKnownVersion(v: number): boolean {
  return [3, 4, 5].includes(v & 0x07) || v === 0x30 || v === 0x31 || v === 0x32;
}

/** Checks a .dbf header and field list against the file size. Throws GisInputError('bad-dbf'). */
export function readDbfHeader(bytes: Uint8Array, file: string): DbfHeader {
  if (bytes.byteLength < 33)
    throw new GisInputError('bad-dbf', `${file} is truncated: ${bytes.byteLength} bytes, shorter than a dBase header.`);
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (!isKnownVersion(bytes[0]!)) {
    throw new GisInputError(
      'bad-dbf',
      `${file} is not a dBase table (wrong magic bytes: version byte 0x${bytes[0]!.toString(16)}).`,
    );
  }
  const records = dv.getUint32(4, true);
  const headerLength = dv.getUint16(8, true);
  const recordLength = dv.getUint16(10, true);
  if (headerLength < 33 || headerLength > bytes.byteLength) {
    throw new GisInputError(
      'bad-dbf',
      `${file} has a corrupt header: header length ${headerLength} does not fit the ${bytes.byteLength}-byte file.`,
    );
  }
  const fields = readFields(bytes, headerLength, file);
  const sum = fields.reduce((s, f) => s + f.length, 1);
  if (sum !== recordLength) {
    throw new GisInputError(
      'bad-dbf',
      `${file} has a corrupt header: fields add up to ${sum} bytes per record but the header says ${recordLength}.`,
    );
  }
  const needed = headerLength + records * recordLength;
  if (needed > bytes.byteLength) {
    throw new GisInputError(
      'bad-dbf',
      `${file} is truncated or its header is corrupt: it declares ${records} records (${needed} bytes) but holds only ${bytes.byteLength} bytes.`,
    );
  }
  return { records, headerLength, recordLength, fields };
}

function readFields(bytes: Uint8Array, headerLength: number, file: string): DbfField[] {
  const fields: DbfField[] = [];
  let at = DESCRIPTOR_BYTES;
  while (at < headerLength && bytes[at] !== TERMINATOR) {
    if (at + DESCRIPTOR_BYTES > headerLength)
      throw new GisInputError('bad-dbf', `${file} has a field descriptor cut off by the header end.`);
    const rawName = bytes.subarray(at, at + 11);
    const nul = rawName.indexOf(0);
    const name = String.fromCharCode(...rawName.subarray(0, nul === -1 ? 11 : nul)).trim();
    const type = String.fromCharCode(bytes[at + 11]!);
    const length = bytes[at + 16]!;
    if (!name || length === 0)
      throw new GisInputError('bad-dbf', `${file} has a corrupt field descriptor (field ${fields.length + 1}).`);
    fields.push({ name, type, length });
    at += DESCRIPTOR_BYTES;
  }
  if (fields.length === 0) throw new GisInputError('bad-dbf', `${file} has no fields (corrupt header).`);
  return fields;
}

/** Reads records [from, to) (default all) with the given TextDecoder encoding label. Call readDbfHeader first. */
export function readDbfRecords(
  bytes: Uint8Array,
  header: DbfHeader,
  encoding: string,
  from = 0,
  to = header.records,
): Record<string, AttributeValue>[] {
  const decoder = new TextDecoder(encoding);
  const rows: Record<string, AttributeValue>[] = [];
  for (let r = from; r < Math.min(to, header.records); r++) {
    let at = header.headerLength + r * header.recordLength + 1; // skip the deletion flag
    const row: Record<string, AttributeValue> = {};
    for (const field of header.fields) {
      const text = decoder
        .decode(bytes.subarray(at, at + field.length))
        .replace(/\0/g, '')
        .trim();
      row[field.name] = decodeValue(field.type, text);
      at += field.length;
    }
    rows.push(row);
  }
  return rows;
}

function decodeValue(type: string, text: string): AttributeValue {
  if (text === '') return null;
  switch (type) {
    case 'N':
    case 'F': {
      const n = Number(text);
      return Number.isFinite(n) ? n : null;
    }
    case 'D':
      return decodeDate(text);
    case 'L':
      if ('TtYy'.includes(text)) return true;
      if ('FfNn'.includes(text)) return false;
      return null;
    default:
      return text;
  }
}

/** "YYYYMMDD" → "YYYY-MM-DD"; zeros → null; anything else is kept as text for the mapping step. */
function decodeDate(text: string): AttributeValue {
  if (/^0+$/.test(text)) return null;
  const m = /^(\d{4})(\d{2})(\d{2})$/.exec(text);
  if (!m) return text;
  const iso = `${m[1]}-${m[2]}-${m[3]}`;
  const d = new Date(`${iso}T00:00:00Z`);
  return Number.isNaN(d.getTime()) || d.toISOString().slice(0, 10) !== iso ? text : iso;
}

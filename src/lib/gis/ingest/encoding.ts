import { GisInputError } from '../errors';

/** Encoding used when there is no .cpg and the bytes are not valid UTF-8 (common practice for DBFs from desktop GIS on Windows). */
export const FALLBACK_DBF_ENCODING = 'windows-1252';

function isSupported(label: string): boolean {
  try {
    new TextDecoder(label);
    return true;
  } catch {
    return false;
  }
}

/** Turns a .cpg text ("UTF-8", "1252", "ANSI 1252", "88591", "ISO-8859-15"...) into a TextDecoder label, or null. */
export function labelFromCpg(cpg: string): string | null {
  const text = (cpg.split(/\r?\n/)[0] ?? '').trim();
  if (!text) return null;
  const ansi = /^(?:ANSI\s*|CP|WINDOWS-?)?(\d{3,5})$/i.exec(text);
  const candidates: string[] = [];
  if (ansi) {
    const n = ansi[1]!;
    if (n === '65001') candidates.push('utf-8');
    if (/^8859\d{1,2}$/.test(n)) candidates.push(`iso-8859-${n.slice(4)}`);
    candidates.push(`windows-${n}`);
  } else {
    candidates.push(text.toLowerCase(), text.toLowerCase().replace(/^utf8$/, 'utf-8'));
  }
  return candidates.find(isSupported) ?? null;
}

export function isValidUtf8(bytes: Uint8Array): boolean {
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    return true;
  } catch {
    return false;
  }
}

/**
 * Chooses the text encoding of a .dbf: the .cpg when present (and then the bytes must
 * decode in it), else UTF-8 when the bytes are valid UTF-8, else windows-1252.
 * Throws GisInputError('unreadable-encoding') with the file names in the message.
 */
export function resolveDbfEncoding(cpg: string | null, records: Uint8Array, dbfName: string): string {
  if (cpg !== null && cpg.trim() !== '') {
    const label = labelFromCpg(cpg);
    if (!label) {
      throw new GisInputError(
        'unreadable-encoding',
        `The .cpg for ${dbfName} names the encoding "${cpg.trim()}", which cannot be read.`,
      );
    }
    const canonical = new TextDecoder(label).encoding;
    if (canonical === 'utf-8' && !isValidUtf8(records)) {
      throw new GisInputError(
        'unreadable-encoding',
        `${dbfName} is declared UTF-8 by its .cpg but contains bytes that are not valid UTF-8; fix the .cpg (e.g. "1252") or re-export the file.`,
      );
    }
    return canonical;
  }
  return isValidUtf8(records) ? 'utf-8' : FALLBACK_DBF_ENCODING;
}

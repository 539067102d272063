/**
 * Minimal, deterministic zip writer (PKWARE APPNOTE.TXT 6.3: local file headers, central
 * directory, end-of-central-directory record; no zip64, no encryption). Pure: bytes in,
 * bytes out. Entries are stored, or deflated when a raw-deflate function is supplied
 * (e.g. node:zlib deflateRawSync in scripts). Timestamps are fixed at 1980-01-01 00:00 so
 * the same input always gives the same bytes.
 */
export interface ZipEntryInput {
  name: string;
  data: Uint8Array;
}

export interface ZipWriteOptions {
  /** Raw DEFLATE (RFC 1951) compressor; when absent, entries are stored uncompressed. */
  deflateRaw?: (data: Uint8Array) => Uint8Array;
}

const CRC_TABLE = (() => {
  const table = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    table[n] = c >>> 0;
  }
  return table;
})();

/** CRC-32 (ISO 3309 / ITU-T V.42 polynomial 0xEDB88320), as used by zip. */
export function crc32(data: Uint8Array): number {
  let crc = 0xffffffff;
  for (let i = 0; i < data.length; i++) crc = CRC_TABLE[(crc ^ data[i]!) & 0xff]! ^ (crc >>> 8);
  return (crc ^ 0xffffffff) >>> 0;
}

const DOS_DATE_1980_01_01 = (0 << 9) | (1 << 5) | 1;
const UTF8_FLAG = 0x0800;

export function createZip(entries: ZipEntryInput[], options: ZipWriteOptions = {}): Uint8Array {
  const encoder = new TextEncoder();
  const locals: Uint8Array[] = [];
  const centrals: Uint8Array[] = [];
  let offset = 0;
  for (const entry of entries) {
    const name = encoder.encode(entry.name);
    const deflated = options.deflateRaw?.(entry.data);
    const useDeflate = deflated !== undefined && deflated.length < entry.data.length;
    const body = useDeflate ? deflated : entry.data;
    const fields = {
      method: useDeflate ? 8 : 0,
      crc: crc32(entry.data),
      size: body.length,
      rawSize: entry.data.length,
    };
    const local = new Uint8Array(30 + name.length);
    const lv = new DataView(local.buffer);
    lv.setUint32(0, 0x04034b50, true);
    writeCommon(lv, 4, fields);
    lv.setUint16(26, name.length, true);
    local.set(name, 30);
    const central = new Uint8Array(46 + name.length);
    const cv = new DataView(central.buffer);
    cv.setUint32(0, 0x02014b50, true);
    cv.setUint16(4, 20, true); // version made by
    writeCommon(cv, 6, fields);
    cv.setUint16(28, name.length, true);
    cv.setUint32(42, offset, true);
    central.set(name, 46);
    locals.push(local, body);
    centrals.push(central);
    offset += local.length + body.length;
  }
  const centralSize = centrals.reduce((s, c) => s + c.length, 0);
  const end = new Uint8Array(22);
  const ev = new DataView(end.buffer);
  ev.setUint32(0, 0x06054b50, true);
  ev.setUint16(8, entries.length, true);
  ev.setUint16(10, entries.length, true);
  ev.setUint32(12, centralSize, true);
  ev.setUint32(16, offset, true);
  return concatBytes([...locals, ...centrals, end]);
}

/** Writes version-needed … uncompressed-size, the part shared by local and central headers. */
function writeCommon(v: DataView, at: number, f: { method: number; crc: number; size: number; rawSize: number }): void {
  v.setUint16(at, 20, true); // version needed to extract: 2.0
  v.setUint16(at + 2, UTF8_FLAG, true);
  v.setUint16(at + 4, f.method, true);
  v.setUint16(at + 6, 0, true); // time 00:00
  v.setUint16(at + 8, DOS_DATE_1980_01_01, true);
  v.setUint32(at + 10, f.crc, true);
  v.setUint32(at + 14, f.size, true);
  v.setUint32(at + 18, f.rawSize, true);
}

export function concatBytes(parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((s, p) => s + p.length, 0));
  let at = 0;
  for (const part of parts) {
    out.set(part, at);
    at += part.length;
  }
  return out;
}

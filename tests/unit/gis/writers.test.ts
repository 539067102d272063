import { crc32 as nodeCrc32 } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { writeDbf } from '~/lib/gis/export/dbf-writer';
import { createZip, crc32 } from '~/lib/gis/export/zip-writer';
import { readZipEntries } from '~/lib/gis/ingest/zip-reader';
import { readDbfHeader, readDbfRecords } from '~/lib/gis/ingest/dbf-reader';

describe('zip and dbf writers', () => {
  it('CRC-32 of "123456789" is 0xCBF43926 (CRC-32/ISO-HDLC check value, from memory) and matches node:zlib', () => {
    const bytes = new TextEncoder().encode('123456789');
    expect(crc32(bytes)).toBe(0xcbf43926);
    const sample = new TextEncoder().encode('Swardkeep parcels ✓');
    expect(crc32(sample)).toBe(nodeCrc32(sample));
  });

  it('writes zips that read back byte for byte, and identically each time', async () => {
    const entries = [
      { name: 'a/b.txt', data: new TextEncoder().encode('hello') },
      { name: 'c.bin', data: new Uint8Array([0, 1, 2]) },
    ];
    const zip = createZip(entries);
    expect(createZip(entries)).toEqual(zip);
    const read = await readZipEntries(zip, { maxUncompressedBytes: 100, maxEntries: 5 }, () => true);
    expect([...read.entries()]).toEqual(entries.map((e) => [e.name, e.data]));
  });

  it('writes DBF values that the bounded reader returns unchanged, with names limited to 10 characters', () => {
    const fields = [
      { name: 'ref', type: 'C' as const, length: 8 },
      { name: 'ha', type: 'N' as const, length: 8, decimals: 3 },
      { name: 'till', type: 'D' as const, length: 8 },
      { name: 'grazed', type: 'L' as const, length: 1 },
    ];
    const rows = [
      { ref: 'Ærø-1', ha: 12.345, till: '2001-12-31', grazed: true },
      { ref: null, ha: null, till: null, grazed: null },
    ];
    const dbf = writeDbf(fields, rows);
    expect(readDbfRecords(dbf, readDbfHeader(dbf, 't.dbf'), 'utf-8')).toEqual(rows);
    expect(() => writeDbf([{ name: 'stated_area_ha', type: 'N', length: 5 }], [])).toThrow(
      /must be 1-10 ASCII letters/,
    );
    expect(() => writeDbf([{ name: 'ha', type: 'N', length: 3 }], [{ ha: 12345 }])).toThrow(
      'Value 12345 does not fit DBF field ha (3 characters).',
    );
  });
});

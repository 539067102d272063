/**
 * Hostile and broken files through the real upload route: each gets a 4xx whose message names
 * the problem, and nothing is written (no staging row, batch, parcel, history or audit event).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writePolygonShapefile } from '~/lib/gis/export/shapefile-writer';
import { FIELDS, layerEntries, sampleFiles, squareM, zipOf } from '../unit/gis/shapefile-fixtures';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { DEMO, signIn, type Session } from '../support/http';
import { uploadFile, uploadRowCounts, withSetting } from '../support/uploads';

let planner: Session;
beforeAll(async () => {
  planner = await signIn(DEMO.planner);
});
afterAll(() => testDb.destroy());

const edit = (bytes: Uint8Array, fn: (v: DataView) => void) => {
  const copy = bytes.slice();
  fn(new DataView(copy.buffer));
  return copy;
};

/** Uploads, expects `status` and a message matching `message`, and that no row was written. */
async function refused(fileName: string, bytes: Uint8Array | string, status: number, message: RegExp): Promise<void> {
  const before = await uploadRowCounts();
  const res = await uploadFile(planner, fileName, bytes);
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  expect(res.body.error.message).toMatch(message);
  expect(await uploadRowCounts()).toEqual(before);
}

describe('hostile or broken uploads are refused with a clear message and leave nothing behind', () => {
  const files = sampleFiles();

  it('wrong magic bytes: a .zip that is not a zip', async () => {
    await refused(
      'parcels.zip',
      new TextEncoder().encode('this is plain text, not a zip archive at all'),
      422,
      /not a zip archive \(wrong magic bytes/,
    );
  });

  it('a zip entry with a path-traversal name', async () => {
    const zip = zipOf([...layerEntries('p', files), { name: '../../etc/evil.shp', data: files.shp }]);
    await refused('traversal.zip', zip, 422, /unsafe entry name "\.\.\/\.\.\/etc\/evil\.shp"/);
  });

  it('a zip bomb: expands past the uncompressed limit (a setting)', async () => {
    const big = new Uint8Array(3_000_000); // zeros: deflates to a few kB
    const zip = zipOf([...layerEntries('p', files, { dbf: null }), { name: 'p.dbf', data: big }]);
    expect(zip.length).toBeLessThan(50_000);
    await withSetting('upload.max-uncompressed-bytes', 1_000_000, () =>
      refused('bomb.zip', zip, 413, /expands to more than the allowed 1000000 bytes.*zip bomb/),
    );
  });

  it('a file over the upload size limit (a setting)', async () => {
    const zip = zipOf(layerEntries('p', files), false);
    await withSetting('upload.max-bytes', 500, () =>
      refused('big.zip', zip, 413, /at most 500 (bytes )?are allowed|larger than the allowed 500 bytes/),
    );
  });

  it('a truncated .shp', async () => {
    await refused(
      'truncated.zip',
      zipOf(layerEntries('p', files, { shp: files.shp.slice(0, files.shp.length - 40) })),
      422,
      /p\.shp is truncated/,
    );
  });

  it('a .shp with wrong magic bytes', async () => {
    await refused(
      'magic.zip',
      zipOf(layerEntries('p', files, { shp: edit(files.shp, (v) => v.setInt32(0, 1234, false)) })),
      422,
      /p\.shp is not a shapefile component \(wrong magic bytes/,
    );
  });

  it('a .dbf whose header claims 2^31 records (would exhaust memory in a naive reader)', async () => {
    const dbf = edit(files.dbf, (v) => v.setUint32(4, 2 ** 31, true));
    await refused(
      'dbf-header.zip',
      zipOf(layerEntries('p', files, { dbf })),
      422,
      /p\.dbf is truncated or its header is corrupt: it declares 2147483648 records/,
    );
  });

  it('inconsistent parts: the .dbf has fewer rows than the .shp has shapes', async () => {
    const one = writePolygonShapefile(
      [
        {
          geometry: squareM(430000, 5805000),
          properties: { field_ref: 'X', name: 'x', stated_ha: 1, last_till: null },
        },
      ],
      { fields: FIELDS, prjWkt: null },
    );
    await refused(
      'mismatch.zip',
      zipOf(layerEntries('p', files, { dbf: one.dbf })),
      422,
      /p\.shp holds 2 shapes but p\.dbf holds 1 rows/,
    );
  });

  it('a missing .shx', async () => {
    await refused('noshx.zip', zipOf(layerEntries('p', files, { shx: null })), 422, /has no p\.shx index/);
  });

  it('a zip without any .shp', async () => {
    await refused(
      'noshp.zip',
      zipOf([{ name: 'readme.txt', data: new TextEncoder().encode('hello') }]),
      422,
      /contains no \.shp file/,
    );
  });

  it('an unreadable encoding: the .cpg says UTF-8 but the .dbf is not', async () => {
    const latin = sampleFiles({ encoding: 'windows-1252', names: ['Müller Acre', 'Émbrenlea'] });
    await refused(
      'encoding.zip',
      zipOf(layerEntries('p', latin, { cpg: new TextEncoder().encode('UTF-8') })),
      422,
      /declared UTF-8 by its \.cpg but contains bytes that are not valid UTF-8/,
    );
  });

  it('an unknown encoding named by the .cpg', async () => {
    await refused(
      'cpg.zip',
      zipOf(layerEntries('p', files, { cpg: new TextEncoder().encode('KLINGON-42') })),
      422,
      /names the encoding "KLINGON-42", which cannot be read/,
    );
  });

  it('GeoJSON that is not JSON, not GeoJSON, or not UTF-8', async () => {
    await refused('bad.geojson', '{"type": "FeatureCollection", "features": [', 422, /not valid JSON/);
    await refused('bad.geojson', '{"type": "Topology", "objects": {}}', 422, /not GeoJSON \(RFC 7946\)/);
    await refused('latin.geojson', new Uint8Array([0x7b, 0x22, 0xe9, 0x22, 0x7d]), 422, /not UTF-8 text/);
  });

  it('a file that is neither a zip nor GeoJSON', async () => {
    await refused(
      'report.pdf',
      new TextEncoder().encode('%PDF-1.7 not a map'),
      415,
      /neither a zipped shapefile \(\.zip\) nor a GeoJSON file/,
    );
  });

  it('an empty file, and a form without a file', async () => {
    await refused('empty.zip', new Uint8Array(0), 422, /is empty/);
    const before = await uploadRowCounts();
    const form = new FormData();
    form.set('purpose', 'parcels');
    const res = await fetch(`${BASE_URL}/api/uploads`, {
      method: 'POST',
      headers: { cookie: planner.cookie, origin: BASE_URL },
      body: form,
    });
    expect(res.status).toBe(422);
    expect((await res.json()).error.message).toMatch(/Attach the file in the "file" field/);
    expect(await uploadRowCounts()).toEqual(before);
  });

  it('a zip whose compressed data is damaged', async () => {
    const zip = zipOf(layerEntries('p', files));
    const broken = zip.slice();
    // The first entry's deflate data starts after its 30-byte local header and the name "p.shp".
    for (let i = 30 + 5 + 10; i < 30 + 5 + 40; i++) broken[i] = 0xff;
    await refused('damaged.zip', broken, 422, /damaged|cannot be decompressed|truncated|not a shapefile/);
  });

  it('the server is still up and answers after all of the above', async () => {
    const ok = await uploadFile(planner, 'fine.zip', zipOf(layerEntries('p', files)));
    expect(ok.status).toBe(201);
    expect(ok.body.layers[0].featureCount).toBe(2);
    const gone = await fetch(`${BASE_URL}/api/uploads/${ok.body.id}`, {
      method: 'DELETE',
      headers: { cookie: planner.cookie, origin: BASE_URL },
    });
    expect(gone.status).toBe(204);
  });
});

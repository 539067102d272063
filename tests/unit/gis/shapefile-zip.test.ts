import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { GisInputError } from '~/lib/gis/errors';
import { openShapefileZip, parseShapefileZip } from '~/lib/gis/ingest/shapefile-zip';
import { layerBbox, layerToWgs84 } from '~/lib/gis/ingest/to-wgs84';
import { readGisSettings } from '~/lib/gis/settings';
import { openLayerInfo, openUpload } from '~/lib/services/upload-parse';
import { ringSignedArea2 } from '~/lib/gis/rings';
import { LIMITS, layerEntries, sampleFiles, zipOf } from './shapefile-fixtures';

/** Expects parseShapefileZip to fail with a GisInputError of `code` whose message matches. */
async function rejects(bytes: Uint8Array, code: string, message: RegExp, limits = LIMITS): Promise<void> {
  const error = await parseShapefileZip(bytes, limits).then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(GisInputError);
  expect((error as GisInputError).code).toBe(code);
  expect((error as GisInputError).message).toMatch(message);
}

function withBytes(bytes: Uint8Array, edit: (v: DataView, b: Uint8Array) => void): Uint8Array {
  const copy = bytes.slice();
  edit(new DataView(copy.buffer), copy);
  return copy;
}

describe('parseShapefileZip: well-formed input', () => {
  it('reads one layer with raw metre coordinates, .prj text, .cpg and column samples', async () => {
    const [layer] = await parseShapefileZip(zipOf(layerEntries('fields/parcels', sampleFiles())), LIMITS);
    expect(layer!.name).toBe('parcels');
    expect(layer!.path).toBe('fields/parcels');
    expect(layer!.prjWkt).toContain('UTM zone 28N');
    expect(layer!.cpg).toBe('UTF-8');
    expect(layer!.features).toHaveLength(2);
    expect(layer!.features[0]!.geometry).toEqual({
      type: 'Polygon',
      coordinates: [
        [
          [430000, 5805000],
          [430100, 5805000],
          [430100, 5805100],
          [430000, 5805100],
          [430000, 5805000],
        ],
      ],
    });
    expect(layer!.features[1]!.properties).toEqual({
      field_ref: 'T-2',
      name: 'Søvrinholt',
      stated_ha: 0.96,
      last_till: null,
    });
    expect(layer!.columns.map((c) => [c.name, c.kind])).toEqual([
      ['field_ref', 'text'],
      ['name', 'text'],
      ['stated_ha', 'number'],
      ['last_till', 'date'],
    ]);
    expect(layer!.columns[3]!.samples).toEqual(['2019-03-04']);
  });

  it('keeps the pond as a hole, wound per RFC 7946 (outer anticlockwise, hole clockwise)', async () => {
    const [layer] = await parseShapefileZip(zipOf(layerEntries('p', sampleFiles())), LIMITS);
    const rings = (layer!.features[1]!.geometry as { coordinates: number[][][] }).coordinates;
    expect(rings).toHaveLength(2);
    expect(ringSignedArea2(rings[0]!)).toBeCloseTo(2 * 100 * 100, 6); // anticlockwise: positive
    expect(ringSignedArea2(rings[1]!)).toBeCloseTo(-2 * 20 * 20, 6); // clockwise hole: negative
  });

  it('reads several layers from one zip, sorted by path', async () => {
    const entries = [
      ...layerEntries('b_second', sampleFiles()),
      ...layerEntries('a_first', sampleFiles({ prj: null })),
    ];
    const layers = await parseShapefileZip(zipOf(entries), LIMITS);
    expect(layers.map((l) => [l.name, l.prjWkt === null])).toEqual([
      ['a_first', true],
      ['b_second', false],
    ]);
  });

  it('falls back to windows-1252 when there is no .cpg and the DBF is not UTF-8', async () => {
    const files = sampleFiles({ encoding: 'windows-1252', names: ['Müller Acre', 'Émbrenlea'] });
    const [layer] = await parseShapefileZip(zipOf(layerEntries('p', files, { cpg: null })), LIMITS);
    expect(layer!.encoding).toBe('windows-1252');
    expect(layer!.features.map((f) => f.properties.name)).toEqual(['Müller Acre', 'Émbrenlea']);
  });

  it('honours a .cpg naming a code page ("1252")', async () => {
    const files = sampleFiles({ encoding: 'windows-1252', names: ['Ødegård', 'Ça va'] });
    const [layer] = await parseShapefileZip(zipOf(layerEntries('p', files)), LIMITS); // writer's .cpg says "1252"
    expect(layer!.cpg).toBe('1252');
    expect(layer!.features[0]!.properties.name).toBe('Ødegård');
  });

  it('reads the committed demo zip: 303 features in EPSG:32628', async () => {
    const bytes = new Uint8Array(
      readFileSync(new URL('../../../gis/demo/corrowmere-parcels-utm28n.zip', import.meta.url)),
    );
    const [layer] = await parseShapefileZip(bytes, { maxUncompressedBytes: 50_000_000, maxEntries: 100 });
    expect(layer!.features).toHaveLength(303);
    expect(layer!.prjWkt).toMatch(/AUTHORITY\["EPSG","32628"\]\]$/);
  });
});

describe('openShapefileZip: the features read a slice at a time', () => {
  const demo = () =>
    new Uint8Array(readFileSync(new URL('../../../gis/demo/corrowmere-parcels-utm28n.zip', import.meta.url)));
  const limits = { maxUncompressedBytes: 50_000_000, maxEntries: 100 };

  it('gives, slice by slice, the same features as shpjs reading the whole file', async () => {
    const [whole] = await parseShapefileZip(demo(), limits);
    const [open] = await openShapefileZip(demo(), limits);
    expect(open!.featureCount).toBe(303);
    const sliced = [0, 100, 200, 300].flatMap((at) => open!.readFeatures(at, at + 100));
    expect(sliced).toEqual(whole!.features);
    expect(open!.readFeatures(303, 400)).toEqual([]);
  });

  it('finds the extent from the .shp records and the samples from the .dbf rows, as from the parsed shapes', async () => {
    const [whole] = await parseShapefileZip(demo(), limits);
    const [open] = await openUpload(demo(), 'shapefile-zip', 'demo.zip', readGisSettings([]));
    const info = openLayerInfo(open!);
    expect(info.bbox).toEqual(layerBbox(whole!.features));
    expect(info.columns).toEqual(whole!.columns);
    // The same without the short cut: slices of built shapes.
    expect(openLayerInfo({ ...open!, quickInfo: undefined })).toEqual(info);
  });
});

describe('parseShapefileZip: hostile and broken files', () => {
  const good = sampleFiles();

  it('rejects bytes that are not a zip (wrong magic bytes)', async () => {
    await rejects(
      new TextEncoder().encode('{"type":"FeatureCollection","features":[]}'),
      'not-a-zip',
      /not a zip archive \(wrong magic bytes/,
    );
  });

  it('rejects a path-traversal entry name', async () => {
    const entries = layerEntries('../../etc/parcels', good);
    await rejects(zipOf(entries), 'unsafe-entry-name', /unsafe entry name "\.\.\/\.\.\/etc\/parcels\.shp"/);
  });

  it('rejects an absolute entry name', async () => {
    await rejects(
      zipOf(layerEntries('/tmp/parcels', good)),
      'unsafe-entry-name',
      /unsafe entry name "\/tmp\/parcels\.shp"/,
    );
  });

  it('rejects more entries than allowed', async () => {
    const many = Array.from({ length: 25 }, (_, i) => ({ name: `note-${i}.txt`, data: new Uint8Array([65]) }));
    await rejects(
      zipOf([...layerEntries('p', good), ...many], false),
      'too-many-entries',
      /holds 30 entries; at most 20 are allowed/,
    );
  });

  it('stops inflating a zip bomb at the cap, quickly', async () => {
    const zeros = new Uint8Array(64 * 1024 * 1024); // 64 MiB of zeros deflates to ~64 KB
    const bomb = zipOf([...layerEntries('p', good, { dbf: zeros })]);
    expect(bomb.length).toBeLessThan(200_000);
    const started = performance.now();
    await rejects(
      bomb,
      'uncompressed-too-large',
      /expands to more than the allowed 5000000 bytes \(stopped at "p\.dbf"\); it may be a zip bomb/,
    );
    expect(performance.now() - started).toBeLessThan(3_000);
  });

  it('counts stored (uncompressed) entries against the same cap', async () => {
    await rejects(zipOf(layerEntries('p', good), false), 'uncompressed-too-large', /allowed 300 bytes/, {
      maxUncompressedBytes: 300,
      maxEntries: 10,
    });
  });

  it('rejects damaged compressed data', async () => {
    const zip = zipOf(layerEntries('p', good));
    const broken = withBytes(zip, (_, b) => b.fill(0xff, 40, 90)); // inside p.shp's deflate stream
    await rejects(broken, 'corrupt-zip', /"p\.shp" .*damaged/);
  });

  it('rejects a zip without any .shp, listing what it found', async () => {
    await rejects(
      zipOf(layerEntries('parcels', good, { shp: null })),
      'no-shapefile',
      /contains no \.shp file \(found only parcels\.\*\)/,
    );
  });

  it('rejects a layer without .dbf or .shx', async () => {
    await rejects(zipOf(layerEntries('p', good, { dbf: null })), 'missing-part', /"p" has no p\.dbf attribute table/);
    await rejects(zipOf(layerEntries('p', good, { shx: null })), 'missing-part', /"p" has no p\.shx index/);
  });

  it('rejects a truncated .shp', async () => {
    await rejects(
      zipOf(layerEntries('p', good, { shp: good.shp.subarray(0, good.shp.length - 50) })),
      'bad-shp',
      /p\.shp is truncated: the header declares \d+ bytes but only \d+ are present/,
    );
  });

  it('rejects a .shp with wrong magic bytes', async () => {
    const shp = withBytes(good.shp, (v) => v.setInt32(0, 1234, false));
    await rejects(
      zipOf(layerEntries('p', good, { shp })),
      'bad-shp',
      /p\.shp is not a shapefile component \(wrong magic bytes/,
    );
  });

  it('rejects a .shp record whose part count does not fit its bytes', async () => {
    const shp = withBytes(good.shp, (v) => v.setInt32(100 + 8 + 40, 1_000_000, true)); // numPoints of record 1
    await rejects(zipOf(layerEntries('p', good, { shp })), 'bad-shp', /record 1 declares 1 parts and 1000000 points/);
  });

  it('rejects a truncated .shx and an .shx that disagrees with the .shp', async () => {
    await rejects(zipOf(layerEntries('p', good, { shx: good.shx.subarray(0, 104) })), 'bad-shx', /p\.shx is truncated/);
    const shx = withBytes(good.shx, (v) => v.setInt32(100, 77, false));
    await rejects(
      zipOf(layerEntries('p', good, { shx })),
      'inconsistent-parts',
      /p\.shx entry 1 does not match record 1/,
    );
  });

  it('rejects a truncated .dbf', async () => {
    await rejects(
      zipOf(layerEntries('p', good, { dbf: good.dbf.subarray(0, good.dbf.length - 30) })),
      'bad-dbf',
      /p\.dbf is truncated or its header is corrupt: it declares 2 records/,
    );
  });

  it('rejects a corrupt .dbf header with a huge record count, without reading records', async () => {
    const dbf = withBytes(good.dbf, (v) => v.setUint32(4, 2 ** 31, true));
    const started = performance.now();
    await rejects(zipOf(layerEntries('p', good, { dbf })), 'bad-dbf', /declares 2147483648 records/);
    expect(performance.now() - started).toBeLessThan(1_000);
  });

  it('rejects a .dbf with wrong magic bytes', async () => {
    const dbf = withBytes(good.dbf, (_, b) => (b[0] = 0x99));
    await rejects(
      zipOf(layerEntries('p', good, { dbf })),
      'bad-dbf',
      /not a dBase table \(wrong magic bytes: version byte 0x99\)/,
    );
  });

  it('rejects a .dbf whose row count differs from the shape count', async () => {
    const one = sampleFiles();
    const dbf = withBytes(one.dbf, (v) => v.setUint32(4, 1, true));
    await rejects(
      zipOf(layerEntries('p', good, { dbf })),
      'inconsistent-parts',
      /p\.shp holds 2 shapes but p\.dbf holds 1 rows/,
    );
  });

  it('rejects a .cpg naming an unknown encoding', async () => {
    const cpg = new TextEncoder().encode('KLINGON-7');
    await rejects(
      zipOf(layerEntries('p', good, { cpg })),
      'unreadable-encoding',
      /names the encoding "KLINGON-7", which cannot be read/,
    );
  });

  it('rejects a DBF declared UTF-8 whose bytes are not UTF-8', async () => {
    const latin = sampleFiles({ encoding: 'windows-1252', names: ['Müller', 'Ærø'] });
    const cpg = new TextEncoder().encode('UTF-8');
    await rejects(
      zipOf(layerEntries('p', latin, { cpg })),
      'unreadable-encoding',
      /p\.dbf is declared UTF-8 by its \.cpg but contains bytes that are not valid UTF-8/,
    );
  });
});

describe('layerToWgs84', () => {
  it('refuses a layer with no .prj whose coordinates are metres, asking for a CRS', async () => {
    const [layer] = await parseShapefileZip(zipOf(layerEntries('parcels', sampleFiles({ prj: null }))), LIMITS);
    expect(() => layerToWgs84(layer!.features, null, layer!.name)).toThrow(
      /Layer "parcels" has no \.prj and its coordinates \(x 430000 to 430300, y 5805000 to 5805100\) are not longitude\/latitude degrees; choose its coordinate reference system by EPSG code\./,
    );
  });

  it('keeps degree coordinates when there is no .prj', () => {
    const features = [{ geometry: { type: 'Point' as const, coordinates: [-16, 52] }, properties: {} }];
    expect(layerToWgs84(features, null, 'x')).toBe(features);
  });
});

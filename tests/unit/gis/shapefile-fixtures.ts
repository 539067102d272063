import { deflateRawSync } from 'node:zlib';
import type { Polygon } from 'geojson';
import { writePolygonShapefile, type ShapefileFiles } from '~/lib/gis/export/shapefile-writer';
import type { DbfFieldSpec, DbfTextEncoding } from '~/lib/gis/export/dbf-writer';
import { createZip, type ZipEntryInput } from '~/lib/gis/export/zip-writer';

/** Tiny hand-made shapefiles for the ingest tests (generated here so every byte is explained). */
export const FIELDS: DbfFieldSpec[] = [
  { name: 'field_ref', type: 'C', length: 12 },
  { name: 'name', type: 'C', length: 24 },
  { name: 'stated_ha', type: 'N', length: 10, decimals: 2 },
  { name: 'last_till', type: 'D', length: 8 },
];

/** A 100 m × 100 m field in UTM metres, and a second one with a 20 m pond. */
export function squareM(e: number, n: number, side = 100): Polygon {
  return {
    type: 'Polygon',
    coordinates: [
      [
        [e, n],
        [e + side, n],
        [e + side, n + side],
        [e, n + side],
        [e, n],
      ],
    ],
  };
}

export const UTM28_WKT =
  'PROJCS["WGS 84 / UTM zone 28N",GEOGCS["WGS 84",DATUM["WGS_1984",SPHEROID["WGS 84",6378137,298.257223563]],' +
  'PRIMEM["Greenwich",0],UNIT["degree",0.0174532925199433]],PROJECTION["Transverse_Mercator"],' +
  'PARAMETER["latitude_of_origin",0],PARAMETER["central_meridian",-15],PARAMETER["scale_factor",0.9996],' +
  'PARAMETER["false_easting",500000],PARAMETER["false_northing",0],UNIT["metre",1],AUTHORITY["EPSG","32628"]]';

export function sampleFiles(
  options: { names?: string[]; encoding?: DbfTextEncoding; prj?: string | null } = {},
): ShapefileFiles {
  const names = options.names ?? ['Émbrenlea', 'Søvrinholt'];
  const pond: Polygon = {
    type: 'Polygon',
    coordinates: [
      squareM(430200, 5805000).coordinates[0]!,
      [
        [430240, 5805040],
        [430240, 5805060],
        [430260, 5805060],
        [430260, 5805040],
        [430240, 5805040],
      ],
    ],
  };
  return writePolygonShapefile(
    [
      {
        geometry: squareM(430000, 5805000),
        properties: { field_ref: 'T-1', name: names[0]!, stated_ha: 1, last_till: '2019-03-04' },
      },
      { geometry: pond, properties: { field_ref: 'T-2', name: names[1]!, stated_ha: 0.96, last_till: null } },
    ],
    { fields: FIELDS, prjWkt: options.prj === undefined ? UTM28_WKT : options.prj, encoding: options.encoding },
  );
}

/** Zip entries for one layer; pass `null` to leave a part out, or bytes to replace it. */
export function layerEntries(
  layer: string,
  files: ShapefileFiles,
  override: Partial<Record<keyof ShapefileFiles, Uint8Array | null>> = {},
): ZipEntryInput[] {
  const parts: (keyof ShapefileFiles)[] = ['shp', 'shx', 'dbf', 'prj', 'cpg'];
  const out: ZipEntryInput[] = [];
  for (const part of parts) {
    const data = part in override ? override[part] : files[part];
    if (data) out.push({ name: `${layer}.${part}`, data });
  }
  return out;
}

export function zipOf(entries: ZipEntryInput[], deflate = true): Uint8Array {
  return createZip(entries, deflate ? { deflateRaw: (b) => deflateRawSync(b) } : {});
}

export const LIMITS = { maxUncompressedBytes: 5_000_000, maxEntries: 20 };

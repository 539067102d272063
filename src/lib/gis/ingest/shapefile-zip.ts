import { parseShp } from 'shpjs';
import type { Geometry } from 'geojson';
import { GisInputError } from '../errors';
import { rewindGeometry } from '../rings';
import type { ColumnInfo, RawFeature } from '../types';
import { readDbfHeader, readDbfRecords, type DbfField } from './dbf-reader';
import { resolveDbfEncoding } from './encoding';
import { checkShp, checkShx, type ShpSummary } from './shp-header';
import { readZipEntries, type ZipLimits } from './zip-reader';

export type { ZipLimits } from './zip-reader';

/** One layer (one .shp with its sidecar files) of an uploaded zip. Coordinates are RAW, in the source CRS. */
export interface ShapefileLayer {
  /** File name without folder or extension, e.g. "parcels". */
  name: string;
  /** Path inside the zip without extension, e.g. "export/parcels". */
  path: string;
  /** Text of the .prj (WKT), or null when the zip has none. */
  prjWkt: string | null;
  /** Text of the .cpg, or null when the zip has none. */
  cpg: string | null;
  /** TextDecoder encoding actually used for the .dbf. */
  encoding: string;
  /** ESRI shape type name, e.g. "Polygon". */
  shapeType: string;
  features: RawFeature[];
  columns: ColumnInfo[];
}

/**
 * A layer opened without reading its features: they are read `readFeatures(from, to)` at a time, so a
 * large file never has all its geometries in the heap at once.
 */
export interface OpenShapefileLayer extends Omit<ShapefileLayer, 'features' | 'columns'> {
  featureCount: number;
  fields: DbfField[];
  readFeatures(from: number, to: number): RawFeature[];
}

const PARTS = ['shp', 'shx', 'dbf', 'prj', 'cpg'] as const;
type Part = (typeof PARTS)[number];
const SAMPLE_COUNT = 5;

function splitName(name: string): { stem: string; ext: string } | null {
  const base = name.split('/').pop() ?? '';
  if (name.includes('__MACOSX/') || base.startsWith('._')) return null; // macOS resource forks
  const dot = name.lastIndexOf('.');
  if (dot <= name.lastIndexOf('/')) return null;
  return { stem: name.slice(0, dot), ext: name.slice(dot + 1).toLowerCase() };
}

function isPart(ext: string): ext is Part {
  return (PARTS as readonly string[]).includes(ext);
}

/**
 * Reads a zipped shapefile held in memory (one or several layers) with hostile-file guards:
 * zip magic, entry count, path traversal, capped inflation, .shp/.shx/.dbf header and
 * consistency checks BEFORE shpjs sees any bytes, and encoding via .cpg (no .cpg and not
 * UTF-8 → windows-1252). Throws GisInputError with a message naming the file and problem.
 */
export async function parseShapefileZip(bytes: Uint8Array, limits: ZipLimits): Promise<ShapefileLayer[]> {
  return (await openShapefileZip(bytes, limits)).map((layer) => {
    const { featureCount, fields, readFeatures, ...rest } = layer;
    const features = readFeatures(0, featureCount);
    return { ...rest, features, columns: describeColumns(fields, features) };
  });
}

/** The same checks as parseShapefileZip, but each layer's features are read when asked for (OpenShapefileLayer). */
export async function openShapefileZip(bytes: Uint8Array, limits: ZipLimits): Promise<OpenShapefileLayer[]> {
  const entries = await readZipEntries(bytes, limits, (name) => {
    const parts = splitName(name);
    return parts !== null && isPart(parts.ext);
  });
  const groups = new Map<string, Partial<Record<Part, Uint8Array>>>();
  for (const [name, data] of entries) {
    const parts = splitName(name);
    if (!parts || !isPart(parts.ext)) continue;
    const group = groups.get(parts.stem) ?? {};
    group[parts.ext] = data;
    groups.set(parts.stem, group);
  }
  const stems = [...groups.keys()].filter((stem) => groups.get(stem)?.shp).sort();
  if (stems.length === 0) {
    const found = [...groups.keys()].map((s) => `${s}.*`).join(', ');
    throw new GisInputError('no-shapefile', `The zip contains no .shp file${found ? ` (found only ${found})` : ''}.`);
  }
  return stems.map((stem) => parseLayer(stem, groups.get(stem)!));
}

function parseLayer(path: string, files: Partial<Record<Part, Uint8Array>>): OpenShapefileLayer {
  const name = path.split('/').pop() ?? path;
  const shp = files.shp!;
  if (!files.dbf)
    throw new GisInputError(
      'missing-part',
      `Layer "${name}" has no ${name}.dbf attribute table; a shapefile needs .shp, .shx and .dbf.`,
    );
  if (!files.shx)
    throw new GisInputError(
      'missing-part',
      `Layer "${name}" has no ${name}.shx index; a shapefile needs .shp, .shx and .dbf.`,
    );
  const summary = checkShp(shp, `${name}.shp`);
  checkShx(files.shx, `${name}.shx`, summary);
  const header = readDbfHeader(files.dbf, `${name}.dbf`);
  if (header.records !== summary.recordOffsets.length) {
    throw new GisInputError(
      'inconsistent-parts',
      `Layer "${name}": ${name}.shp holds ${summary.recordOffsets.length} shapes but ${name}.dbf holds ${header.records} rows; they must match.`,
    );
  }
  const cpg = files.cpg ? new TextDecoder().decode(files.cpg).trim() : null;
  const recordBytes = files.dbf.subarray(
    header.headerLength,
    header.headerLength + header.records * header.recordLength,
  );
  const encoding = resolveDbfEncoding(cpg, recordBytes, `${name}.dbf`);
  const dbf = files.dbf;
  const count = header.records;
  if (count === 0) throw new GisInputError('no-features', `Layer "${name}" contains no features.`);
  const readFeatures = (from: number, to: number): RawFeature[] => {
    const end = Math.min(to, count);
    if (from >= end) return [];
    const rows = readDbfRecords(dbf, header, encoding, from, end);
    const geometries = readShapes(shp, name, summary, from, end);
    if (geometries.length !== rows.length) {
      throw new GisInputError(
        'bad-shp',
        `Layer "${name}": only ${from + geometries.length} of ${count} shapes in ${name}.shp could be read.`,
      );
    }
    // Shapefile outer rings are clockwise by format; convert to RFC 7946 winding here (not a repair).
    return geometries.map((geometry, i) => ({ geometry: rewindGeometry(geometry), properties: rows[i]! }));
  };
  return {
    name,
    path,
    prjWkt: files.prj ? new TextDecoder().decode(files.prj).trim() || null : null,
    cpg,
    encoding,
    shapeType: summary.shapeTypeName,
    featureCount: count,
    fields: header.fields,
    readFeatures,
  };
}

/** The shapes of records [from, to): the header and just those records go to shpjs (checkShp walked them all). */
function readShapes(shp: Uint8Array, name: string, summary: ShpSummary, from: number, to: number): (Geometry | null)[] {
  const offsets = summary.recordOffsets;
  const start = offsets[from]!;
  const stop = to < offsets.length ? offsets[to]! : offsets[to - 1]! + 8 + summary.recordLengths[to - 1]!;
  const part = new Uint8Array(100 + stop - start);
  part.set(shp.subarray(0, 100));
  part.set(shp.subarray(start, stop), 100);
  const dv = new DataView(part.buffer);
  dv.setInt32(24, part.byteLength / 2, false); // the part's own length, in 16-bit words
  try {
    return parseShp(dv);
  } catch (error) {
    throw new GisInputError('bad-shp', `${name}.shp could not be read: ${(error as Error).message}.`, { cause: error });
  }
}

function kindOf(type: string): ColumnInfo['kind'] {
  if (type === 'N' || type === 'F') return 'number';
  if (type === 'D') return 'date';
  if (type === 'L') return 'boolean';
  return 'text';
}

/** Column list with up to 5 distinct sample values each, for the attribute-mapping step. */
export function describeColumns(fields: DbfField[], features: RawFeature[]): ColumnInfo[] {
  return fields.map((field) => {
    const samples = new Set<string>();
    for (const feature of features) {
      const value = feature.properties[field.name];
      if (value !== null && value !== undefined && value !== '') samples.add(String(value));
      if (samples.size >= SAMPLE_COUNT) break;
    }
    return { name: field.name, kind: kindOf(field.type), samples: [...samples] };
  });
}

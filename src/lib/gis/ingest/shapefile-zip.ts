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
  /** Attribute rows [from, to) without their shapes. */
  readRows(from: number, to: number): RawFeature['properties'][];
  /** Extent of every shape's points, read from the .shp records without building geometries. */
  extent(): [number, number, number, number] | null;
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
    readRows: (from, to) => readDbfRecords(dbf, header, encoding, from, Math.min(to, count)),
    extent: () => shpExtent(shp, summary),
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

/**
 * The extent of the points of every record (null shapes and records without points left out), read from
 * the .shp bytes: the same box as bboxOf over the parsed shapes, without building them. Layout per the
 * ESRI Shapefile Technical Description: points (x, y little-endian doubles) at content + 4 for points,
 * after numPoints at + 40 for multipoints, after the part indexes at + 44 + 4 × numParts for multipart shapes.
 */
function shpExtent(shp: Uint8Array, summary: ShpSummary): [number, number, number, number] | null {
  const dv = new DataView(shp.buffer, shp.byteOffset, shp.byteLength);
  let box: [number, number, number, number] | null = null;
  for (const offset of summary.recordOffsets) {
    const c = offset + 8;
    const type = dv.getInt32(c, true);
    if (type === 0) continue;
    const kind = type % 10;
    let at: number;
    let points: number;
    if (kind === 1) [at, points] = [c + 4, 1];
    else if (kind === 8) [at, points] = [c + 40, dv.getInt32(c + 36, true)];
    else {
      const parts = dv.getInt32(c + 36, true);
      if (parts === 0) continue; // shpjs reads such a shape as null
      [at, points] = [c + 44 + 4 * parts, dv.getInt32(c + 40, true)];
    }
    const r: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity];
    for (let i = 0; i < points; i++, at += 16) {
      const x = dv.getFloat64(at, true);
      const y = dv.getFloat64(at + 8, true);
      r[0] = Math.min(r[0], x);
      r[1] = Math.min(r[1], y);
      r[2] = Math.max(r[2], x);
      r[3] = Math.max(r[3], y);
    }
    if (!Number.isFinite(r[0])) continue;
    box = box ? [Math.min(box[0], r[0]), Math.min(box[1], r[1]), Math.max(box[2], r[2]), Math.max(box[3], r[3])] : r;
  }
  return box;
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

import type { MultiPolygon, Polygon } from 'geojson';
import type { AttributeValue } from '../types';
import { ringSignedArea2, type Ring } from '../rings';
import { writeDbf, type DbfFieldSpec, type DbfTextEncoding } from './dbf-writer';

/**
 * Writes polygon shapefiles (shape type 5) as bytes: .shp, .shx, .dbf, plus .cpg and
 * optional .prj text. Pure: features → file bytes. Coordinates are written as given (in the
 * target CRS). Layout per the ESRI Shapefile Technical Description (July 1998); outer rings
 * are written clockwise and holes counter-clockwise, as that document requires.
 */
export interface ShapefileWriteFeature {
  /** Polygon or MultiPolygon in the target CRS, or null for a null shape. */
  geometry: Polygon | MultiPolygon | null;
  properties: Record<string, AttributeValue>;
}

export interface ShapefileWriteOptions {
  fields: DbfFieldSpec[];
  /** WKT for the .prj, or null to omit the .prj. */
  prjWkt: string | null;
  /** DBF text encoding; the .cpg states it. Default UTF-8. */
  encoding?: DbfTextEncoding;
}

export interface ShapefileFiles {
  shp: Uint8Array;
  shx: Uint8Array;
  dbf: Uint8Array;
  cpg: Uint8Array;
  prj: Uint8Array | null;
}

const POLYGON = 5;
const HEADER_BYTES = 100;

function partsOf(geometry: Polygon | MultiPolygon): Ring[] {
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  // Shapefile winding: exterior clockwise (negative shoelace), holes counter-clockwise.
  return polygons.flatMap((rings) =>
    rings.map((ring, i) => (ringSignedArea2(ring) < 0 === (i === 0) ? ring : [...ring].reverse())),
  );
}

function recordContent(geometry: Polygon | MultiPolygon | null): Uint8Array {
  if (geometry === null) {
    return new Uint8Array(4); // shape type 0 (null shape)
  }
  const parts = partsOf(geometry);
  const points = parts.flat();
  const out = new Uint8Array(44 + 4 * parts.length + 16 * points.length);
  const v = new DataView(out.buffer);
  v.setInt32(0, POLYGON, true);
  const box = boxOf(points);
  box.forEach((n, i) => v.setFloat64(4 + 8 * i, n, true));
  v.setInt32(36, parts.length, true);
  v.setInt32(40, points.length, true);
  let start = 0;
  parts.forEach((ring, i) => {
    v.setInt32(44 + 4 * i, start, true);
    start += ring.length;
  });
  let at = 44 + 4 * parts.length;
  for (const p of points) {
    v.setFloat64(at, p[0]!, true);
    v.setFloat64(at + 8, p[1]!, true);
    at += 16;
  }
  return out;
}

function boxOf(points: number[][]): [number, number, number, number] {
  if (points.length === 0) return [0, 0, 0, 0];
  const box: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity];
  for (const p of points) {
    box[0] = Math.min(box[0], p[0]!);
    box[1] = Math.min(box[1], p[1]!);
    box[2] = Math.max(box[2], p[0]!);
    box[3] = Math.max(box[3], p[1]!);
  }
  return box;
}

function writeMainHeader(v: DataView, lengthBytes: number, box: [number, number, number, number]): void {
  v.setInt32(0, 9994, false);
  v.setInt32(24, lengthBytes / 2, false);
  v.setInt32(28, 1000, true);
  v.setInt32(32, POLYGON, true);
  box.forEach((n, i) => v.setFloat64(36 + 8 * i, n, true));
}

export function writePolygonShapefile(
  features: ShapefileWriteFeature[],
  options: ShapefileWriteOptions,
): ShapefileFiles {
  const contents = features.map((f) => recordContent(f.geometry));
  const shpLength = HEADER_BYTES + contents.reduce((s, c) => s + 8 + c.length, 0);
  const shp = new Uint8Array(shpLength);
  const shx = new Uint8Array(HEADER_BYTES + 8 * contents.length);
  const sv = new DataView(shp.buffer);
  const xv = new DataView(shx.buffer);
  const allPoints = features.flatMap((f) => (f.geometry ? partsOf(f.geometry).flat() : []));
  const box = boxOf(allPoints);
  writeMainHeader(sv, shp.length, box);
  writeMainHeader(xv, shx.length, box);
  let at = HEADER_BYTES;
  contents.forEach((content, i) => {
    sv.setInt32(at, i + 1, false);
    sv.setInt32(at + 4, content.length / 2, false);
    shp.set(content, at + 8);
    xv.setInt32(HEADER_BYTES + 8 * i, at / 2, false);
    xv.setInt32(HEADER_BYTES + 8 * i + 4, content.length / 2, false);
    at += 8 + content.length;
  });
  const encoding = options.encoding ?? 'utf-8';
  return {
    shp,
    shx,
    dbf: writeDbf(
      options.fields,
      features.map((f) => f.properties),
      encoding,
    ),
    cpg: new TextEncoder().encode(encoding === 'utf-8' ? 'UTF-8' : '1252'),
    prj: options.prjWkt === null ? null : new TextEncoder().encode(options.prjWkt),
  };
}

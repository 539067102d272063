import { z } from 'zod';
import type { Geometry } from 'geojson';
import { GisInputError } from '../errors';
import type { AttributeValue, ColumnInfo, RawFeature } from '../types';

/**
 * Parses GeoJSON text (RFC 7946): a FeatureCollection, a Feature or a bare geometry.
 * Coordinates are WGS 84 lon/lat per RFC 7946 §4; a legacy (2008 spec) "crs" member naming
 * an EPSG code is honoured and reported so the caller can reproject.
 */
const position = z
  .array(z.number().refine(Number.isFinite, 'must be a finite number'))
  .min(2, 'a position needs at least x and y');
const ring = z.array(position);

const simpleGeometry = z.discriminatedUnion('type', [
  z.object({ type: z.literal('Point'), coordinates: position }),
  z.object({ type: z.literal('MultiPoint'), coordinates: z.array(position) }),
  z.object({ type: z.literal('LineString'), coordinates: z.array(position) }),
  z.object({ type: z.literal('MultiLineString'), coordinates: z.array(z.array(position)) }),
  z.object({ type: z.literal('Polygon'), coordinates: z.array(ring) }),
  z.object({ type: z.literal('MultiPolygon'), coordinates: z.array(z.array(ring)) }),
]);
const geometry = z.union([
  simpleGeometry,
  z.object({ type: z.literal('GeometryCollection'), geometries: z.array(simpleGeometry) }),
]);
const legacyCrs = z.object({ type: z.string(), properties: z.object({ name: z.string().optional() }).loose() }).loose();
const feature = z.object({
  type: z.literal('Feature'),
  geometry: geometry.nullable(),
  properties: z.record(z.string(), z.unknown()).nullable().optional(),
});
const document = z.union([
  z.object({ type: z.literal('FeatureCollection'), features: z.array(feature), crs: legacyCrs.optional() }),
  feature.extend({ crs: legacyCrs.optional() }),
  geometry,
]);

export interface GeoJsonLayer {
  /** EPSG code of the coordinates: 4326 unless a legacy "crs" member says otherwise. */
  epsg: number;
  features: RawFeature[];
  columns: ColumnInfo[];
}

/** Default size limit for GeoJSON text, bytes (a setting of the upload route). */
export const DEFAULT_GEOJSON_MAX_BYTES = 50 * 1024 * 1024;

/** EPSG code from a legacy crs name: "EPSG:27700", "urn:ogc:def:crs:EPSG::27700", or OGC CRS84 → 4326. */
export function epsgFromLegacyCrsName(name: string): number | null {
  if (/urn:ogc:def:crs:OGC:(?:1\.3:)?CRS84$/i.test(name)) return 4326;
  const m = /EPSG:{1,2}(?:[\d.]*:)?(\d+)$/i.exec(name.trim());
  return m ? Number(m[1]) : null;
}

function toAttribute(value: unknown): AttributeValue {
  if (value === null || value === undefined) return null;
  if (typeof value === 'string' || typeof value === 'boolean') return value;
  if (typeof value === 'number') return Number.isFinite(value) ? value : null;
  return JSON.stringify(value);
}

export function parseGeoJson(text: string, maxBytes: number = DEFAULT_GEOJSON_MAX_BYTES): GeoJsonLayer {
  const bytes = new TextEncoder().encode(text).length;
  if (bytes > maxBytes)
    throw new GisInputError('file-too-large', `The GeoJSON is ${bytes} bytes; at most ${maxBytes} are allowed.`);
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    throw new GisInputError('bad-geojson', `The file is not valid JSON: ${(error as Error).message}`, { cause: error });
  }
  const parsed = document.safeParse(json);
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    const where = issue.path.length ? ` at ${issue.path.join('.')}` : '';
    throw new GisInputError('bad-geojson', `The file is not GeoJSON (RFC 7946)${where}: ${issue.message}.`);
  }
  const doc = parsed.data;
  const rawFeatures =
    doc.type === 'FeatureCollection'
      ? doc.features
      : doc.type === 'Feature'
        ? [doc]
        : [{ type: 'Feature' as const, geometry: doc, properties: {} }];
  const crsName = 'crs' in doc && doc.crs ? doc.crs.properties.name : undefined;
  const epsg = crsName ? epsgFromLegacyCrsName(String(crsName)) : 4326;
  if (epsg === null)
    throw new GisInputError('unknown-crs', `The GeoJSON "crs" member "${String(crsName)}" does not name an EPSG code.`);
  if (rawFeatures.length === 0) throw new GisInputError('no-features', 'The GeoJSON contains no features.');
  const features: RawFeature[] = rawFeatures.map((f) => ({
    geometry: f.geometry as Geometry | null,
    properties: Object.fromEntries(Object.entries(f.properties ?? {}).map(([k, v]) => [k, toAttribute(v)])),
  }));
  return { epsg, features, columns: describeProperties(features) };
}

/** Columns (union of property names in first-seen order) with kinds and up to 5 samples. */
export function describeProperties(features: RawFeature[]): ColumnInfo[] {
  const columns = new Map<string, { kinds: Set<string>; samples: Set<string> }>();
  for (const f of features) {
    for (const [name, value] of Object.entries(f.properties)) {
      const c = columns.get(name) ?? { kinds: new Set<string>(), samples: new Set<string>() };
      if (value !== null && value !== '') {
        c.kinds.add(typeof value === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(value) ? 'date' : typeof value);
        if (c.samples.size < 5) c.samples.add(String(value));
      }
      columns.set(name, c);
    }
  }
  return [...columns].map(([name, c]) => {
    const only = c.kinds.size === 1 ? [...c.kinds][0] : 'string';
    const kind: ColumnInfo['kind'] =
      only === 'number' ? 'number' : only === 'boolean' ? 'boolean' : only === 'date' ? 'date' : 'text';
    return { name, kind, samples: [...c.samples] };
  });
}

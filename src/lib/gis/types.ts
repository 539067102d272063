import type { Geometry, MultiPolygon } from 'geojson';

/** A scalar attribute value as read from a DBF or GeoJSON properties object. */
export type AttributeValue = string | number | boolean | null;

/**
 * A feature as read from a source file, before reprojection or validation.
 * `geometry` is in the source CRS (metres for projected CRSs, degrees for geographic ones).
 */
export interface RawFeature {
  geometry: Geometry | null;
  properties: Record<string, AttributeValue>;
}

/** One column of an uploaded layer, with a few sample values for the attribute-mapping step. */
export interface ColumnInfo {
  /** Column name as stored (DBF names are at most 10 characters and often truncated). */
  name: string;
  kind: 'text' | 'number' | 'date' | 'boolean';
  /** Up to 5 distinct non-empty values, rendered as text. */
  samples: string[];
}

/** A polygonal geometry in EPSG:4326 (lon, lat in degrees). */
export type MultiPolygon4326 = MultiPolygon;

/**
 * Expected, user-facing failures of GIS input (uploads, pasted GeoJSON, CRS choices).
 * Callers map any GisInputError to a 4xx response and show `message` as is: every message
 * names the file or entry and the problem in plain words.
 */
export type GisInputErrorCode =
  | 'file-too-large'
  | 'not-a-zip'
  | 'corrupt-zip'
  | 'too-many-entries'
  | 'unsafe-entry-name'
  | 'uncompressed-too-large'
  | 'no-shapefile'
  | 'missing-part'
  | 'bad-shp'
  | 'bad-shx'
  | 'bad-dbf'
  | 'inconsistent-parts'
  | 'unreadable-encoding'
  | 'bad-prj'
  | 'no-features'
  | 'coordinates-not-degrees'
  | 'bad-geojson'
  | 'unknown-crs'
  | 'unknown-datum';

export class GisInputError extends Error {
  readonly code: GisInputErrorCode;

  constructor(code: GisInputErrorCode, message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'GisInputError';
    this.code = code;
  }
}

/** Type guard usable across module copies (checks the name, not only the prototype). */
export function isGisInputError(error: unknown): error is GisInputError {
  return error instanceof GisInputError || (error instanceof Error && error.name === 'GisInputError');
}

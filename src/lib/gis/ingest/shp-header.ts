import { GisInputError } from '../errors';

/**
 * Structural checks on .shp and .shx bytes, done before handing them to shpjs, so that a
 * truncated or forged file gives a clear message instead of silently losing records.
 * Layout per the ESRI Shapefile Technical Description (July 1998): 100-byte header,
 * file code 9994 (big-endian), file length in 16-bit words (big-endian), version 1000 and
 * shape type (little-endian); each record = 8-byte header (number, content length in words,
 * big-endian) + content starting with the shape type (little-endian).
 */
const FILE_CODE = 9994;
const VERSION = 1000;
const HEADER_BYTES = 100;
const SHAPE_TYPE_NAMES: Record<number, string> = {
  0: 'Null',
  1: 'Point',
  3: 'PolyLine',
  5: 'Polygon',
  8: 'MultiPoint',
  11: 'PointZ',
  13: 'PolyLineZ',
  15: 'PolygonZ',
  18: 'MultiPointZ',
  21: 'PointM',
  23: 'PolyLineM',
  25: 'PolygonM',
  28: 'MultiPointM',
};
/** Shape types whose records carry parts and points (bbox 32 B, numParts, numPoints). */
const MULTIPART_TYPES = new Set([3, 5, 13, 15, 23, 25]);

export interface ShpSummary {
  shapeType: number;
  shapeTypeName: string;
  /** Byte offset of every record header, in file order. */
  recordOffsets: number[];
  /** Content length (bytes) of every record. */
  recordLengths: number[];
}

function view(bytes: Uint8Array): DataView {
  return new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}

function checkMainHeader(
  bytes: Uint8Array,
  file: string,
  code: 'bad-shp' | 'bad-shx',
): { dv: DataView; shapeType: number } {
  if (bytes.byteLength < HEADER_BYTES) {
    throw new GisInputError(code, `${file} is truncated: ${bytes.byteLength} bytes, shorter than the 100-byte header.`);
  }
  const dv = view(bytes);
  if (dv.getInt32(0, false) !== FILE_CODE || dv.getInt32(28, true) !== VERSION) {
    throw new GisInputError(
      code,
      `${file} is not a shapefile component (wrong magic bytes: file code must be 9994, version 1000).`,
    );
  }
  const declaredBytes = dv.getInt32(24, false) * 2;
  if (declaredBytes > bytes.byteLength) {
    throw new GisInputError(
      code,
      `${file} is truncated: the header declares ${declaredBytes} bytes but only ${bytes.byteLength} are present.`,
    );
  }
  if (declaredBytes < HEADER_BYTES) {
    throw new GisInputError(code, `${file} has an impossible declared length of ${declaredBytes} bytes.`);
  }
  const shapeType = dv.getInt32(32, true);
  if (!(shapeType in SHAPE_TYPE_NAMES)) {
    throw new GisInputError(
      code,
      `${file} has unsupported shape type ${shapeType} (MultiPatch and unknown types are not accepted).`,
    );
  }
  return { dv, shapeType };
}

/** Validates a .shp file's header and walks every record header. Throws GisInputError('bad-shp'). */
export function checkShp(bytes: Uint8Array, file: string): ShpSummary {
  const { dv, shapeType } = checkMainHeader(bytes, file, 'bad-shp');
  const end = dv.getInt32(24, false) * 2;
  const recordOffsets: number[] = [];
  const recordLengths: number[] = [];
  let at = HEADER_BYTES;
  while (at < end) {
    const n = recordOffsets.length + 1;
    if (at + 12 > end) throw new GisInputError('bad-shp', `${file} is truncated inside the header of record ${n}.`);
    const length = dv.getInt32(at + 4, false) * 2;
    if (length < 4 || at + 8 + length > end) {
      throw new GisInputError(
        'bad-shp',
        `${file} is truncated or corrupt: record ${n} claims ${length} bytes beyond the end of the file.`,
      );
    }
    const recordType = dv.getInt32(at + 8, true);
    if (recordType !== 0 && recordType !== shapeType) {
      throw new GisInputError(
        'bad-shp',
        `${file} record ${n} has shape type ${recordType}, but the file declares ${shapeType}.`,
      );
    }
    if (recordType !== 0 && MULTIPART_TYPES.has(shapeType)) checkPartsFit(dv, at + 8, length, file, n);
    recordOffsets.push(at);
    recordLengths.push(length);
    at += 8 + length;
  }
  return { shapeType, shapeTypeName: SHAPE_TYPE_NAMES[shapeType] ?? String(shapeType), recordOffsets, recordLengths };
}

/** numParts and numPoints must fit inside the record content (else a reader walks off the end). */
function checkPartsFit(dv: DataView, content: number, length: number, file: string, n: number): void {
  if (length < 44) throw new GisInputError('bad-shp', `${file} record ${n} is too short for its shape type.`);
  const parts = dv.getInt32(content + 36, true);
  const points = dv.getInt32(content + 40, true);
  const needed = 44 + 4 * parts + 16 * points;
  if (parts < 0 || points < 0 || needed > length) {
    throw new GisInputError(
      'bad-shp',
      `${file} record ${n} declares ${parts} parts and ${points} points, more than its ${length} bytes can hold.`,
    );
  }
  let previous = 0;
  for (let i = 0; i < parts; i++) {
    const start = dv.getInt32(content + 44 + 4 * i, true);
    if (start < previous || start > points || (i === 0 && start !== 0)) {
      throw new GisInputError('bad-shp', `${file} record ${n} has an invalid part index ${start}.`);
    }
    previous = start;
  }
}

/**
 * Validates a .shx index against the .shp it belongs to: same header, one 8-byte entry per
 * record, each pointing at the same offset and length. Throws GisInputError('bad-shx' | 'inconsistent-parts').
 */
export function checkShx(bytes: Uint8Array, file: string, shp: ShpSummary): void {
  const { dv, shapeType } = checkMainHeader(bytes, file, 'bad-shx');
  const declared = dv.getInt32(24, false) * 2;
  if ((declared - HEADER_BYTES) % 8 !== 0)
    throw new GisInputError('bad-shx', `${file} has a length that is not 100 + 8 × records.`);
  const count = (declared - HEADER_BYTES) / 8;
  if (shapeType !== shp.shapeType || count !== shp.recordOffsets.length) {
    throw new GisInputError(
      'inconsistent-parts',
      `${file} lists ${count} records of type ${shapeType}, but the .shp holds ${shp.recordOffsets.length} of type ${shp.shapeType}.`,
    );
  }
  for (let i = 0; i < count; i++) {
    const offset = dv.getInt32(HEADER_BYTES + 8 * i, false) * 2;
    const length = dv.getInt32(HEADER_BYTES + 8 * i + 4, false) * 2;
    if (offset !== shp.recordOffsets[i] || length !== shp.recordLengths[i]) {
      throw new GisInputError(
        'inconsistent-parts',
        `${file} entry ${i + 1} does not match record ${i + 1} of the .shp (offset or length differs).`,
      );
    }
  }
}

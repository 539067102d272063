/**
 * Reading an uploaded file (zipped shapefile or GeoJSON) into layers, with the authority's
 * limits, and finding each layer's CRS. Every expected failure becomes a 4xx HttpError whose
 * message names the file part and the problem.
 */
import type { CrsDefinition } from '../gis/crs';
import { assertDatumShiftKnown, crsFromEpsg, crsFromPrj } from '../gis/crs-catalogue.server';
import { isGisInputError, type GisInputError } from '../gis/errors';
import { parseGeoJson } from '../gis/ingest/geojson';
import { describeColumns, openShapefileZip, parseShapefileZip } from '../gis/ingest/shapefile-zip';
import { layerBbox } from '../gis/ingest/to-wgs84';
import { bboxLooksLikeDegrees } from '../gis/crs';
import type { GisSettings } from '../gis/settings';
import type { ColumnInfo, RawFeature } from '../gis/types';
import { HttpError } from '../http/errors';

export type UploadFormat = 'shapefile-zip' | 'geojson';

export interface ParsedLayer {
  name: string;
  features: RawFeature[];
  columns: ColumnInfo[];
  geometryType: string;
  prjWkt: string | null;
  /** EPSG code a GeoJSON states (4326 unless a legacy "crs" member says otherwise). */
  geojsonEpsg: number | null;
}

/** A layer without its features (what crosses from the worker pool cheaply): counts, columns, CRS hints, extent. */
export type LayerInfo = Omit<ParsedLayer, 'features'> & {
  featureCount: number;
  bbox: [number, number, number, number] | null;
};

export function layerInfo(layer: ParsedLayer): LayerInfo {
  const { features, ...rest } = layer;
  return { ...rest, featureCount: features.length, bbox: layerBbox(features) };
}

/** A layer whose features are read a slice at a time (a zipped shapefile is not read whole; see openShapefileZip). */
export type OpenLayer = Omit<ParsedLayer, 'features' | 'columns'> & {
  featureCount: number;
  readFeatures(from: number, to: number): RawFeature[];
  /** The columns, or how to describe them from a slice of features (describeColumns). */
  columns:
    | ColumnInfo[]
    | ((
        features: RawFeature[],
      ) => ColumnInfo[]); /** Extent and columns with samples found without building the shapes (zipped shapefiles). */
  quickInfo?: () => { bbox: LayerInfo['bbox']; columns: ColumnInfo[] };
};

const SAMPLES = 5;

/**
 * The layer's info read `slice` features at a time: its extent and its columns' samples, never the whole file in the
 * heap. Merging each slice's first distinct samples in file order gives the file's first distinct samples.
 */
export function openLayerInfo(layer: OpenLayer, slice = 2000): LayerInfo {
  const { readFeatures, columns, quickInfo, ...rest } = layer;
  if (quickInfo) return { ...rest, ...quickInfo() };
  let bbox: LayerInfo['bbox'] = null;
  let described: ColumnInfo[] | null = typeof columns === 'function' ? null : columns;
  for (let at = 0; at < layer.featureCount; at += slice) {
    const part = readFeatures(at, at + slice);
    const b = layerBbox(part);
    if (b)
      bbox = bbox
        ? [Math.min(bbox[0], b[0]), Math.min(bbox[1], b[1]), Math.max(bbox[2], b[2]), Math.max(bbox[3], b[3])]
        : b;
    if (typeof columns === 'function') {
      const more = columns(part);
      described = described
        ? described.map((c, i) => ({
            ...c,
            samples: [...new Set([...c.samples, ...more[i]!.samples])].slice(0, SAMPLES),
          }))
        : more;
    }
  }
  return { ...rest, columns: described ?? (typeof columns === 'function' ? columns([]) : columns), bbox };
}

/** The authority's limits on a zip's unpacked size and entry count (zip bombs). */
function zipLimits(settings: GisSettings) {
  return {
    maxUncompressedBytes: settings['upload.max-uncompressed-bytes'],
    maxEntries: settings['upload.max-zip-entries'],
  };
}

/** Like parseUpload, but a zipped shapefile's features are read when asked for (OpenLayer). */
export async function openUpload(
  bytes: Uint8Array,
  format: UploadFormat,
  fileName: string,
  settings: GisSettings,
): Promise<OpenLayer[]> {
  if (format !== 'shapefile-zip')
    return (await parseUpload(bytes, format, fileName, settings)).map(({ features, ...rest }) => ({
      ...rest,
      featureCount: features.length,
      readFeatures: (from, to) => features.slice(from, to),
    }));
  try {
    const layers = await openShapefileZip(bytes, zipLimits(settings));
    return layers.map((l) => ({
      name: l.name,
      featureCount: l.featureCount,
      readFeatures: (from, to) => {
        try {
          return l.readFeatures(from, to);
        } catch (error) {
          throw isGisInputError(error) ? gisError(error) : error;
        }
      },
      columns: (part) => describeColumns(l.fields, part),
      quickInfo: () => {
        // The first shape is built (an unsupported shape type is refused here); the rest only give their points.
        try {
          l.readFeatures(0, 1);
        } catch (error) {
          throw isGisInputError(error) ? gisError(error) : error;
        }
        let columns = describeColumns(l.fields, []);
        for (let at = 0; at < l.featureCount && columns.some((c) => c.samples.length < SAMPLES); at += 2000) {
          const more = describeColumns(
            l.fields,
            l.readRows(at, at + 2000).map((properties) => ({ geometry: null, properties })),
          );
          columns = columns.map((c, i) => ({
            ...c,
            samples: [...new Set([...c.samples, ...more[i]!.samples])].slice(0, SAMPLES),
          }));
        }
        return { bbox: l.extent(), columns };
      },
      geometryType: l.shapeType,
      prjWkt: l.prjWkt,
      geojsonEpsg: null,
    }));
  } catch (error) {
    if (isGisInputError(error)) throw gisError(error);
    throw error;
  }
}

export interface LayerCrs {
  crs: CrsDefinition | null;
  source: 'prj' | 'geojson' | null;
  /** Why the planner must choose, or a hint; null when the CRS is known. */
  note: string | null;
}

const PAYLOAD = new Set(['file-too-large', 'uncompressed-too-large']);

export function gisError(error: GisInputError): HttpError {
  return new HttpError(PAYLOAD.has(error.code) ? 'PAYLOAD_TOO_LARGE' : 'UNPROCESSABLE_CONTENT', error.message, [
    { path: ['file'], message: error.code },
  ]);
}

/** Zip by magic bytes or name; GeoJSON by name or a leading "{". Anything else is refused. */
export function detectFormat(fileName: string, bytes: Uint8Array): UploadFormat {
  const lower = fileName.toLowerCase();
  if (lower.endsWith('.zip') || (bytes[0] === 0x50 && bytes[1] === 0x4b)) return 'shapefile-zip';
  let i = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  while (i < bytes.length && i < 1000 && [0x20, 0x09, 0x0a, 0x0d].includes(bytes[i]!)) i++;
  if (lower.endsWith('.geojson') || lower.endsWith('.json') || bytes[i] === 0x7b) return 'geojson';
  throw new HttpError(
    'UNSUPPORTED_MEDIA_TYPE',
    `"${fileName}" is neither a zipped shapefile (.zip) nor a GeoJSON file (.geojson); upload one of those.`,
  );
}

export async function parseUpload(
  bytes: Uint8Array,
  format: UploadFormat,
  fileName: string,
  settings: GisSettings,
): Promise<ParsedLayer[]> {
  try {
    if (format === 'shapefile-zip') {
      const layers = await parseShapefileZip(bytes, zipLimits(settings));
      return layers.map((l) => ({
        name: l.name,
        features: l.features,
        columns: l.columns,
        geometryType: l.shapeType,
        prjWkt: l.prjWkt,
        geojsonEpsg: null,
      }));
    }
    let text: string;
    try {
      text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    } catch {
      throw new HttpError(
        'UNPROCESSABLE_CONTENT',
        `"${fileName}" is not UTF-8 text; GeoJSON must be UTF-8 (RFC 7946 §1).`,
        [{ path: ['file'], message: 'unreadable-encoding' }],
      );
    }
    const layer = parseGeoJson(text.replace(/^\uFEFF/, ''), settings['upload.max-bytes']);
    const types = [...new Set(layer.features.map((f) => f.geometry?.type ?? 'null'))].join(', ');
    const name = fileName.replace(/\.(geo)?json$/i, '') || 'features';
    return [
      {
        name,
        features: layer.features,
        columns: layer.columns,
        geometryType: types,
        prjWkt: null,
        geojsonEpsg: layer.epsg,
      },
    ];
  } catch (error) {
    if (isGisInputError(error)) throw gisError(error);
    throw error;
  }
}

/** The CRS a layer declares, or null with the reason the planner must pick one. */
export async function detectLayerCrs(layer: ParsedLayer | LayerInfo): Promise<LayerCrs> {
  try {
    if (layer.geojsonEpsg !== null)
      return { crs: await assertDatumShiftKnown(await crsFromEpsg(layer.geojsonEpsg)), source: 'geojson', note: null };
    if (layer.prjWkt) return { crs: await crsFromPrj(layer.prjWkt), source: 'prj', note: null };
  } catch (error) {
    if (!isGisInputError(error)) throw error;
    return { crs: null, source: null, note: `${error.message} Choose the coordinate reference system by EPSG code.` };
  }
  const box = 'bbox' in layer ? layer.bbox : layerBbox(layer.features);
  const degrees = box !== null && bboxLooksLikeDegrees(box);
  return {
    crs: null,
    source: null,
    note: degrees
      ? 'The file has no .prj. Its coordinates look like longitude/latitude, so EPSG:4326 (WGS 84) is likely; confirm it or choose another.'
      : 'The file has no .prj and its coordinates are not longitude/latitude. Choose its coordinate reference system by EPSG code.',
  };
}

/** The CRS to use: the planner's EPSG choice, else the declared one; refuses when neither. */
export async function resolveCrs(
  layer: ParsedLayer | LayerInfo,
  epsg: number | undefined,
): Promise<{ crs: CrsDefinition; source: 'picked' | 'prj' | 'geojson' }> {
  if (epsg !== undefined) {
    try {
      return { crs: await assertDatumShiftKnown(await crsFromEpsg(epsg)), source: 'picked' };
    } catch (error) {
      if (isGisInputError(error))
        throw new HttpError('UNPROCESSABLE_CONTENT', error.message, [{ path: ['epsg'], message: error.message }]);
      throw error;
    }
  }
  const found = await detectLayerCrs(layer);
  if (!found.crs || !found.source)
    throw new HttpError('UNPROCESSABLE_CONTENT', found.note ?? 'Choose the coordinate reference system by EPSG code.', [
      { path: ['epsg'], message: 'needed' },
    ]);
  return { crs: found.crs, source: found.source };
}

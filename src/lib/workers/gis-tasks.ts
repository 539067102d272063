/**
 * The CPU-heavy steps of uploads and drawings, run in the worker pool (pool.ts) so requests keep
 * flowing meanwhile: parsing a file, reprojecting with proj4 and validating. Pure apart from the
 * parse; expected failures come back as data (errors do not cross threads as classes).
 */
import { HttpError } from '../http/errors';
import { layerInfo, parseUpload, type UploadFormat } from '../services/upload-parse';
import { STAGE_CHUNK, stagedFeatureChunks } from '../gis/staged-json';
import { reproject, type CrsDefinition } from '../gis/crs';
import { isGisInputError } from '../gis/errors';
import type { ParcelMapping, ReferenceMapping } from '../gis/field-mapping';
import { layerToWgs84 } from '../gis/ingest/to-wgs84';
import type { GisSettings } from '../gis/settings';
import { stageFeatures, type StagedFeature, type StageOptions } from '../gis/stage-features';
import type { RawFeature } from '../gis/types';
import { BroadcastChannel } from 'node:worker_threads';
import {
  seenNothing,
  validateFeatures,
  type FeatureToValidate,
  type SeenSoFar,
  type ValidationOptions,
} from '../gis/validate';

export type TaskError =
  { kind: 'gis'; code: string; message: string } | { kind: 'http'; code: string; message: string; issues?: unknown[] };
export type TaskResult<T> = { ok: true; value: T } | { ok: false; error: TaskError };

async function guarded<T>(fn: () => T | Promise<T>): Promise<TaskResult<T>> {
  try {
    return { ok: true, value: await fn() };
  } catch (error) {
    if (isGisInputError(error)) return { ok: false, error: { kind: 'gis', code: error.code, message: error.message } };
    if (error instanceof HttpError)
      return { ok: false, error: { kind: 'http', code: error.code, message: error.message, issues: error.issues } };
    throw error;
  }
}

/**
 * Reprojects, validates and serialises STAGE_CHUNK features at a time, letting go of each chunk's
 * parsed features once its JSON is written, so only the parsed file and one chunk's copies are in
 * memory at once (not a reprojected, a validated and a serialised copy of the whole file).
 */
function stageInChunks(
  features: (RawFeature | undefined)[],
  stage: (part: RawFeature[], seen: SeenSoFar, offset: number) => StagedFeature[],
  onChunk?: (done: number, total: number) => void,
): string[] {
  const seen = seenNothing();
  const out: string[] = [];
  for (let at = 0; at < features.length; at += STAGE_CHUNK) {
    const part = features.slice(at, at + STAGE_CHUNK) as RawFeature[];
    out.push(...stagedFeatureChunks(stage(part, seen, at)));
    features.fill(undefined, at, at + part.length);
    onChunk?.(at + part.length, features.length);
  }
  return out;
}

export const tasks = {
  parse: (i: { bytes: Uint8Array; format: UploadFormat; fileName: string; settings: GisSettings }) =>
    guarded(() => parseUpload(i.bytes, i.format, i.fileName, i.settings)),
  /** The file's layers without their features (columns, counts, CRS hints, extent): cheap to send back to the request thread. */
  inspect: (i: { bytes: Uint8Array; format: UploadFormat; fileName: string; settings: GisSettings }) =>
    guarded(async () => (await parseUpload(i.bytes, i.format, i.fileName, i.settings)).map(layerInfo)),
  /**
   * Reprojects with proj4 when `proj4Crs` is given (else the features are in EPSG:4326 already), then maps and
   * validates; returns the staging insert's JSON chunks.
   */
  stage: (i: {
    features: RawFeature[];
    proj4Crs: CrsDefinition | null;
    layerName: string;
    purpose: 'parcels' | 'reference';
    mapping: ParcelMapping | ReferenceMapping;
    options: StageOptions;
  }) =>
    guarded(() =>
      stagedFeatureChunks(
        stageFeatures(
          i.proj4Crs ? layerToWgs84(i.features, i.proj4Crs, i.layerName) : i.features,
          i.purpose,
          i.mapping,
          i.options,
        ),
      ),
    ),
  /** Parses the file again here and stages one layer (the proj4 path): no feature crosses threads, only the JSON chunks. */
  stageFile: (i: {
    bytes: Uint8Array;
    format: UploadFormat;
    fileName: string;
    settings: GisSettings;
    layerName: string;
    proj4Crs: CrsDefinition;
    purpose: 'parcels' | 'reference';
    mapping: ParcelMapping | ReferenceMapping;
    options: StageOptions;
    /** A BroadcastChannel name to post `{ done, total }` on after each chunk (the upload's progress). */
    progressChannel?: string;
  }) =>
    guarded(async () => {
      const layer = (await parseUpload(i.bytes, i.format, i.fileName, i.settings)).find((l) => l.name === i.layerName);
      if (!layer)
        throw new HttpError('UNPROCESSABLE_CONTENT', `The file has no layer "${i.layerName}".`, [
          { path: ['layer'], message: 'unknown layer' },
        ]);
      const channel = i.progressChannel ? new BroadcastChannel(i.progressChannel) : null;
      try {
        return stageInChunks(
          layer.features,
          (part, seen, offset) =>
            stageFeatures(layerToWgs84(part, i.proj4Crs, layer.name), i.purpose, i.mapping, i.options, seen, offset),
          (done, total) => channel?.postMessage({ done, total }),
        );
      } finally {
        channel?.close();
      }
    }),
  validate: (i: { features: FeatureToValidate[]; options: ValidationOptions }) =>
    guarded(() => validateFeatures(i.features, i.options)),
  reproject: (i: { geometry: RawFeature['geometry']; crs: CrsDefinition }) =>
    guarded(() => (i.geometry ? reproject(i.geometry, i.crs) : null)),
};

export type TaskName = keyof typeof tasks;

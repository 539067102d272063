/**
 * The CPU-heavy steps of uploads and drawings, run in the worker pool (pool.ts) so requests keep
 * flowing meanwhile: parsing a file, reprojecting with proj4 and validating. Pure apart from the
 * parse; expected failures come back as data (errors do not cross threads as classes).
 */
import { BroadcastChannel, type MessagePort } from 'node:worker_threads';
import { HttpError } from '../http/errors';
import {
  openLayerInfo,
  openUpload,
  parseUpload,
  type LayerInfo,
  type OpenLayer,
  type UploadFormat,
} from '../services/upload-parse';
import { STAGE_CHUNK, stagedFeatureChunks } from '../gis/staged-json';
import { reproject, type CrsDefinition } from '../gis/crs';
import { isGisInputError } from '../gis/errors';
import type { ParcelMapping, ReferenceMapping } from '../gis/field-mapping';
import { layerToWgs84 } from '../gis/ingest/to-wgs84';
import type { GisSettings } from '../gis/settings';
import { stageFeatures, type StagedFeature, type StageOptions } from '../gis/stage-features';
import type { RawFeature } from '../gis/types';
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
 * Reads, reprojects, validates and serialises STAGE_CHUNK features at a time and hands each chunk's
 * JSON to `send` at once, so only the file's bytes and one chunk's copies are in memory at once (not a
 * parsed, a reprojected, a validated and a serialised copy of the whole file).
 */
async function stageInChunks(
  layer: OpenLayer,
  stage: (part: RawFeature[], seen: SeenSoFar, offset: number) => StagedFeature[],
  send: (json: string) => Promise<void>,
  onChunk?: (done: number, total: number) => void,
): Promise<number> {
  const seen = seenNothing();
  let chunks = 0;
  for (let at = 0; at < layer.featureCount; at += STAGE_CHUNK) {
    for (const json of stagedFeatureChunks(stage(layer.readFeatures(at, at + STAGE_CHUNK), seen, at))) {
      await send(json);
      chunks++;
    }
    onChunk?.(Math.min(at + STAGE_CHUNK, layer.featureCount), layer.featureCount);
  }
  return chunks;
}

/** Thrown in the worker when the request thread asks it to stop (its insert failed). */
class StreamStopped extends Error {}

/**
 * Sends JSON chunks to the request thread over `port`, at most two unanswered at a time, so the
 * worker never runs far ahead of PostgreSQL and unsent text does not pile up in either thread.
 * The request thread answers each chunk with 'ack' once stored, or 'stop'.
 */
function chunkSender(port: MessagePort) {
  let sent = 0;
  let answered = 0;
  let stopped = false;
  let wake: (() => void) | null = null;
  port.on('message', (answer: string) => {
    answered++;
    if (answer !== 'ack') stopped = true;
    wake?.();
  });
  const until = async (inFlight: number) => {
    while (sent - answered > inFlight && !stopped) await new Promise<void>((r) => (wake = r));
    if (stopped) throw new StreamStopped('stopped by the request thread');
  };
  return {
    send: async (json: string) => {
      await until(1);
      port.postMessage(json);
      sent++;
    },
    end: async () => {
      try {
        await until(0);
      } finally {
        port.close();
      }
    },
  };
}

export const tasks = {
  parse: (i: { bytes: Uint8Array; format: UploadFormat; fileName: string; settings: GisSettings }) =>
    guarded(() => parseUpload(i.bytes, i.format, i.fileName, i.settings)),
  /** The file's layers without their features (columns, counts, CRS hints, extent): cheap to send back to the request thread. */
  inspect: (i: { bytes: Uint8Array; format: UploadFormat; fileName: string; settings: GisSettings }) =>
    guarded(async () => (await openUpload(i.bytes, i.format, i.fileName, i.settings)).map((l) => openLayerInfo(l))),
  /** Like inspect, but without reading a shapefile's features: no extent (null) and no column samples. */
  describe: (i: { bytes: Uint8Array; format: UploadFormat; fileName: string; settings: GisSettings }) =>
    guarded(async () =>
      (await openUpload(i.bytes, i.format, i.fileName, i.settings)).map(
        ({ readFeatures: _read, quickInfo: _quick, columns, ...rest }): LayerInfo => ({
          ...rest,
          columns: typeof columns === 'function' ? columns([]) : columns,
          bbox: null,
        }),
      ),
    ),
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
  /**
   * Parses the file again here and stages one layer (the proj4 path): no feature crosses threads, only
   * the JSON chunks, each posted on `port` as soon as it is written (see chunkSender).
   */
  stageFile: (i: {
    port: MessagePort;
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
      const layer = (await openUpload(i.bytes, i.format, i.fileName, i.settings)).find((l) => l.name === i.layerName);
      if (!layer)
        throw new HttpError('UNPROCESSABLE_CONTENT', `The file has no layer "${i.layerName}".`, [
          { path: ['layer'], message: 'unknown layer' },
        ]);
      const sender = chunkSender(i.port);
      const channel = i.progressChannel ? new BroadcastChannel(i.progressChannel) : null;
      try {
        const chunks = await stageInChunks(
          layer,
          (part, seen, offset) =>
            stageFeatures(layerToWgs84(part, i.proj4Crs, layer.name), i.purpose, i.mapping, i.options, seen, offset),
          sender.send,
          (done, total) => channel?.postMessage({ done, total }),
        );
        await sender.end();
        return { chunks };
      } catch (error) {
        i.port.close();
        if (error instanceof StreamStopped) return { chunks: -1 };
        throw error;
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

/** Step 1 of an upload: parse the file and keep it, staged in PostgreSQL, until it is validated and saved. */
import { createHash, randomUUID } from 'node:crypto';
import { recordAudit } from '../db/audit';
import { db, withTransaction, type Db } from '../db/client';
import { getGisSettings } from '../db/gis-settings';
import * as uploads from '../db/uploads';
import * as progress from '../db/upload-progress';
import { hasAnyRole } from '../auth/roles';
import type { ColumnInfo } from '../gis/types';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';
import { runGisTask } from '../workers/pool';
import { detectFormat, detectLayerCrs } from './upload-parse';

/** Progress rows of uploads untouched this long are deleted (their staging expired long before). */
const PROGRESS_KEPT_DAYS = 30;

export type UploadPurpose = 'parcels' | 'reference';

export interface StagedLayer {
  name: string;
  featureCount: number;
  geometryType: string;
  columns: ColumnInfo[];
  crs: { epsg: number | null; name: string; source: 'prj' | 'geojson' } | null;
  crsNote: string | null;
  rememberedMapping: Record<string, unknown> | null;
}

export interface StagedUpload {
  id: string;
  purpose: UploadPurpose;
  fileName: string;
  format: string;
  sizeBytes: number;
  sha256: string;
  expiresAt: string;
  layers: StagedLayer[];
  timings: { parseMs: number };
}

/**
 * Remembered mappings are found by the purpose and the set of column names (the same source
 * gives the same columns). Reference layers of different kinds often share their columns
 * ("class"), so for them the layer name is part of the key too.
 */
export function sourceKey(purpose: UploadPurpose, columns: string[], layerName: string): string {
  return `${purpose}:${purpose === 'reference' ? `${layerName}:` : ''}${[...columns].sort().join(',')}`;
}

export function assertPurposeAllowed(by: Caller, purpose: UploadPurpose): void {
  if (purpose === 'reference' && !hasAnyRole(by.roles, ['admin']))
    throw new HttpError('FORBIDDEN', 'Only administrators upload reference layers.');
}

/** Reads and stages a file; its progress row says `reading` meanwhile and goes with it if the file is refused. */
export async function stageUpload(
  by: Caller,
  input: { purpose: UploadPurpose; fileName: string; bytes: Uint8Array },
): Promise<StagedUpload> {
  assertPurposeAllowed(by, input.purpose);
  const id = randomUUID();
  const { fileName, purpose } = input;
  await progress.beginStep(db, { uploadId: id, purpose, fileName, createdBy: by.id, phase: 'reading' });
  try {
    return await readAndStage(by, input, id);
  } catch (error) {
    await progress.deleteProgress(db, id);
    throw error;
  }
}

async function readAndStage(
  by: Caller,
  input: { purpose: UploadPurpose; fileName: string; bytes: Uint8Array },
  id: string,
): Promise<StagedUpload> {
  const settings = await getGisSettings(db);
  if (input.bytes.length === 0) throw new HttpError('UNPROCESSABLE_CONTENT', `"${input.fileName}" is empty.`);
  if (input.bytes.length > settings['upload.max-bytes']) {
    throw new HttpError(
      'PAYLOAD_TOO_LARGE',
      `"${input.fileName}" is ${input.bytes.length} bytes; at most ${settings['upload.max-bytes']} are allowed.`,
    );
  }
  const started = performance.now();
  const format = detectFormat(input.fileName, input.bytes);
  const parsed = await runGisTask('inspect', { bytes: input.bytes, format, fileName: input.fileName, settings });
  const parseMs = Math.round(performance.now() - started);
  const sha256 = createHash('sha256').update(input.bytes).digest('hex');
  const expiresAt = new Date(Date.now() + settings['upload.staging-hours'] * 3_600_000);
  return withTransaction(db, async (trx) => {
    await uploads.deleteExpiredStaging(trx);
    await progress.deleteOldProgress(trx, PROGRESS_KEPT_DAYS);
    const layers: StagedLayer[] = [];
    for (const layer of parsed) {
      const found = await detectLayerCrs(layer);
      layers.push({
        name: layer.name,
        featureCount: layer.featureCount,
        geometryType: layer.geometryType,
        columns: layer.columns,
        crs: found.crs && found.source ? { epsg: found.crs.epsg, name: found.crs.name, source: found.source } : null,
        crsNote: found.note,
        rememberedMapping: await uploads.getRememberedMapping(
          trx,
          sourceKey(
            input.purpose,
            layer.columns.map((c) => c.name),
            layer.name,
          ),
        ),
      });
    }
    await uploads.insertStaging(trx, {
      id,
      purpose: input.purpose,
      file_name: input.fileName,
      format,
      size_bytes: input.bytes.length,
      sha256,
      file_bytes: input.bytes,
      layers,
      created_by: by.id,
      expires_at: expiresAt,
    });
    await progress.endStep(trx, id, { phase: 'staged' });
    await recordAudit(trx, {
      actorId: by.id,
      action: 'upload.stage',
      entityType: 'upload',
      entityId: id,
      details: { fileName: input.fileName, sha256, purpose: input.purpose },
    });
    return {
      id,
      purpose: input.purpose,
      fileName: input.fileName,
      format,
      sizeBytes: input.bytes.length,
      sha256,
      expiresAt: expiresAt.toISOString(),
      layers,
      timings: { parseMs },
    };
  });
}

/** The staged upload of this caller (admins may continue anyone's); 404 / 410 otherwise. */
export async function loadOwnStaging(conn: Db, by: Caller, id: string, lock = false): Promise<uploads.StagingRow> {
  const row = await uploads.getStaging(conn, id, { lock });
  if (!row || (row.created_by !== by.id && !hasAnyRole(by.roles, ['admin'])))
    throw new HttpError('NOT_FOUND', 'No such staged upload. It may have been saved or cancelled.');
  if (row.expires_at.getTime() < Date.now())
    throw new HttpError('GONE', 'This staged upload has expired; upload the file again.');
  assertPurposeAllowed(by, row.purpose);
  return row;
}

export async function cancelUpload(by: Caller, id: string): Promise<void> {
  await withTransaction(db, async (trx) => {
    const row = await uploads.getStaging(trx, id, { lock: true });
    if (!row || (row.created_by !== by.id && !hasAnyRole(by.roles, ['admin'])))
      throw new HttpError('NOT_FOUND', 'No such staged upload. It may have been saved or cancelled.');
    await uploads.deleteStaging(trx, id);
    await progress.endStep(trx, id, { phase: 'cancelled' });
    await recordAudit(trx, {
      actorId: by.id,
      action: 'upload.cancel',
      entityType: 'upload',
      entityId: id,
      details: { fileName: row.file_name },
    });
  });
}

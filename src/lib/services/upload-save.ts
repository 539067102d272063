/**
 * Step 3 of an upload: save the valid features in ONE transaction: the batch (original file,
 * SHA-256, uploader), the parcels with their land-use events and their overlay with the
 * current reference layers, or a new draft reference-layer version. Any failure leaves nothing.
 * Parcels: the register checks are repeated under the register lock (parcel-integrity.ts), and
 * the unique keys on reference and boundary stop whatever slips past them.
 */
import { randomUUID } from 'node:crypto';
import { recordAudit } from '../db/audit';
import { db, withTransaction } from '../db/client';
import { computeOverlay } from '../db/overlay';
import { serialPlans } from '../db/bulk';
import { bumpMapVersion, insertEventsFromStaging, insertParcelsFromStaging } from '../db/parcels';
import { currentVersions, insertVersionFromStaging } from '../db/reference-layers';
import * as uploads from '../db/uploads';
import type { ReferenceKind } from '../gis/reference-kinds';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';
import { getGisSettings } from '../db/gis-settings';
import { overlapTolerance } from '../gis/settings';
import { recheckStagedInSave } from './parcel-integrity';
import { loadOwnStaging } from './upload-stage';
import { endStep, recordProgress, trackStep } from './upload-progress';

export type SaveResult = {
  batchId: string;
  purpose: 'parcels' | 'reference';
  saved: number;
  rejected: number;
  referenceVersion: { id: number; kind: string; version: number } | null;
  timings: { storeMs: number; overlayMs: number };
};

function isUniqueViolation(error: unknown): error is { code: string; detail?: string } {
  return typeof error === 'object' && error !== null && (error as { code?: string }).code === '23505';
}

export async function saveUpload(by: Caller, id: string): Promise<SaveResult> {
  return trackStep(by, id, 'storing', () => storeUpload(by, id));
}

async function storeUpload(by: Caller, id: string): Promise<SaveResult> {
  try {
    return await withTransaction(db, async (trx) => {
      await serialPlans(trx);
      const staging = await loadOwnStaging(trx, by, id, true);
      if (!staging.validated_at || !staging.report_summary)
        throw new HttpError('CONFLICT', 'Validate the upload before saving it.');
      const summary = staging.report_summary as { total: number; rejected: number };
      const valid = summary.total - summary.rejected;
      if (valid === 0)
        throw new HttpError(
          'UNPROCESSABLE_CONTENT',
          'No feature passed validation, so there is nothing to save. Cancel the upload or fix the file.',
        );
      await recordProgress(id, 'storing', null, valid);
      const t0 = performance.now();
      const batchId = randomUUID();
      await uploads.insertBatchFromStaging(trx, id, batchId, valid);
      let referenceVersion: SaveResult['referenceVersion'] = null;
      let overlayMs = 0;
      if (staging.purpose === 'parcels') {
        await recheckStagedInSave(trx, id, overlapTolerance(await getGisSettings(trx)));
        await insertParcelsFromStaging(trx, id, batchId, by.id);
        await insertEventsFromStaging(
          trx,
          id,
          batchId,
          by.id,
          `Upload "${staging.file_name}" (batch ${batchId.slice(0, 8)})`,
        );
        await recordProgress(id, 'overlay', null, valid);
        const t1 = performance.now();
        await computeOverlay(
          trx,
          { batchId },
          (await currentVersions(trx)).map((v) => v.id),
        );
        overlayMs = performance.now() - t1;
        await bumpMapVersion(trx);
      } else {
        const m = staging.column_mapping as { kind: ReferenceKind; classAttribute: string; labelAttribute?: string };
        const v = await insertVersionFromStaging(trx, {
          stagingId: id,
          batchId,
          kind: m.kind,
          classAttribute: m.classAttribute,
          labelAttribute: m.labelAttribute ?? null,
          by: by.id,
        });
        referenceVersion = { id: v.id, kind: m.kind, version: v.version };
      }
      await uploads.deleteStaging(trx, id);
      await recordAudit(trx, {
        actorId: by.id,
        action: staging.purpose === 'parcels' ? 'parcels.import' : 'reference-layer.upload',
        entityType: 'upload-batch',
        entityId: batchId,
        details: {
          fileName: staging.file_name,
          sha256: staging.sha256,
          saved: valid,
          rejected: summary.rejected,
          crs: staging.source_crs?.epsg ?? staging.source_crs?.name,
          referenceVersion,
        },
      });
      const storeMs = performance.now() - t0 - overlayMs;
      const result = { saved: valid, rejected: summary.rejected, referenceVersion };
      // Last in the transaction: the progress says saved exactly when the save commits.
      await endStep(trx, id, { phase: 'saved', total: valid, batchId, result });
      return {
        batchId,
        purpose: staging.purpose,
        ...result,
        timings: { storeMs: Math.round(storeMs), overlayMs: Math.round(overlayMs) },
      };
    });
  } catch (error) {
    if (isUniqueViolation(error)) {
      throw new HttpError(
        'CONFLICT',
        'Another save put some of these parcel references or boundaries in the register after this upload was validated. Validate again to see which.',
      );
    }
    throw error;
  }
}

/**
 * What an upload's page needs to pick up where the uploader left it (GET /api/uploads/{id}): the
 * stored progress, the staged file's layers, the choices and the report of the last check, or
 * what the save did. Read from PostgreSQL only, so any instance answers the same.
 */
import { db } from '../db/client';
import * as progress from '../db/upload-progress';
import * as uploads from '../db/uploads';
import type { Caller } from '../http/handle';
import { loadReadable, stateOf, type UploadState } from './upload-progress';
import { countOkWithWarnings, REPORT_LIMIT } from './upload-validate';

async function storedReport(s: uploads.StagingRow) {
  const summary = s.report_summary as unknown as uploads.ReportSummary;
  const problems = await uploads.stagedProblems(db, s.id, REPORT_LIMIT);
  const withIssues = summary.total - summary.ok + (await countOkWithWarnings(s.id));
  return {
    id: s.id,
    layer: s.layer_name ?? '',
    crs: { epsg: s.source_crs?.epsg ?? null, name: s.source_crs?.name ?? '', source: s.source_crs?.source ?? '' },
    summary,
    features: problems.map((p) => ({
      index: p.idx as number,
      reference: p.reference as string | null,
      status: p.status as string,
      issues: p.issues as { code: string; message: string; severity: string }[],
      areaHa: p.area_ha as number | null,
    })),
    omitted: Math.max(0, withIssues - problems.length),
  };
}

function stagedOf(s: uploads.StagingRow) {
  return {
    id: s.id,
    purpose: s.purpose,
    fileName: s.file_name,
    format: s.format,
    sizeBytes: s.size_bytes,
    sha256: s.sha256,
    expiresAt: s.expires_at.toISOString(),
    layers: s.layers as never[],
  };
}

export async function uploadStatus(by: Caller, id: string, now = Date.now()) {
  const { row, staging } = await loadReadable(db, by, id);
  const { state, message } = stateOf(row, staging, now);
  const live = staging && state !== 'expired' && state !== 'saved' && state !== 'cancelled' ? staging : null;
  const validated = live?.validated_at && live.report_summary;
  const result = (row?.result ?? null) as { saved: number; rejected: number; referenceVersion: unknown } | null;
  return {
    id,
    purpose: (row ?? staging)!.purpose,
    fileName: (row ?? staging)!.file_name,
    state: state satisfies UploadState,
    phase: row?.phase ?? (staging?.validated_at ? 'validated' : 'staged'),
    failedIn: row?.failed_in ?? null,
    done: row?.done ?? null,
    total: row?.total ?? null,
    startedAt: (row?.started_at ?? staging!.created_at).toISOString(),
    phaseStartedAt: (row?.phase_at ?? staging!.created_at).toISOString(),
    updatedAt: (row?.updated_at ?? staging!.created_at).toISOString(),
    message,
    staged: live ? stagedOf(live) : null,
    choice:
      live?.layer_name && live.column_mapping
        ? {
            layer: live.layer_name,
            epsg: live.source_crs?.source === 'picked' ? live.source_crs.epsg : null,
            mapping: live.column_mapping,
          }
        : null,
    report: validated ? await storedReport(live) : null,
    saved:
      row?.phase === 'saved' && row.batch_id && result
        ? {
            batchId: row.batch_id,
            purpose: row.purpose,
            saved: result.saved,
            rejected: result.rejected,
            referenceVersion: result.referenceVersion ?? null,
          }
        : null,
  };
}

/** The caller's uploads of the last week that are running or wait for them (for the upload page). */
export async function openUploads(by: Caller, purpose: 'parcels' | 'reference', now = Date.now()) {
  const rows = (await progress.recentProgress(db, by.id, 7, 20)).filter((r) => r.purpose === purpose);
  const out = [];
  for (const r of rows) {
    const staging = await uploads.getStaging(db, r.upload_id);
    const { state } = stateOf(r, staging, now);
    if (state === 'running' || state === 'staged' || state === 'validated' || (state === 'failed' && staging))
      out.push({
        id: r.upload_id,
        fileName: r.file_name,
        state,
        phase: r.phase,
        done: r.done,
        total: r.total,
        startedAt: r.started_at,
      });
  }
  return out;
}

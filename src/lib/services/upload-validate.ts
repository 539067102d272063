/**
 * Step 2 of an upload: the chosen layer, CRS and column mapping → a per-feature validation
 * report. Reprojects (PostGIS for datum shifts, else proj4; src/lib/db/transform.ts), validates (pure, src/lib/gis/validate.ts), then in PostGIS
 * tries ST_MakeValid on self-intersections, rejects duplicates of the register and features
 * outside the territory (naming swapped axes), and checks overlaps and near-duplicates within
 * the file and with the register. Parsing, proj4 and validation run in the worker pool. The staged
 * features replace any earlier validation of the same upload, in one transaction.
 */
import {
  mappedColumns,
  parcelMappingSchema,
  referenceMappingSchema,
  type ParcelMapping,
  type ReferenceMapping,
} from '../gis/field-mapping';
import { isGisInputError } from '../gis/errors';
import { overlapTolerance, type GisSettings } from '../gis/settings';
import type { CrsDefinition } from '../gis/crs';
import { db, withTransaction } from '../db/client';
import { getGisSettings } from '../db/gis-settings';
import { reprojectLayer, reprojectsInPostgis } from '../db/transform';
import { runGisStream, runGisTask } from '../workers/pool';
import { stringify } from 'csv-stringify/sync';
import { issueCountText } from '../gis/issue-words';
import { textStream } from '../http/text-stream';
import * as uploads from '../db/uploads';
import { HttpError } from '../http/errors';
import { zodIssues, type Caller } from '../http/handle';
import { addStagedIssues } from '../db/parcel-integrity';
import { analyzeAfterBulkWrite, serialPlans } from '../db/bulk';
import { checkStagedOverlaps } from './parcel-integrity';
import { checkStagedTerritory } from './territory';
import { loadOwnStaging, sourceKey } from './upload-stage';
import { gisError, resolveCrs } from './upload-parse';
import { endStep, recordProgress, trackStep, watchChunks } from './upload-progress';

export interface ValidationInput {
  layer: string;
  epsg?: number;
  mapping: unknown;
}

/** Reference layers: 1 m² floor; anything smaller is digitising noise (common practice). */
const REFERENCE_MIN_AREA_M2 = 1;
export const REPORT_LIMIT = 2000;

function parseMapping(purpose: 'parcels' | 'reference', mapping: unknown): ParcelMapping | ReferenceMapping {
  const schema = purpose === 'parcels' ? parcelMappingSchema : referenceMappingSchema;
  const r = schema.safeParse(mapping);
  if (!r.success) {
    const issues = zodIssues(r.error).map((i) => ({ ...i, path: ['mapping', ...i.path] }));
    throw new HttpError(
      'UNPROCESSABLE_CONTENT',
      `Invalid column mapping (${issues[0]!.path.join('.')}): ${issues[0]!.message}`,
      issues,
    );
  }
  return r.data;
}

export function validationOptions(settings: GisSettings, crs: CrsDefinition | null, purpose: 'parcels' | 'reference') {
  return {
    minAreaM2: purpose === 'parcels' ? settings['validation.min-area-m2'] : REFERENCE_MIN_AREA_M2,
    toleranceMetresPerPerimeterMetre: settings['validation.area-tolerance-m-per-m'],
    toleranceCapM2: settings['validation.area-tolerance-cap-m2'],
    areaMismatch: settings['validation.area-mismatch'],
    sourceCrs: crs,
  };
}

export async function validateUpload(by: Caller, id: string, input: ValidationInput) {
  return trackStep(by, id, 'checking', () => checkUpload(by, id, input));
}

async function checkUpload(by: Caller, id: string, input: ValidationInput) {
  const staging = await loadOwnStaging(db, by, id);
  const mapping = parseMapping(staging.purpose, input.mapping);
  const settings = await getGisSettings(db);
  const started = performance.now();
  const bytes = await uploads.getStagingBytes(db, id);
  const file = { bytes, format: staging.format, fileName: staging.file_name, settings };
  // The layers without reading their features; the extent is read only when it may name the CRS (no .prj, no code).
  const layers = await runGisTask('describe', file);
  const layer = layers.find((l) => l.name === input.layer);
  if (!layer)
    throw new HttpError(
      'UNPROCESSABLE_CONTENT',
      `The file has no layer "${input.layer}"; it has ${layers.map((l) => `"${l.name}"`).join(', ')}.`,
      [{ path: ['layer'], message: 'unknown layer' }],
    );
  const names = new Set(layer.columns.map((c) => c.name));
  const missing = mappedColumns(mapping).filter((c) => !names.has(c));
  if (missing.length)
    throw new HttpError(
      'UNPROCESSABLE_CONTENT',
      `Layer "${layer.name}" has no column ${missing.map((c) => `"${c}"`).join(', ')}.`,
      [{ path: ['mapping'], message: 'unknown column' }],
    );
  const needsExtent = input.epsg === undefined && !layer.prjWkt && layer.geojsonEpsg === null;
  const { crs, source } = await resolveCrs(
    needsExtent ? (await runGisTask('inspect', file)).find((l) => l.name === layer.name)! : layer,
    input.epsg,
  );
  const parseMs = Math.round(performance.now() - started);
  const t1 = performance.now();
  const inPostgis = await reprojectsInPostgis(db, crs);
  const stage = {
    layerName: layer.name,
    purpose: staging.purpose,
    mapping,
    options: validationOptions(settings, crs, staging.purpose),
  };
  const total = layer.featureCount;
  // A CRS with a datum shift is reprojected by PostGIS, so those features make the round trip through here:
  // checked first, then recorded, so the check has a progress phase of its own.
  const shifted = inPostgis
    ? await (async () => {
        await recordProgress(id, 'checking', 0, total);
        const parsed = (await runGisTask('parse', file)).find((l) => l.name === layer.name)!;
        return runGisTask('stage', {
          ...stage,
          features: await reprojectLayer(db, parsed.features, crs, layer.name),
          proj4Crs: null,
        });
      })().catch((error) => {
        throw isGisInputError(error) ? gisError(error) : error;
      })
    : null;
  await recordProgress(id, 'keeping', 0, total);
  const result = await withTransaction(db, async (trx) => {
    await serialPlans(trx);
    if (shifted)
      await uploads.replaceStagedFeatureChunks(trx, id, shifted, (done) => recordProgress(id, 'keeping', done, total));
    else {
      // Otherwise the features stay in the worker pool (parse, reproject, validate, serialise): each chunk's JSON
      // text is inserted as soon as the worker has written it, so neither thread holds the text of the whole file.
      // Checking and recording go together, so the worker's counts are recorded as `keeping`.
      await uploads.deleteStagedFeatures(trx, id);
      const counts = watchChunks(id, 'keeping');
      await runGisStream('stageFile', { ...file, ...stage, proj4Crs: crs, progressChannel: counts.name }, (chunk) =>
        uploads.insertStagedChunk(trx, id, chunk),
      )
        .catch((error) => {
          throw isGisInputError(error) ? gisError(error) : error;
        })
        .finally(counts.stop);
      await analyzeAfterBulkWrite(trx, 'upload_staging_feature');
    }
    await recordProgress(id, 'comparing', null, total);
    await uploads.repairWithMakeValid(trx, id, validationOptions(settings, crs, staging.purpose).minAreaM2);
    if (staging.purpose === 'parcels') {
      await uploads.rejectRegisterDuplicates(trx, id);
      await addStagedIssues(trx, id, await checkStagedTerritory(trx, id));
      await checkStagedOverlaps(trx, id, overlapTolerance(settings));
    }
    const summary = await uploads.stagedSummary(trx, id);
    const sourceCrs = { epsg: crs.epsg, name: crs.name, definition: crs.definition, source };
    await uploads.updateStagingValidation(trx, id, { layerName: layer.name, sourceCrs, mapping, summary });
    await uploads.rememberMapping(
      trx,
      sourceKey(
        staging.purpose,
        layer.columns.map((c) => c.name),
        layer.name,
      ),
      staging.purpose,
      mapping,
      by.id,
    );
    const problems = await uploads.stagedProblems(trx, id, REPORT_LIMIT);
    await endStep(trx, id, { phase: 'validated', total: summary.total });
    return { summary, problems };
  });
  const listed = result.problems.length;
  const withIssues = result.summary.total - result.summary.ok + (await countOkWithWarnings(id));
  return {
    id,
    layer: layer.name,
    crs: { epsg: crs.epsg, name: crs.name, source },
    summary: result.summary,
    features: result.problems.map((p) => ({
      index: p.idx,
      reference: p.reference,
      status: p.status,
      issues: p.issues,
      areaHa: p.area_ha,
    })),
    omitted: Math.max(0, withIssues - listed),
    timings: { parseMs, validateMs: Math.round(performance.now() - t1) },
  };
}

export async function countOkWithWarnings(id: string): Promise<number> {
  const r = await db('upload_staging_feature')
    .where({ staging_id: id, status: 'ok' })
    .andWhereRaw('jsonb_array_length(issues) > 0')
    .count<{ n: number }[]>('* as n');
  return Number(r[0]?.n ?? 0);
}

const REPORT_STATUS: Record<string, string> = {
  ok: 'Valid',
  repaired: 'Repaired, will be saved',
  rejected: 'Rejected, not saved',
};

/** The whole validation report as CSV, streamed in file order (owner or admin; validated uploads only). */
export async function uploadReportCsv(
  by: Caller,
  id: string,
): Promise<{ fileName: string; body: ReadableStream<Uint8Array> }> {
  const staging = await loadOwnStaging(db, by, id);
  if (!staging.validated_at)
    throw new HttpError(
      'CONFLICT',
      'This upload has not been checked yet: run the validation first, then download its report.',
    );
  const base = staging.file_name.replace(/\.[^.]+$/, '').replace(/[^\w.-]+/g, '_') || 'upload';
  return {
    fileName: `${base}-report.csv`,
    body: textStream(
      (async function* () {
        yield stringify([['row', 'reference', 'status', 'measured_area_ha', 'found', 'remarks']]);
        for await (const r of uploads.stagedReportRows(db, id)) {
          yield stringify([
            [
              r.idx + 1,
              r.reference ?? '',
              REPORT_STATUS[r.status] ?? r.status,
              r.area_ha ?? '',
              r.issues.map((i) => issueCountText(i.code, 1).replace(/^1 /, '')).join(' | '),
              r.issues.map((i) => i.message).join(' | '),
            ],
          ]);
        }
      })(),
    ),
  };
}

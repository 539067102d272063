/** Staged uploads and their validated features (server-only). */
import { STAGE_CHUNK, stagedFeatureChunks } from '../gis/staged-json';
import { analyzeAfterBulkWrite } from './bulk';
import type { Db } from './client';

export type StagingRow = {
  id: string;
  purpose: 'parcels' | 'reference';
  file_name: string;
  format: 'shapefile-zip' | 'geojson';
  size_bytes: number;
  sha256: string;
  layers: unknown;
  layer_name: string | null;
  source_crs: { epsg: number | null; name: string; definition: string; source: string } | null;
  column_mapping: Record<string, unknown> | null;
  report_summary: Record<string, unknown> | null;
  validated_at: Date | null;
  created_by: string;
  created_at: Date;
  expires_at: Date;
};

export type StagedFeature = {
  idx: number;
  status: 'ok' | 'repaired' | 'rejected';
  reference: string | null;
  issues: { code: string; message: string; severity: string }[];
  fields: Record<string, unknown>;
  geom: unknown | null;
  rawGeom: unknown | null;
};

const COLUMNS = [
  'id',
  'purpose',
  'file_name',
  'format',
  'size_bytes',
  'sha256',
  'layers',
  'layer_name',
  'source_crs',
  'column_mapping',
  'report_summary',
  'validated_at',
  'created_by',
  'created_at',
  'expires_at',
];

export async function deleteExpiredStaging(db: Db): Promise<number> {
  return db('upload_staging').where('expires_at', '<', db.fn.now()).delete();
}

export async function insertStaging(
  db: Db,
  row: Omit<
    StagingRow,
    'layer_name' | 'source_crs' | 'column_mapping' | 'report_summary' | 'validated_at' | 'created_at'
  > & { file_bytes: Uint8Array },
): Promise<void> {
  await db('upload_staging').insert({
    ...row,
    layers: JSON.stringify(row.layers),
    file_bytes: Buffer.from(row.file_bytes),
  });
}

export async function getStaging(db: Db, id: string, opts: { lock?: boolean } = {}): Promise<StagingRow | null> {
  const q = db('upload_staging').select(COLUMNS).where({ id });
  if (opts.lock) q.forUpdate();
  return (await q.first()) ?? null;
}

const READ_PIECE_BYTES = 1 << 20;

/**
 * The staged file, read in pieces of 1 MiB: one value of tens of megabytes would be decoded from
 * hex and reassembled in a single turn of the event loop, stalling every other request meanwhile.
 * The bytes live in a SharedArrayBuffer, so the worker pool's tasks (describe, inspect, stageFile) read
 * them where they are instead of each getting a copy (nothing writes to them once read).
 */
export async function getStagingBytes(db: Db, id: string): Promise<Uint8Array> {
  const size = (await db('upload_staging').select(db.raw('octet_length(file_bytes)::int as n')).where({ id }).first())
    ?.n as number | undefined;
  if (size === undefined) throw new Error(`staged upload ${id} is gone`);
  const out = new Uint8Array(new SharedArrayBuffer(size));
  for (let at = 0; at < size; at += READ_PIECE_BYTES) {
    const r = await db.raw('select substring(file_bytes from ? for ?) as piece from upload_staging where id = ?', [
      at + 1,
      READ_PIECE_BYTES,
      id,
    ]);
    out.set(r.rows[0].piece as Buffer, at);
  }
  return out;
}

export async function deleteStaging(db: Db, id: string): Promise<void> {
  await db('upload_staging').where({ id }).delete();
}

/** Removes an upload's staged features (before it is validated again). */
export async function deleteStagedFeatures(db: Db, stagingId: string): Promise<void> {
  await db('upload_staging_feature').where({ staging_id: stagingId }).delete();
}

/** Inserts one JSON chunk of staged features (`stagedFeatureChunks`, built in the worker pool). */
export async function insertStagedChunk(db: Db, stagingId: string, chunk: string): Promise<void> {
  await db.raw(
    `insert into upload_staging_feature (staging_id, idx, status, reference, issues, fields, geom, raw_geom)
     select ?, (r->>'idx')::int, r->>'status', r->>'reference', r->'issues', r->'fields',
            st_geomfromgeojson(r->>'geom'), st_geomfromgeojson(r->>'rawGeom')
     from jsonb_array_elements(?::jsonb) r`,
    [stagingId, chunk],
  );
}

/** Replaces the staged features, given as JSON chunks (`stagedFeatureChunks`, built in the worker pool). */
export async function replaceStagedFeatureChunks(
  db: Db,
  stagingId: string,
  chunks: string[],
  onChunk?: (done: number) => Promise<void>,
): Promise<void> {
  await deleteStagedFeatures(db, stagingId);
  for (const [i, chunk] of chunks.entries()) {
    if (onChunk && i > 0) await onChunk(i * STAGE_CHUNK);
    await insertStagedChunk(db, stagingId, chunk);
  }
  await analyzeAfterBulkWrite(db, 'upload_staging_feature');
}

/** Replaces the staged features in chunks of one JSON parameter each (fast for 20 000 rows). */
export async function replaceStagedFeatures(db: Db, stagingId: string, features: StagedFeature[]): Promise<void> {
  await replaceStagedFeatureChunks(db, stagingId, stagedFeatureChunks(features));
}

const push = (code: string, message: string) =>
  `issues || jsonb_build_array(jsonb_build_object('code', '${code}', 'message', ${message}, 'severity', 'error'))`;

/** Rejects features whose reference (by its key, references.ts) or exact geometry is already in the register. */
export async function rejectRegisterDuplicates(db: Db, stagingId: string): Promise<void> {
  await db.raw(
    `update upload_staging_feature f set status = 'rejected',
       issues = ${push(
         'reference-in-register',
         `'Parcel reference "' || f.reference || '" is already in the ` +
           `register' || case when p.reference <> f.reference then ' as "' || p.reference || '"' else '' end || '.'`,
       )}
     from parcel p
     where f.staging_id = ? and f.reference is not null and p.reference_key = f.fields->>'referenceKey'`,
    [stagingId],
  );
  await db.raw(
    `update upload_staging_feature f set status = 'rejected',
       issues = ${push('geometry-in-register', `'Same boundary as parcel ' || p.reference || ', already in the register.'`)}
     from parcel p
     where f.staging_id = ? and f.geom is not null and p.geom && f.geom and st_equals(p.geom, f.geom)`,
    [stagingId],
  );
}

/**
 * Self-intersecting features: ST_MakeValid; when the result is ONE polygon (e.g. a boundary
 * that touches itself) it replaces the geometry and the feature counts as repaired. A result
 * of several parts (a bow-tie) stays rejected: splitting a parcel is the planner's call.
 */
export async function repairWithMakeValid(db: Db, stagingId: string, minAreaM2: number): Promise<void> {
  await db.raw(
    `with fixed as (
       select idx, st_collectionextract(st_makevalid(raw_geom), 3) g from upload_staging_feature
       where staging_id = ? and raw_geom is not null and status = 'rejected'
         and jsonb_path_query_array(issues, '$[*] \\? (@.severity == "error").code') = '["self-intersection"]'::jsonb
     )
     update upload_staging_feature f set status = 'repaired', geom = st_multi(fixed.g), raw_geom = null,
       issues = (select coalesce(jsonb_agg(i), '[]'::jsonb) from jsonb_array_elements(f.issues) i where i->>'code' <> 'self-intersection')
         || jsonb_build_array(jsonb_build_object('code', 'made-valid', 'severity', 'repaired',
              'message', 'The boundary touched or crossed itself; PostGIS ST_MakeValid rebuilt it as one polygon ` +
      `of ' || round((st_area(fixed.g::geography) / 10000)::numeric, 4) || ' ha.'))
     from fixed
     where f.staging_id = ? and f.idx = fixed.idx and st_numgeometries(fixed.g) = 1 and st_area(fixed.g::geography) >= ?`,
    [stagingId, stagingId, minAreaM2],
  );
}

export type ReportSummary = {
  total: number;
  ok: number;
  repaired: number;
  rejected: number;
  byCode: Record<string, number>;
};

export async function stagedSummary(db: Db, stagingId: string): Promise<ReportSummary> {
  const counts = await db('upload_staging_feature')
    .select('status')
    .count<{ status: string; n: number }[]>('* as n')
    .where({ staging_id: stagingId })
    .groupBy('status');
  const codes = await db.raw(
    `select i->>'code' as code, count(*)::int as n from upload_staging_feature, jsonb_array_elements(issues) i where staging_id = ? group by 1`,
    [stagingId],
  );
  const by = (s: string) => Number(counts.find((c) => c.status === s)?.n ?? 0);
  return {
    total: by('ok') + by('repaired') + by('rejected'),
    ok: by('ok'),
    repaired: by('repaired'),
    rejected: by('rejected'),
    byCode: Object.fromEntries(codes.rows.map((r: { code: string; n: number }) => [r.code, r.n])),
  };
}

/** Features with something to say (rejected, repaired or warned), in file order. */
/** Ellipsoidal area of the staged boundary; when it was rejected, the one measured at validation, else that of the file's boundary made valid for measuring. */
const MEASURED_AREA_HA = `round(coalesce(st_area(geom::geography) / 10000, (fields->>'measuredAreaHa')::float8,
  st_area(st_collectionextract(st_makevalid(raw_geom), 3)::geography) / 10000)::numeric, 4)::float8`;

export async function stagedProblems(db: Db, stagingId: string, limit: number) {
  return db('upload_staging_feature')
    .select('idx', 'status', 'reference', 'issues', db.raw(`${MEASURED_AREA_HA} as area_ha`))
    .where({ staging_id: stagingId })
    .andWhereRaw("(status <> 'ok' or jsonb_array_length(issues) > 0)")
    .orderBy('idx')
    .limit(limit);
}

/** Every staged feature in file order with its measured area, in batches (for the CSV report). */
export async function* stagedReportRows(db: Db, stagingId: string, batch = 2000) {
  for (let after = -1; ;) {
    const rows: {
      idx: number;
      status: string;
      reference: string | null;
      issues: { code: string; message: string; severity: string }[];
      area_ha: number | null;
    }[] = await db('upload_staging_feature')
      .select('idx', 'status', 'reference', 'issues', db.raw(`${MEASURED_AREA_HA} as area_ha`))
      .where({ staging_id: stagingId })
      .andWhere('idx', '>', after)
      .orderBy('idx')
      .limit(batch);
    if (!rows.length) return;
    yield* rows;
    after = rows[rows.length - 1]!.idx;
  }
}

export async function updateStagingValidation(
  db: Db,
  id: string,
  v: { layerName: string; sourceCrs: unknown; mapping: unknown; summary: ReportSummary },
): Promise<void> {
  await db('upload_staging')
    .where({ id })
    .update({
      layer_name: v.layerName,
      source_crs: JSON.stringify(v.sourceCrs),
      column_mapping: JSON.stringify(v.mapping),
      report_summary: JSON.stringify(v.summary),
      validated_at: db.fn.now(),
    });
}

/** Copies a staged upload into the permanent batch table (original bytes included). */
export async function insertBatchFromStaging(
  db: Db,
  stagingId: string,
  batchId: string,
  savedCount: number,
): Promise<void> {
  await db.raw(
    `insert into upload_batch (id, purpose, file_name, format, size_bytes, sha256, file_bytes, layer_name, ` +
      `source_crs, column_mapping, feature_count, saved_count, uploaded_by, uploaded_at)
     select ?, purpose, file_name, format, size_bytes, sha256, file_bytes, layer_name, source_crs, column_mapping,
            (select count(*) from upload_staging_feature where staging_id = s.id), ?, created_by, created_at
     from upload_staging s where id = ?`,
    [batchId, savedCount, stagingId],
  );
}

export async function getRememberedMapping(db: Db, sourceKey: string): Promise<Record<string, unknown> | null> {
  return (await db('column_mapping').select('mapping').where({ source_key: sourceKey }).first())?.mapping ?? null;
}

export async function rememberMapping(
  db: Db,
  sourceKey: string,
  purpose: string,
  mapping: unknown,
  by: string,
): Promise<void> {
  await db('column_mapping')
    .insert({
      source_key: sourceKey,
      purpose,
      mapping: JSON.stringify(mapping),
      updated_by: by,
      updated_at: db.fn.now(),
    })
    .onConflict('source_key')
    .merge();
}

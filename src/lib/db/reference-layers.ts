/** Reference layer versions and their features (server-only). */
import type { ReferenceKind } from '../gis/reference-kinds';
import { analyzeAfterBulkWrite } from './bulk';
import type { Db } from './client';

export type LayerVersionRow = {
  id: number;
  kind: ReferenceKind;
  version: number;
  status: 'draft' | 'published';
  class_attribute: string;
  label_attribute: string | null;
  classes: string[];
  feature_count: number;
  batch_id: string | null;
  file_name: string | null;
  created_at: Date;
  created_by_name: string | null;
  published_at: Date | null;
  published_by_name: string | null;
  note: string | null;
};

export async function listLayerVersions(db: Db): Promise<LayerVersionRow[]> {
  return db('reference_layer_version as v')
    .leftJoin('upload_batch as b', 'b.id', 'v.batch_id')
    .leftJoin('user as c', 'c.id', 'v.created_by')
    .leftJoin('user as p', 'p.id', 'v.published_by')
    .select('v.*', 'b.file_name', 'c.name as created_by_name', 'p.name as published_by_name')
    .orderBy([{ column: 'v.kind' }, { column: 'v.version', order: 'desc' }]);
}

export async function getLayerVersion(
  db: Db,
  id: number,
  opts: { lock?: boolean } = {},
): Promise<LayerVersionRow | null> {
  const q = db('reference_layer_version').select('*').where({ id });
  if (opts.lock) q.forUpdate();
  return (await q.first()) ?? null;
}

/** The current (newest published) version of each kind. */
export async function currentVersions(
  db: Db,
): Promise<{ id: number; kind: ReferenceKind; version: number; classes: string[] }[]> {
  const r = await db.raw(
    "select distinct on (kind) id, kind, version, classes from reference_layer_version where status = 'published' order by kind, version desc",
  );
  return r.rows;
}

/** Makes a draft version from a staged upload's valid features; returns its id and number. */
export async function insertVersionFromStaging(
  db: Db,
  v: {
    stagingId: string;
    batchId: string;
    kind: ReferenceKind;
    classAttribute: string;
    labelAttribute: string | null;
    by: string;
  },
): Promise<{ id: number; version: number }> {
  await db.raw('select pg_advisory_xact_lock(hashtext(?))', [`reference-layer:${v.kind}`]);
  const next =
    Number((await db('reference_layer_version').where({ kind: v.kind }).max('version as m').first())?.m ?? 0) + 1;
  const classes = await db.raw(
    `select coalesce(array_agg(distinct fields->>'class' order by fields->>'class'), '{}') as c from ` +
      `upload_staging_feature where staging_id = ? and status <> 'rejected'`,
    [v.stagingId],
  );
  const [row] = await db('reference_layer_version')
    .insert({
      kind: v.kind,
      version: next,
      status: 'draft',
      class_attribute: v.classAttribute,
      label_attribute: v.labelAttribute,
      classes: classes.rows[0].c,
      feature_count: 0,
      batch_id: v.batchId,
      created_by: v.by,
    })
    .returning('id');
  const inserted = await db.raw(
    `insert into reference_feature (version_id, class, label, geom)
     select ?, fields->>'class', fields->>'label', geom from upload_staging_feature where staging_id = ? and status <> 'rejected' order by idx`,
    [row.id, v.stagingId],
  );
  // The trigger reference_piece_make has cut each feature into pieces for the overlay (reference_piece).
  await analyzeAfterBulkWrite(db, 'reference_feature', 'reference_piece');
  await db('reference_layer_version')
    .where({ id: row.id })
    .update({ feature_count: inserted.rowCount ?? 0 });
  return { id: row.id, version: next };
}

export async function markPublished(db: Db, id: number, by: string, note: string | null): Promise<void> {
  await db('reference_layer_version')
    .where({ id })
    .update({ status: 'published', published_by: by, published_at: db.fn.now(), note });
}

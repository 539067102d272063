/** Factor sets, their versions, confirmations and edits (server-only). */
import type { FactorSetDocument } from '../carbon';
import type { Db } from './client';
import { versionedSetTables, type BaseVersionRow, type SetRow } from './versioned-sets';

export type FactorSetRow = SetRow;
export type VersionRow = BaseVersionRow<FactorSetDocument>;
export type ConfirmationRow = {
  table_key: string;
  confirmed_by_name: string | null;
  confirmed_at: Date;
  document: string;
  page: string;
};

const tables = versionedSetTables<FactorSetDocument, VersionRow>({ set: 'factor_set', version: 'factor_set_version' });
export const { listSets, getSet, listVersions, getVersion, insertSet, insertVersion, markPublished } = tables;

export async function listConfirmations(db: Db, setId: string, version: number): Promise<ConfirmationRow[]> {
  return db('factor_table_confirmation as c')
    .leftJoin('user as u', 'u.id', 'c.confirmed_by')
    .select('c.table_key', 'u.name as confirmed_by_name', 'c.confirmed_at', 'c.document', 'c.page')
    .where({ 'c.set_id': setId, 'c.version': version });
}

export async function updateDraftDocument(db: Db, setId: string, document: FactorSetDocument): Promise<void> {
  await db('factor_set_version')
    .where({ set_id: setId, status: 'draft' })
    .update({ document: JSON.stringify(document) });
}

export async function insertConfirmation(
  db: Db,
  c: { setId: string; version: number; tableKey: string; by: string; document: string; page: string },
): Promise<void> {
  await db('factor_table_confirmation').insert({
    set_id: c.setId,
    version: c.version,
    table_key: c.tableKey,
    confirmed_by: c.by,
    document: c.document,
    page: c.page,
  });
}

export async function insertEdit(
  db: Db,
  e: {
    setId: string;
    version: number;
    tableKey: string;
    entryKey: string;
    before: unknown;
    after: unknown;
    reason: string;
    by: string;
  },
): Promise<void> {
  await db('factor_edit').insert({
    set_id: e.setId,
    version: e.version,
    table_key: e.tableKey,
    entry_key: e.entryKey,
    before: JSON.stringify(e.before),
    after: JSON.stringify(e.after),
    reason: e.reason,
    edited_by: e.by,
  });
}

export type EditRow = {
  table_key: string;
  entry_key: string;
  before: unknown;
  after: unknown;
  reason: string;
  edited_by_name: string | null;
  edited_at: Date;
  version: number;
};

export async function listEdits(db: Db, setId: string): Promise<EditRow[]> {
  return db('factor_edit as e')
    .leftJoin('user as u', 'u.id', 'e.edited_by')
    .select(
      'e.table_key',
      'e.entry_key',
      'e.before',
      'e.after',
      'e.reason',
      'u.name as edited_by_name',
      'e.edited_at',
      'e.version',
    )
    .where('e.set_id', setId)
    .orderBy('e.id', 'desc');
}

export async function getSetting<T>(db: Db, key: string): Promise<T | null> {
  const row = await db('app_setting').where({ key }).first('value');
  return row ? (row.value as T) : null;
}

export async function putSetting(db: Db, key: string, value: unknown, by: string | null): Promise<void> {
  await db('app_setting')
    .insert({ key, value: JSON.stringify(value), updated_by: by })
    .onConflict('key')
    .merge({ value: JSON.stringify(value), updated_by: by, updated_at: db.fn.now() });
}

/** Which published version to compute with, and its confirmations, without the (large) document. */
export type PublishedStamp = { setId: string; version: number | null; confirmations: ConfirmationRow[] };

/**
 * One small statement: the set (named, else the `default-factor-set` setting, else `fallbackId`), its
 * newest published version (or the pinned one, when published) and that version's confirmations.
 * `version` is null when there is no such published version.
 */
export async function publishedStamp(
  db: Db,
  setId: string | null,
  version: number | undefined,
  fallbackId: string,
): Promise<PublishedStamp> {
  const r = await db.raw(
    `with s as (select coalesce(?::text, (select value #>> '{}' from app_setting where key = 'default-factor-set'), ?::text) as id)
     select s.id as set_id, v.version,
            coalesce((select json_agg(json_build_object('table_key', c.table_key, 'confirmed_by_name', u.name, ` +
      `'confirmed_at', c.confirmed_at, 'document', c.document, 'page', c.page) order by c.table_key)
                      from factor_table_confirmation c left join "user" u on u.id = c.confirmed_by where c.set_id ` +
      `= v.set_id and c.version = v.version), '[]'::json) as confirmations
     from s left join lateral (select set_id, version from factor_set_version where set_id = s.id and status = ` +
      `'published' and (?::int is null or version = ?::int) order by version desc limit 1) v on true`,
    [setId, fallbackId, version ?? null, version ?? null],
  );
  const row = r.rows[0] as {
    set_id: string;
    version: number | null;
    confirmations: (Omit<ConfirmationRow, 'confirmed_at'> & { confirmed_at: string })[];
  };
  return {
    setId: row.set_id,
    version: row.version,
    confirmations: row.confirmations.map((c) => ({ ...c, confirmed_at: new Date(c.confirmed_at) })),
  };
}

/** The stored document of a version (published ones never change). */
export async function versionDocument(db: Db, setId: string, version: number): Promise<FactorSetDocument> {
  return (await db('factor_set_version').where({ set_id: setId, version }).first('document')).document;
}

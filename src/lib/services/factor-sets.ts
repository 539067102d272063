/** Factor-set use cases: shipping the built-in sets, cloning, editing drafts, publishing, confirming. */
import {
  BUILT_IN_FACTOR_SETS,
  DEFAULT_FACTOR_SET_ID,
  factorSetDocumentSchema,
  type FactorSetDocument,
  type Uncertainty,
} from '../carbon';
import { LRUCache } from 'lru-cache';
import { recordAudit } from '../db/audit';
import { db, withTransaction, type Db } from '../db/client';
import * as sets from '../db/factor-sets';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';
import {
  copySet,
  customSet,
  defaultId,
  publish,
  setDefault,
  startDraft as startSetDraft,
  syncShipped,
  type SetKind,
} from './versioned-sets';
import { cloneDocument, sameDocument, withConfirmations, withEditedEntry } from './factor-set-documents';

export const DEFAULT_SET_KEY = 'default-factor-set';

const FACTOR_SETS: SetKind<FactorSetDocument, sets.VersionRow> = {
  entity: 'factor-set',
  noun: 'factor set',
  tables: sets,
  defaultKey: DEFAULT_SET_KEY,
  fallbackId: DEFAULT_FACTOR_SET_ID,
  same: sameDocument,
  copy: cloneDocument,
};

/** Puts each shipped set's missing versions into the database (versioned-sets.ts). */
export async function syncShippedSets(
  conn: Db = db,
  shipped: readonly FactorSetDocument[] = BUILT_IN_FACTOR_SETS,
): Promise<string[]> {
  return syncShipped(FACTOR_SETS, shipped, conn);
}

export async function defaultSetId(conn: Db = db): Promise<string> {
  return defaultId(FACTOR_SETS, conn);
}

/**
 * Documents of published versions, kept in this process: a published version never changes, so
 * (set, version) names one fixed document, and the same (set, version, confirmations) one merged
 * document. What is current (the default set, the newest version, the confirmations) is read from
 * PostgreSQL on every call, in one small statement, so no instance computes with a stale choice.
 */
const publishedDocs = new LRUCache<string, FactorSetDocument>({ max: 32 });
const mergedDocs = new LRUCache<string, FactorSetDocument>({ max: 64 });

function deepFreeze<T>(o: T): T {
  if (o && typeof o === 'object' && !Object.isFrozen(o)) {
    Object.freeze(o);
    for (const v of Object.values(o)) deepFreeze(v);
  }
  return o;
}

/** The default set's id when `setId` is not given (one statement with the version look-up). */
export async function resolvePublished(
  conn: Db,
  setId: string | undefined,
  version?: number,
): Promise<FactorSetDocument> {
  const stamp = await sets.publishedStamp(conn, setId ?? null, version, DEFAULT_FACTOR_SET_ID);
  if (stamp.version === null) {
    const what = version ? `version ${version} of factor set "${stamp.setId}"` : `factor set "${stamp.setId}"`;
    throw new HttpError('UNPROCESSABLE_CONTENT', `There is no published ${what}.`, [
      { path: ['factorSet'], message: `Unknown or unpublished ${what}.` },
    ]);
  }
  const id = `${stamp.setId}@${stamp.version}`;
  const key = `${id}|${JSON.stringify(stamp.confirmations)}`;
  const merged = mergedDocs.get(key);
  if (merged) return merged;
  let doc = publishedDocs.get(id);
  if (!doc) publishedDocs.set(id, (doc = deepFreeze(await sets.versionDocument(conn, stamp.setId, stamp.version))));
  const out = deepFreeze(withConfirmations(doc, confirmationsOf(stamp.confirmations)));
  mergedDocs.set(key, out);
  return out;
}

/** The document as computed with: a published version (the newest unless pinned), confirmations merged. */
export async function loadPublished(conn: Db, setId: string, version?: number): Promise<FactorSetDocument> {
  return resolvePublished(conn, setId, version);
}

const confirmationsOf = (rows: sets.ConfirmationRow[]) =>
  rows.map((c) => ({
    tableKey: c.table_key,
    by: c.confirmed_by_name ?? 'a former user',
    at: c.confirmed_at.toISOString(),
    document: c.document,
    page: c.page,
  }));

export async function withStoredConfirmations(
  conn: Db,
  doc: FactorSetDocument,
  setId: string,
  version: number,
): Promise<FactorSetDocument> {
  const confirmations = await sets.listConfirmations(conn, setId, version);
  return withConfirmations(doc, confirmationsOf(confirmations));
}

export async function cloneSet(
  by: Caller,
  input: { fromId: string; fromVersion?: number; id: string; title: string; description: string; reason: string },
): Promise<{ id: string; version: number }> {
  return copySet(FACTOR_SETS, by, input);
}

async function lockDraft(trx: Db, setId: string) {
  await customSet(
    FACTOR_SETS,
    trx,
    setId,
    'Shipped factor sets are read-only. Copy one to make a country-specific set.',
  );
  const draft = await sets.getVersion(trx, setId, 'draft', { lock: true });
  if (!draft)
    throw new HttpError('CONFLICT', 'This set has no draft. Start a new draft from its latest version first.');
  return draft;
}

export async function editDraftEntry(
  by: Caller,
  setId: string,
  edit: { tableKey: string; entryKey: string; value: number; uncertainty?: Uncertainty; reason: string },
): Promise<void> {
  await withTransaction(db, async (trx) => {
    const draft = await lockDraft(trx, setId);
    let result;
    try {
      result = withEditedEntry(draft.document, { ...edit, note: `Changed: ${edit.reason}` });
    } catch (err) {
      throw new HttpError('UNPROCESSABLE_CONTENT', (err as Error).message, [
        { path: ['entryKey'], message: (err as Error).message },
      ]);
    }
    await sets.updateDraftDocument(trx, setId, result.document);
    await sets.insertEdit(trx, {
      setId,
      version: draft.version,
      tableKey: edit.tableKey,
      entryKey: edit.entryKey,
      before: result.before,
      after: result.after,
      reason: edit.reason,
      by: by.id,
    });
    await recordAudit(trx, {
      actorId: by.id,
      action: 'factor-set.edit',
      entityType: 'factor-set',
      entityId: `${setId}@${draft.version}`,
      details: { table: edit.tableKey, entry: edit.entryKey, ...(result.after as object), reason: edit.reason },
    });
  });
}

export async function startDraft(by: Caller, setId: string): Promise<{ version: number }> {
  return startSetDraft(FACTOR_SETS, by, setId);
}

export async function publishDraft(by: Caller, setId: string, note: string): Promise<{ version: number }> {
  return withTransaction(db, async (trx) => {
    const draft = await lockDraft(trx, setId);
    factorSetDocumentSchema.parse(draft.document);
    await publish(FACTOR_SETS, trx, by, draft, note);
    return { version: draft.version };
  });
}

export async function confirmTable(
  by: Caller,
  setId: string,
  version: number,
  input: { tableKey: string; document: string; page: string },
): Promise<void> {
  await withTransaction(db, async (trx) => {
    const row = await sets.getVersion(trx, setId, version, { lock: true });
    if (!row) throw new HttpError('NOT_FOUND', `No version ${version} of factor set "${setId}".`);
    if (row.status !== 'published')
      throw new HttpError('CONFLICT', 'Confirm tables of a published version; a draft may still change.');
    if (!row.document.tables.some((t) => t.key === input.tableKey))
      throw new HttpError('UNPROCESSABLE_CONTENT', `No table "${input.tableKey}" in this set.`, [
        { path: ['tableKey'], message: 'Unknown table.' },
      ]);
    const existing = await sets.listConfirmations(trx, setId, version);
    if (existing.some((c) => c.table_key === input.tableKey))
      throw new HttpError('CONFLICT', 'This table is already confirmed.');
    await sets.insertConfirmation(trx, {
      setId,
      version,
      tableKey: input.tableKey,
      by: by.id,
      document: input.document,
      page: input.page,
    });
    await recordAudit(trx, {
      actorId: by.id,
      action: 'factor-set.confirm-table',
      entityType: 'factor-set',
      entityId: `${setId}@${version}`,
      details: input,
    });
  });
}

export async function setDefaultSet(by: Caller, setId: string): Promise<void> {
  await setDefault(FACTOR_SETS, by, setId);
}

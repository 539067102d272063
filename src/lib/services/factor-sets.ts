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
import { recomputeScreening } from './screening';
import { cloneDocument, sameDocument, withConfirmations, withEditedEntry } from './factor-set-documents';

export const DEFAULT_SET_KEY = 'default-factor-set';

/**
 * Puts each shipped set's version into the database when it is missing. A shipped file whose
 * content changed without a new version number is refused: old estimates name that version.
 */
export async function syncShippedSets(
  conn: Db = db,
  shipped: readonly FactorSetDocument[] = BUILT_IN_FACTOR_SETS,
): Promise<string[]> {
  const added: string[] = [];
  await withTransaction(conn, async (trx) => {
    for (const doc of shipped) {
      if (!(await sets.getSet(trx, doc.id)))
        await sets.insertSet(trx, {
          id: doc.id,
          title: doc.title,
          description: doc.description,
          origin: 'shipped',
          createdBy: null,
        });
      const stored = await sets.getVersion(trx, doc.id, doc.version);
      if (stored && !sameDocument(stored.document, doc)) {
        throw new Error(
          `shipped factor set ${doc.id} version ${doc.version} differs from the stored one; give the changed file a new version number`,
        );
      }
      if (!stored) {
        await sets.insertVersion(trx, {
          setId: doc.id,
          version: doc.version,
          status: 'published',
          document: doc,
          note: 'Shipped with Swardkeep',
          by: null,
        });
        await recordAudit(trx, {
          actorId: null,
          action: 'factor-set.ship',
          entityType: 'factor-set',
          entityId: `${doc.id}@${doc.version}`,
        });
        added.push(`${doc.id}@${doc.version}`);
      }
    }
  });
  return added;
}

export async function defaultSetId(conn: Db = db): Promise<string> {
  return (await sets.getSetting<string>(conn, DEFAULT_SET_KEY)) ?? DEFAULT_FACTOR_SET_ID;
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
  return withTransaction(db, async (trx) => {
    if (await sets.getSet(trx, input.id))
      throw new HttpError('CONFLICT', `A factor set with the id "${input.id}" already exists.`);
    const source = await sets.getVersion(trx, input.fromId, input.fromVersion ?? 'latest');
    if (!source || source.status !== 'published')
      throw new HttpError('NOT_FOUND', `No published version of "${input.fromId}" to copy.`);
    const document = cloneDocument(source.document, input.id, input.title, input.description);
    await sets.insertSet(trx, {
      id: input.id,
      title: input.title,
      description: input.description,
      origin: 'custom',
      basedOn: { id: source.set_id, version: source.version },
      createdBy: by.id,
    });
    await sets.insertVersion(trx, { setId: input.id, version: 1, status: 'draft', document, by: by.id });
    await recordAudit(trx, {
      actorId: by.id,
      action: 'factor-set.clone',
      entityType: 'factor-set',
      entityId: input.id,
      details: { from: `${source.set_id}@${source.version}`, reason: input.reason },
    });
    return { id: input.id, version: 1 };
  });
}

async function lockDraft(trx: Db, setId: string) {
  const set = await sets.getSet(trx, setId);
  if (!set) throw new HttpError('NOT_FOUND', `No factor set "${setId}".`);
  if (set.origin === 'shipped')
    throw new HttpError('CONFLICT', 'Shipped factor sets are read-only. Copy one to make a country-specific set.');
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
  return withTransaction(db, async (trx) => {
    const set = await sets.getSet(trx, setId);
    if (!set) throw new HttpError('NOT_FOUND', `No factor set "${setId}".`);
    if (set.origin === 'shipped') throw new HttpError('CONFLICT', 'Shipped factor sets are read-only.');
    if (await sets.getVersion(trx, setId, 'draft')) throw new HttpError('CONFLICT', 'This set already has a draft.');
    const latest = await sets.getVersion(trx, setId, 'latest');
    if (!latest) throw new HttpError('CONFLICT', 'This set has no published version to start from.');
    const version = latest.version + 1;
    await sets.insertVersion(trx, {
      setId,
      version,
      status: 'draft',
      document: { ...latest.document, version },
      by: by.id,
    });
    await recordAudit(trx, {
      actorId: by.id,
      action: 'factor-set.draft',
      entityType: 'factor-set',
      entityId: `${setId}@${version}`,
    });
    return { version };
  });
}

export async function publishDraft(by: Caller, setId: string, note: string): Promise<{ version: number }> {
  return withTransaction(db, async (trx) => {
    const draft = await lockDraft(trx, setId);
    factorSetDocumentSchema.parse(draft.document);
    await sets.markPublished(trx, setId, draft.version, by.id, note);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'factor-set.publish',
      entityType: 'factor-set',
      entityId: `${setId}@${draft.version}`,
      details: { note },
    });
    if ((await defaultSetId(trx)) === setId)
      await recomputeScreening(trx, by.id, `Factor set ${setId} version ${draft.version} published`);
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
  await withTransaction(db, async (trx) => {
    if (!(await sets.getVersion(trx, setId, 'latest')))
      throw new HttpError('UNPROCESSABLE_CONTENT', `Factor set "${setId}" has no published version.`, [
        { path: ['id'], message: 'Not published.' },
      ]);
    const before = await defaultSetId(trx);
    await sets.putSetting(trx, DEFAULT_SET_KEY, setId, by.id);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'setting.default-factor-set',
      entityType: 'setting',
      entityId: DEFAULT_SET_KEY,
      details: { before, after: setId },
    });
    if (before !== setId) await recomputeScreening(trx, by.id, `Default factor set changed to ${setId}`);
  });
}

/**
 * Use cases shared by the versioned document sets (factor sets, rule sets): putting the shipped
 * versions into the database, copying a published version into a new custom set, starting a
 * draft from the newest published version and choosing the authority's default. Each set's own
 * service passes its tables, words and document functions; edits and publishing stay there.
 */
import { recordAudit } from '../db/audit';
import { db, withTransaction, type Db } from '../db/client';
import { getSetting, putSetting } from '../db/factor-sets';
import type { BaseVersionRow, VersionedSetTables } from '../db/versioned-sets';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';
import { recomputeScreening } from './screening';

type Doc = { id: string; version: number; title: string; description: string };

export type SetKind<D extends Doc, V extends BaseVersionRow<D>> = {
  /** Audit entity type and action prefix. */
  entity: 'factor-set' | 'rule-set';
  /** In sentences: "factor set". */
  noun: string;
  tables: VersionedSetTables<D, V>;
  /** The setting that names the authority's default set, and the set used while it is unset. */
  defaultKey: string;
  fallbackId: string;
  same: (stored: D, shipped: D) => boolean;
  copy: (doc: D, id: string, title: string, description: string) => D;
};

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/**
 * Puts each shipped version into the database when it is missing. A shipped file whose content
 * changed without a new version number is refused: stored results name that version.
 */
export async function syncShipped<D extends Doc, V extends BaseVersionRow<D>>(
  kind: SetKind<D, V>,
  shipped: readonly D[],
  conn: Db = db,
): Promise<string[]> {
  const { tables } = kind;
  const added: string[] = [];
  await withTransaction(conn, async (trx) => {
    for (const doc of shipped) {
      if (!(await tables.getSet(trx, doc.id)))
        await tables.insertSet(trx, {
          id: doc.id,
          title: doc.title,
          description: doc.description,
          origin: 'shipped',
          createdBy: null,
        });
      const stored = await tables.getVersion(trx, doc.id, doc.version);
      if (stored && !kind.same(stored.document, doc))
        throw new Error(
          `shipped ${kind.noun} ${doc.id} version ${doc.version} differs from the stored one; give the changed file a new version number`,
        );
      if (!stored) {
        await tables.insertVersion(trx, {
          setId: doc.id,
          version: doc.version,
          status: 'published',
          document: doc,
          note: 'Shipped with Swardkeep',
          by: null,
        });
        await recordAudit(trx, {
          actorId: null,
          action: `${kind.entity}.ship`,
          entityType: kind.entity,
          entityId: `${doc.id}@${doc.version}`,
        });
        added.push(`${doc.id}@${doc.version}`);
      }
    }
  });
  return added;
}

export async function defaultId<D extends Doc, V extends BaseVersionRow<D>>(
  kind: SetKind<D, V>,
  conn: Db = db,
): Promise<string> {
  return (await getSetting<string>(conn, kind.defaultKey)) ?? kind.fallbackId;
}

/** Copies a published version into a new custom set whose first version is a draft. */
export async function copySet<D extends Doc, V extends BaseVersionRow<D>>(
  kind: SetKind<D, V>,
  by: Caller,
  input: { fromId: string; fromVersion?: number; id: string; title: string; description: string; reason: string },
): Promise<{ id: string; version: number }> {
  const { tables } = kind;
  return withTransaction(db, async (trx) => {
    if (await tables.getSet(trx, input.id))
      throw new HttpError('CONFLICT', `A ${kind.noun} with the id "${input.id}" already exists.`);
    const source = await tables.getVersion(trx, input.fromId, input.fromVersion ?? 'latest');
    if (!source || source.status !== 'published')
      throw new HttpError('NOT_FOUND', `No published version of ${kind.noun} "${input.fromId}" to copy.`);
    const document = kind.copy(source.document, input.id, input.title, input.description);
    await tables.insertSet(trx, {
      id: input.id,
      title: input.title,
      description: input.description,
      origin: 'custom',
      basedOn: { id: source.set_id, version: source.version },
      createdBy: by.id,
    });
    await tables.insertVersion(trx, { setId: input.id, version: 1, status: 'draft', document, by: by.id });
    await recordAudit(trx, {
      actorId: by.id,
      action: `${kind.entity}.clone`,
      entityType: kind.entity,
      entityId: input.id,
      details: { from: `${source.set_id}@${source.version}`, reason: input.reason },
    });
    return { id: input.id, version: 1 };
  });
}

/** The set, refused when it is shipped (read-only). */
export async function customSet<D extends Doc, V extends BaseVersionRow<D>>(
  kind: SetKind<D, V>,
  trx: Db,
  setId: string,
  readOnly: string,
) {
  const set = await kind.tables.getSet(trx, setId);
  if (!set) throw new HttpError('NOT_FOUND', `No ${kind.noun} "${setId}".`);
  if (set.origin === 'shipped') throw new HttpError('CONFLICT', readOnly);
  return set;
}

/** Starts the next version as a draft copy of the newest published one; one draft per set. */
export async function startDraft<D extends Doc, V extends BaseVersionRow<D>>(
  kind: SetKind<D, V>,
  by: Caller,
  setId: string,
): Promise<{ version: number }> {
  const { tables } = kind;
  return withTransaction(db, async (trx) => {
    await customSet(kind, trx, setId, `Shipped ${kind.noun}s are read-only.`);
    await trx.raw('select pg_advisory_xact_lock(hashtext(?))', [`${kind.entity}:${setId}`]);
    if (await tables.getVersion(trx, setId, 'draft'))
      throw new HttpError('CONFLICT', `This ${kind.noun} already has a draft.`);
    const latest = await tables.getVersion(trx, setId, 'latest');
    if (!latest) throw new HttpError('CONFLICT', `This ${kind.noun} has no published version to start from.`);
    const version = latest.version + 1;
    await tables.insertVersion(trx, {
      setId,
      version,
      status: 'draft',
      document: { ...latest.document, version },
      by: by.id,
    });
    await recordAudit(trx, {
      actorId: by.id,
      action: `${kind.entity}.draft`,
      entityType: kind.entity,
      entityId: `${setId}@${version}`,
    });
    return { version };
  });
}

/** Marks the draft published (in the caller's transaction) and recomputes screening when it is the default set. */
export async function publish<D extends Doc, V extends BaseVersionRow<D>>(
  kind: SetKind<D, V>,
  trx: Db,
  by: Caller,
  draft: V,
  note: string,
): Promise<void> {
  await kind.tables.markPublished(trx, draft.set_id, draft.version, by.id, note);
  await recordAudit(trx, {
    actorId: by.id,
    action: `${kind.entity}.publish`,
    entityType: kind.entity,
    entityId: `${draft.set_id}@${draft.version}`,
    details: { note },
  });
  if ((await defaultId(kind, trx)) === draft.set_id)
    await recomputeScreening(trx, by.id, `${capital(kind.noun)} ${draft.set_id} version ${draft.version} published`);
}

/** Makes a set with a published version the authority's default; screening follows. */
export async function setDefault<D extends Doc, V extends BaseVersionRow<D>>(
  kind: SetKind<D, V>,
  by: Caller,
  setId: string,
): Promise<void> {
  await withTransaction(db, async (trx) => {
    if (!(await kind.tables.getVersion(trx, setId, 'latest')))
      throw new HttpError('UNPROCESSABLE_CONTENT', `${capital(kind.noun)} "${setId}" has no published version.`, [
        { path: ['id'], message: 'Not published.' },
      ]);
    const before = await defaultId(kind, trx);
    await putSetting(trx, kind.defaultKey, setId, by.id);
    await recordAudit(trx, {
      actorId: by.id,
      action: `setting.${kind.defaultKey}`,
      entityType: 'setting',
      entityId: kind.defaultKey,
      details: { before, after: setId },
    });
    if (before !== setId) await recomputeScreening(trx, by.id, `Default ${kind.noun} changed to ${setId}`);
  });
}

/**
 * The tables of a versioned document set (factor sets, rule sets): a set row, numbered versions
 * of which at most one is a draft and the others are published and immutable. Each aggregate's
 * data module builds its functions from this with its own table names and extra columns.
 */
import type { Db } from './client';

export type SetRow = {
  id: string;
  title: string;
  description: string;
  origin: 'shipped' | 'custom';
  based_on_id: string | null;
  based_on_version: number | null;
  created_at: Date;
};

export type BaseVersionRow<D> = {
  set_id: string;
  version: number;
  status: 'draft' | 'published';
  document: D;
  publish_note: string | null;
  published_at: Date | null;
  published_by_name: string | null;
};

export type NewSet = {
  id: string;
  title: string;
  description: string;
  origin: 'shipped' | 'custom';
  basedOn?: { id: string; version: number };
  createdBy: string | null;
};

export type NewVersion<D> = {
  setId: string;
  version: number;
  status: 'draft' | 'published';
  document: D;
  note?: string;
  by: string | null;
};

export type VersionedSetTables<D, V extends BaseVersionRow<D>> = ReturnType<typeof versionedSetTables<D, V>>;

export function versionedSetTables<D, V extends BaseVersionRow<D>>(t: {
  set: string;
  version: string;
  /** Further columns of the version table to read (as `v.name`). */
  extraColumns?: string[];
  /** Whether the version table records who created each version. */
  createdBy?: boolean;
}) {
  const columns = [
    'v.set_id',
    'v.version',
    'v.status',
    'v.document',
    ...(t.extraColumns ?? []),
    'v.publish_note',
    'v.published_at',
    'u.name as published_by_name',
  ];
  const versions = (db: Db) => db(`${t.version} as v`).leftJoin('user as u', 'u.id', 'v.published_by').select(columns);

  return {
    async listSets(db: Db): Promise<SetRow[]> {
      return db(t.set).select('*').orderByRaw("origin = 'custom', id");
    },

    async getSet(db: Db, id: string): Promise<SetRow | null> {
      return (await db(t.set).where({ id }).first()) ?? null;
    },

    async listVersions(db: Db, setId?: string): Promise<V[]> {
      const q = versions(db).orderBy([{ column: 'v.set_id' }, { column: 'v.version', order: 'desc' }]);
      if (setId) q.where('v.set_id', setId);
      return q;
    },

    /** A version by number, the newest published one ('latest') or the draft. */
    async getVersion(
      db: Db,
      setId: string,
      which: number | 'latest' | 'draft',
      opts: { lock?: boolean } = {},
    ): Promise<V | null> {
      const q = versions(db).where('v.set_id', setId);
      if (which === 'draft') q.where('v.status', 'draft');
      else if (which === 'latest') q.where('v.status', 'published').orderBy('v.version', 'desc');
      else q.where('v.version', which);
      if (opts.lock) q.forUpdate('v');
      return (await q.first()) ?? null;
    },

    async insertSet(db: Db, s: NewSet): Promise<void> {
      await db(t.set).insert({
        id: s.id,
        title: s.title,
        description: s.description,
        origin: s.origin,
        based_on_id: s.basedOn?.id ?? null,
        based_on_version: s.basedOn?.version ?? null,
        created_by: s.createdBy,
      });
    },

    async insertVersion(db: Db, v: NewVersion<D>): Promise<void> {
      const published = v.status === 'published';
      await db(t.version).insert({
        set_id: v.setId,
        version: v.version,
        status: v.status,
        document: JSON.stringify(v.document),
        publish_note: published ? (v.note ?? null) : null,
        published_by: published ? v.by : null,
        published_at: published ? db.fn.now() : null,
        ...(t.createdBy ? { created_by: v.by } : {}),
      });
    },

    async markPublished(db: Db, setId: string, version: number, by: string, note: string): Promise<void> {
      await db(t.version)
        .where({ set_id: setId, version, status: 'draft' })
        .update({ status: 'published', published_by: by, published_at: db.fn.now(), publish_note: note });
    },
  };
}

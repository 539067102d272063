/** Read models of factor sets for the API and the admin pages. */
import { diffFactorSets, unconfirmedTables } from '../carbon';
import { db, type Db } from '../db/client';
import * as sets from '../db/factor-sets';
import { HttpError } from '../http/errors';
import { defaultSetId, loadPublished, withStoredConfirmations } from './factor-sets';

export async function listSetSummaries(conn: Db = db) {
  const [rows, versions, def] = await Promise.all([sets.listSets(conn), sets.listVersions(conn), defaultSetId(conn)]);
  const out = [];
  for (const s of rows) {
    const own = versions.filter((v) => v.set_id === s.id);
    const summaries = [];
    for (const v of own) {
      const doc =
        v.status === 'published' ? await withStoredConfirmations(conn, v.document, s.id, v.version) : v.document;
      summaries.push({
        version: v.version,
        status: v.status,
        publishedAt: v.published_at?.toISOString() ?? null,
        publishedBy:
          v.published_by_name ?? (s.origin === 'shipped' && v.status === 'published' ? 'Shipped with Swardkeep' : null),
        note: v.publish_note,
        unconfirmedTables: unconfirmedTables(doc),
      });
    }
    out.push({
      id: s.id,
      title: s.title,
      description: s.description,
      origin: s.origin,
      basedOn: s.based_on_id ? { id: s.based_on_id, version: s.based_on_version! } : null,
      isDefault: s.id === def,
      versions: summaries,
    });
  }
  return out;
}

export async function getSetView(setId: string, which: number | 'draft' | undefined, conn: Db = db) {
  const summary = (await listSetSummaries(conn)).find((s) => s.id === setId);
  if (!summary) throw new HttpError('NOT_FOUND', `No factor set "${setId}".`);
  const row = await sets.getVersion(conn, setId, which ?? 'latest');
  if (!row)
    throw new HttpError('NOT_FOUND', which === 'draft' ? 'This set has no draft.' : `No such version of "${setId}".`);
  const document =
    row.status === 'published' ? await withStoredConfirmations(conn, row.document, setId, row.version) : row.document;
  const edits = (await sets.listEdits(conn, setId)).map((e) => ({
    version: e.version,
    table: e.table_key,
    entry: e.entry_key,
    before: e.before,
    after: e.after,
    reason: e.reason,
    by: e.edited_by_name,
    at: e.edited_at.toISOString(),
  }));
  return { summary, version: row.version, status: row.status, document, edits };
}

function parseRef(ref: string): { id: string; version: number } {
  const at = ref.lastIndexOf('@');
  return { id: ref.slice(0, at), version: Number(ref.slice(at + 1)) };
}

export async function diffVersions(a: string, b: string, conn: Db = db) {
  const ra = parseRef(a);
  const rb = parseRef(b);
  const [da, dbDoc] = await Promise.all([
    loadPublished(conn, ra.id, ra.version),
    loadPublished(conn, rb.id, rb.version),
  ]);
  return { a, b, items: diffFactorSets(da, dbDoc) };
}

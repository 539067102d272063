/** Read models of rule sets for the API and the admin pages. */
import { db, type Db } from '../db/client';
import * as rs from '../db/rule-sets';
import { HttpError } from '../http/errors';
import { diffRuleSets, ruleSetDocumentSchema } from '../rules';
import { defaultRuleSetId } from './rule-sets';

export async function listRuleSetSummaries(conn: Db = db) {
  const [sets, versions, def] = await Promise.all([
    rs.listRuleSets(conn),
    rs.listRuleSetVersions(conn),
    defaultRuleSetId(conn),
  ]);
  return sets.map((s) => ({
    id: s.id,
    title: s.title,
    description: s.description,
    origin: s.origin,
    basedOn: s.based_on_id ? { id: s.based_on_id, version: s.based_on_version! } : null,
    isDefault: s.id === def,
    versions: versions
      .filter((v) => v.set_id === s.id)
      .map((v) => ({
        version: v.version,
        status: v.status,
        revision: v.revision,
        ruleCount: v.document.rules.length,
        publishedAt: v.published_at?.toISOString() ?? null,
        publishedBy: v.published_by_name,
        note: v.publish_note,
      })),
  }));
}

export async function getRuleSetView(setId: string, which: number | 'draft' | undefined, conn: Db = db) {
  const summary = (await listRuleSetSummaries(conn)).find((s) => s.id === setId);
  if (!summary) throw new HttpError('NOT_FOUND', `No rule set "${setId}".`);
  const row = await rs.getRuleSetVersion(conn, setId, which ?? 'latest');
  if (!row)
    throw new HttpError(
      'NOT_FOUND',
      which === 'draft' ? 'This rule set has no draft.' : `No such version of rule set "${setId}".`,
    );
  const edits = (await rs.listRuleEdits(conn, setId)).map((e) => ({
    version: e.version,
    rule: e.rule_id,
    action: e.action,
    before: e.before,
    after: e.after,
    reason: e.reason,
    by: e.edited_by_name,
    at: e.edited_at.toISOString(),
  }));
  return {
    summary,
    version: row.version,
    status: row.status,
    revision: row.revision,
    document: ruleSetDocumentSchema.parse(row.document),
    edits,
  };
}

/** "id@3" or "id@draft" → its parts. */
export function parseVersionRef(ref: string): { id: string; version: number | 'draft' } {
  const at = ref.lastIndexOf('@');
  const v = ref.slice(at + 1);
  return { id: ref.slice(0, at), version: v === 'draft' ? 'draft' : Number(v) };
}

export async function diffRuleSetVersions(a: string, b: string, conn: Db = db) {
  const load = async (ref: string) => {
    const { id, version } = parseVersionRef(ref);
    const row = await rs.getRuleSetVersion(conn, id, version);
    if (!row) throw new HttpError('NOT_FOUND', `No version ${ref} of a rule set.`);
    return ruleSetDocumentSchema.parse(row.document);
  };
  const [da, dbDoc] = await Promise.all([load(a), load(b)]);
  return { a, b, items: diffRuleSets(da, dbDoc) };
}

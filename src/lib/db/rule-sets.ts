/** Rule sets, their versions and the edits of drafts (server-only). */
import type { Rule, RuleSetDocument } from '../rules';
import type { Db } from './client';

export type RuleSetRow = {
  id: string;
  title: string;
  description: string;
  origin: 'shipped' | 'custom';
  based_on_id: string | null;
  based_on_version: number | null;
  created_at: Date;
};
export type RuleSetVersionRow = {
  set_id: string;
  version: number;
  status: 'draft' | 'published';
  document: RuleSetDocument;
  revision: number;
  publish_note: string | null;
  published_at: Date | null;
  published_by_name: string | null;
};
export type RuleEditRow = {
  version: number;
  rule_id: string;
  action: 'put' | 'remove';
  before: Rule | null;
  after: Rule | null;
  reason: string;
  edited_by_name: string | null;
  edited_at: Date;
};

const VERSION_COLUMNS = [
  'v.set_id',
  'v.version',
  'v.status',
  'v.document',
  'v.revision',
  'v.publish_note',
  'v.published_at',
  'u.name as published_by_name',
];

export async function listRuleSets(db: Db): Promise<RuleSetRow[]> {
  return db('rule_set').select('*').orderByRaw("origin = 'custom', id");
}

export async function getRuleSet(db: Db, id: string): Promise<RuleSetRow | null> {
  return (await db('rule_set').where({ id }).first()) ?? null;
}

export async function listRuleSetVersions(db: Db): Promise<RuleSetVersionRow[]> {
  return db('rule_set_version as v')
    .leftJoin('user as u', 'u.id', 'v.published_by')
    .select(VERSION_COLUMNS)
    .orderBy([{ column: 'v.set_id' }, { column: 'v.version', order: 'desc' }]);
}

/** A version by number, the newest published one ('latest') or the draft. */
export async function getRuleSetVersion(
  db: Db,
  setId: string,
  which: number | 'latest' | 'draft',
  opts: { lock?: boolean } = {},
): Promise<RuleSetVersionRow | null> {
  const q = db('rule_set_version as v')
    .leftJoin('user as u', 'u.id', 'v.published_by')
    .select(VERSION_COLUMNS)
    .where('v.set_id', setId);
  if (which === 'draft') q.where('v.status', 'draft');
  else if (which === 'latest') q.where('v.status', 'published').orderBy('v.version', 'desc');
  else q.where('v.version', which);
  if (opts.lock) q.forUpdate('v');
  return (await q.first()) ?? null;
}

export async function insertRuleSet(
  db: Db,
  s: {
    id: string;
    title: string;
    description: string;
    origin: 'shipped' | 'custom';
    basedOn?: { id: string; version: number };
    createdBy: string | null;
  },
): Promise<void> {
  await db('rule_set').insert({
    id: s.id,
    title: s.title,
    description: s.description,
    origin: s.origin,
    based_on_id: s.basedOn?.id ?? null,
    based_on_version: s.basedOn?.version ?? null,
    created_by: s.createdBy,
  });
}

export async function insertRuleSetVersion(
  db: Db,
  v: {
    setId: string;
    version: number;
    status: 'draft' | 'published';
    document: RuleSetDocument;
    note?: string;
    by: string | null;
  },
): Promise<void> {
  const published = v.status === 'published';
  await db('rule_set_version').insert({
    set_id: v.setId,
    version: v.version,
    status: v.status,
    document: JSON.stringify(v.document),
    publish_note: published ? (v.note ?? null) : null,
    published_by: published ? v.by : null,
    published_at: published ? db.fn.now() : null,
    created_by: v.by,
  });
}

/** Replaces the draft's document if its revision is still `revision`; returns the new revision or null when stale. */
export async function updateDraft(
  db: Db,
  setId: string,
  revision: number,
  document: RuleSetDocument,
): Promise<number | null> {
  const rows = await db('rule_set_version')
    .where({ set_id: setId, status: 'draft', revision })
    .update({ document: JSON.stringify(document), revision: revision + 1 }, ['revision']);
  return rows[0]?.revision ?? null;
}

export async function markRuleSetPublished(
  db: Db,
  setId: string,
  version: number,
  by: string,
  note: string,
): Promise<void> {
  await db('rule_set_version')
    .where({ set_id: setId, version, status: 'draft' })
    .update({ status: 'published', published_by: by, published_at: db.fn.now(), publish_note: note });
}

export async function insertRuleEdit(
  db: Db,
  e: {
    setId: string;
    version: number;
    ruleId: string;
    action: 'put' | 'remove';
    before: Rule | null;
    after: Rule | null;
    reason: string;
    by: string;
  },
): Promise<void> {
  await db('rule_edit').insert({
    set_id: e.setId,
    version: e.version,
    rule_id: e.ruleId,
    action: e.action,
    before: e.before === null ? null : JSON.stringify(e.before),
    after: e.after === null ? null : JSON.stringify(e.after),
    reason: e.reason,
    edited_by: e.by,
  });
}

export async function listRuleEdits(db: Db, setId: string): Promise<RuleEditRow[]> {
  return db('rule_edit as e')
    .leftJoin('user as u', 'u.id', 'e.edited_by')
    .select(
      'e.version',
      'e.rule_id',
      'e.action',
      'e.before',
      'e.after',
      'e.reason',
      'u.name as edited_by_name',
      'e.edited_at',
    )
    .where('e.set_id', setId)
    .orderBy('e.id', 'desc');
}

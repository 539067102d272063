/** Rule sets, their versions and the edits of drafts (server-only). */
import type { Rule, RuleSetDocument } from '../rules';
import type { Db } from './client';
import { versionedSetTables, type BaseVersionRow, type SetRow } from './versioned-sets';

export type RuleSetRow = SetRow;
export type RuleSetVersionRow = BaseVersionRow<RuleSetDocument> & { revision: number };
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

export const ruleSetTables = versionedSetTables<RuleSetDocument, RuleSetVersionRow>({
  set: 'rule_set',
  version: 'rule_set_version',
  extraColumns: ['v.revision'],
  createdBy: true,
});
export const {
  listSets: listRuleSets,
  getSet: getRuleSet,
  listVersions: listRuleSetVersions,
  getVersion: getRuleSetVersion,
  insertSet: insertRuleSet,
  insertVersion: insertRuleSetVersion,
  markPublished: markRuleSetPublished,
} = ruleSetTables;

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

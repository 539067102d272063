/** Rule-set use cases: shipping the built-in set, loading for grading, cloning, editing drafts, publishing, the default. */
import { recordAudit } from '../db/audit';
import { db, withTransaction, type Db } from '../db/client';
import * as rs from '../db/rule-sets';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';
import {
  BUILT_IN_RULE_SETS,
  DEFAULT_RULE_SET_ID,
  ruleSetDocumentSchema,
  sameJson,
  type RuleSetDocument,
} from '../rules';
import {
  copySet,
  customSet,
  defaultId,
  publish,
  setDefault,
  startDraft,
  syncShipped,
  type SetKind,
} from './versioned-sets';
import { cloneRuleSetDocument, RuleEditError, withRuleChange, type RuleChange } from '../rules/edit';

export const DEFAULT_RULE_SET_KEY = 'default-rule-set';

const RULE_SETS: SetKind<RuleSetDocument, rs.RuleSetVersionRow> = {
  entity: 'rule-set',
  noun: 'rule set',
  tables: rs.ruleSetTables,
  defaultKey: DEFAULT_RULE_SET_KEY,
  fallbackId: DEFAULT_RULE_SET_ID,
  // Stored and shipped documents are compared in canonical JSON (jsonb does not keep key order).
  same: sameJson,
  copy: cloneRuleSetDocument,
};

/** Puts the shipped rule sets' missing versions into the database (versioned-sets.ts). */
export async function syncShippedRuleSets(conn: Db = db): Promise<string[]> {
  return syncShipped(RULE_SETS, BUILT_IN_RULE_SETS, conn);
}

export async function defaultRuleSetId(conn: Db = db): Promise<string> {
  return defaultId(RULE_SETS, conn);
}

/**
 * The published rule set to grade with: the given id (else the authority's default), the given
 * version (else the newest published). 422 when there is no such published version.
 */
export async function loadRuleSet(
  conn: Db,
  id?: string,
  version?: number,
): Promise<{ document: RuleSetDocument; ref: { id: string; version: number } }> {
  const setId = id ?? (await defaultRuleSetId(conn));
  const row = await rs.getRuleSetVersion(conn, setId, version ?? 'latest');
  if (!row || row.status !== 'published') {
    const what = version ? `version ${version} of rule set "${setId}"` : `rule set "${setId}"`;
    throw new HttpError('UNPROCESSABLE_CONTENT', `There is no published ${what}.`, [
      { path: ['ruleSet'], message: `Unknown or unpublished ${what}.` },
    ]);
  }
  return { document: ruleSetDocumentSchema.parse(row.document), ref: { id: row.set_id, version: row.version } };
}

export async function cloneRuleSet(
  by: Caller,
  input: { fromId: string; fromVersion?: number; id: string; title: string; description: string; reason: string },
): Promise<{ id: string; version: number; revision: number }> {
  return { ...(await copySet(RULE_SETS, by, input)), revision: 1 };
}

async function lockDraft(trx: Db, setId: string, revision: number) {
  await customSet(RULE_SETS, trx, setId, 'Shipped rule sets are read-only. Copy one to change its rules.');
  const draft = await rs.getRuleSetVersion(trx, setId, 'draft', { lock: true });
  if (!draft)
    throw new HttpError('CONFLICT', 'This rule set has no draft. Start a new draft from its latest version first.');
  if (draft.revision !== revision)
    throw new HttpError(
      'CONFLICT',
      `Someone else changed this draft (revision ${draft.revision}, you had ${revision}); reload it and make your change again.`,
    );
  return draft;
}

export async function startRuleDraft(by: Caller, setId: string): Promise<{ version: number; revision: number }> {
  return { ...(await startDraft(RULE_SETS, by, setId)), revision: 1 };
}

export async function editRuleDraft(
  by: Caller,
  setId: string,
  input: RuleChange & { reason: string; revision: number },
): Promise<{ version: number; revision: number }> {
  return withTransaction(db, async (trx) => {
    const draft = await lockDraft(trx, setId, input.revision);
    let result;
    try {
      result = withRuleChange(draft.document, input);
    } catch (err) {
      if (err instanceof RuleEditError) throw new HttpError('UNPROCESSABLE_CONTENT', err.message, err.issues);
      throw err;
    }
    const revision = await rs.updateDraft(trx, setId, draft.revision, result.document);
    if (revision === null)
      throw new HttpError('CONFLICT', 'Someone else changed this draft; reload it and make your change again.');
    await rs.insertRuleEdit(trx, {
      setId,
      version: draft.version,
      ruleId: input.ruleId,
      action: input.action,
      before: result.before,
      after: result.after,
      reason: input.reason,
      by: by.id,
    });
    await recordAudit(trx, {
      actorId: by.id,
      action: 'rule-set.edit',
      entityType: 'rule-set',
      entityId: `${setId}@${draft.version}`,
      details: {
        rule: input.ruleId,
        action: input.action,
        before: result.before,
        after: result.after,
        reason: input.reason,
      },
    });
    return { version: draft.version, revision };
  });
}

export async function publishRuleDraft(
  by: Caller,
  setId: string,
  input: { note: string; revision: number },
): Promise<{ version: number }> {
  return withTransaction(db, async (trx) => {
    const draft = await lockDraft(trx, setId, input.revision);
    ruleSetDocumentSchema.parse(draft.document);
    await publish(RULE_SETS, trx, by, draft, input.note);
    return { version: draft.version };
  });
}

export async function setDefaultRuleSet(by: Caller, setId: string): Promise<void> {
  await setDefault(RULE_SETS, by, setId);
}

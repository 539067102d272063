/** Rule-set use cases: shipping the built-in set, loading for grading, cloning, editing drafts, publishing, the default. */
import { recordAudit } from '../db/audit';
import { recomputeScreening } from './screening';
import { db, withTransaction, type Db } from '../db/client';
import { getSetting, putSetting } from '../db/factor-sets';
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
import { cloneRuleSetDocument, RuleEditError, withRuleChange, type RuleChange } from '../rules/edit';

export const DEFAULT_RULE_SET_KEY = 'default-rule-set';

/**
 * Puts each shipped rule set's version into the database when missing. Stored and shipped
 * documents are compared in canonical JSON (jsonb does not keep key order). A shipped file
 * changed without a new version number is refused: signed assessments name that version.
 */
export async function syncShippedRuleSets(conn: Db = db): Promise<string[]> {
  const added: string[] = [];
  await withTransaction(conn, async (trx) => {
    for (const doc of BUILT_IN_RULE_SETS) {
      if (!(await rs.getRuleSet(trx, doc.id)))
        await rs.insertRuleSet(trx, {
          id: doc.id,
          title: doc.title,
          description: doc.description,
          origin: 'shipped',
          createdBy: null,
        });
      const stored = await rs.getRuleSetVersion(trx, doc.id, doc.version);
      if (stored && !sameJson(stored.document, doc))
        throw new Error(
          `shipped rule set ${doc.id} version ${doc.version} differs from the stored one; give the changed file a new version number`,
        );
      if (!stored) {
        await rs.insertRuleSetVersion(trx, {
          setId: doc.id,
          version: doc.version,
          status: 'published',
          document: doc,
          note: 'Shipped with Swardkeep',
          by: null,
        });
        await recordAudit(trx, {
          actorId: null,
          action: 'rule-set.ship',
          entityType: 'rule-set',
          entityId: `${doc.id}@${doc.version}`,
        });
        added.push(`${doc.id}@${doc.version}`);
      }
    }
  });
  return added;
}

export async function defaultRuleSetId(conn: Db = db): Promise<string> {
  return (await getSetting<string>(conn, DEFAULT_RULE_SET_KEY)) ?? DEFAULT_RULE_SET_ID;
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
  return withTransaction(db, async (trx) => {
    if (await rs.getRuleSet(trx, input.id))
      throw new HttpError('CONFLICT', `A rule set with the id "${input.id}" already exists.`);
    const source = await rs.getRuleSetVersion(trx, input.fromId, input.fromVersion ?? 'latest');
    if (!source || source.status !== 'published')
      throw new HttpError('NOT_FOUND', `No published version of rule set "${input.fromId}" to copy.`);
    const document = cloneRuleSetDocument(source.document, input.id, input.title, input.description);
    await rs.insertRuleSet(trx, {
      id: input.id,
      title: input.title,
      description: input.description,
      origin: 'custom',
      basedOn: { id: source.set_id, version: source.version },
      createdBy: by.id,
    });
    await rs.insertRuleSetVersion(trx, { setId: input.id, version: 1, status: 'draft', document, by: by.id });
    await recordAudit(trx, {
      actorId: by.id,
      action: 'rule-set.clone',
      entityType: 'rule-set',
      entityId: input.id,
      details: { from: `${source.set_id}@${source.version}`, reason: input.reason },
    });
    return { id: input.id, version: 1, revision: 1 };
  });
}

async function customSet(trx: Db, setId: string) {
  const set = await rs.getRuleSet(trx, setId);
  if (!set) throw new HttpError('NOT_FOUND', `No rule set "${setId}".`);
  if (set.origin === 'shipped')
    throw new HttpError('CONFLICT', 'Shipped rule sets are read-only. Copy one to change its rules.');
  return set;
}

async function lockDraft(trx: Db, setId: string, revision: number) {
  await customSet(trx, setId);
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
  return withTransaction(db, async (trx) => {
    await customSet(trx, setId);
    await trx.raw('select pg_advisory_xact_lock(hashtext(?))', [`rule-set:${setId}`]);
    if (await rs.getRuleSetVersion(trx, setId, 'draft'))
      throw new HttpError('CONFLICT', 'This rule set already has a draft.');
    const latest = await rs.getRuleSetVersion(trx, setId, 'latest');
    if (!latest) throw new HttpError('CONFLICT', 'This rule set has no published version to start from.');
    const version = latest.version + 1;
    await rs.insertRuleSetVersion(trx, {
      setId,
      version,
      status: 'draft',
      document: { ...latest.document, version },
      by: by.id,
    });
    await recordAudit(trx, {
      actorId: by.id,
      action: 'rule-set.draft',
      entityType: 'rule-set',
      entityId: `${setId}@${version}`,
    });
    return { version, revision: 1 };
  });
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
    await rs.markRuleSetPublished(trx, setId, draft.version, by.id, input.note);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'rule-set.publish',
      entityType: 'rule-set',
      entityId: `${setId}@${draft.version}`,
      details: { note: input.note },
    });
    if ((await defaultRuleSetId(trx)) === setId)
      await recomputeScreening(trx, by.id, `Rule set ${setId} version ${draft.version} published`);
    return { version: draft.version };
  });
}

export async function setDefaultRuleSet(by: Caller, setId: string): Promise<void> {
  await withTransaction(db, async (trx) => {
    if (!(await rs.getRuleSetVersion(trx, setId, 'latest')))
      throw new HttpError('UNPROCESSABLE_CONTENT', `Rule set "${setId}" has no published version.`, [
        { path: ['id'], message: 'Not published.' },
      ]);
    const before = await defaultRuleSetId(trx);
    await putSetting(trx, DEFAULT_RULE_SET_KEY, setId, by.id);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'setting.default-rule-set',
      entityType: 'setting',
      entityId: DEFAULT_RULE_SET_KEY,
      details: { before, after: setId },
    });
    if (before !== setId) await recomputeScreening(trx, by.id, `Default rule set changed to ${setId}`);
  });
}

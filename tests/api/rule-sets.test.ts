/** Rule sets as data: the shipped set read-only, a copy edited with reasons, published immutably, diffed, chosen as default; who may do what. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TARROW_SCREENING } from '~/lib/rules';
import { loadRuleSet, syncShippedRuleSets } from '~/lib/services/rule-sets';
import { testDb } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';

let admin: Session;
let assessor: Session;
let board: Session;
let planner: Session;
const id = `tarrow-strict-${Date.now().toString(36)}`;
let revision = 0;

beforeAll(async () => {
  [admin, assessor, board, planner] = await Promise.all([
    signIn(DEMO.admin),
    signIn(DEMO.assessor),
    signIn(DEMO.board),
    signIn(DEMO.planner),
  ]);
});
afterAll(async () => {
  await testDb('app_setting').where({ key: 'default-rule-set' }).delete();
  await testDb.destroy();
});

const holdingRule = async (ref: string) => {
  const res = await api('GET', `/api/rule-sets/${ref}`, { session: admin });
  return res.body.document.rules.find((r: { id: string }) => r.id === 'holding-cumulative-2ha');
};

describe('the shipped set', () => {
  it('is listed as the default, readable by assessor and board, not by planners', async () => {
    const res = await api('GET', '/api/rule-sets', { session: board });
    expect(res.status).toBe(200);
    const s = res.body.items.find((x: { id: string }) => x.id === 'tarrow-screening');
    expect(s).toMatchObject({
      origin: 'shipped',
      isDefault: true,
      versions: [{ version: 1, status: 'published', ruleCount: 11 }],
    });
    expect((await api('GET', '/api/rule-sets/tarrow-screening', { session: assessor })).status).toBe(200);
    expect((await api('GET', '/api/rule-sets', { session: planner })).status).toBe(403);
    expect((await api('GET', '/api/rule-sets')).status).toBe(401);
  });

  it('shows each rule with its citation and thresholds', async () => {
    const res = await api('GET', '/api/rule-sets/tarrow-screening', { session: assessor });
    const gate = res.body.document.rules.find((r: { id: string }) => r.id === 'sensitive-grassland');
    // Reg. (EU) 2021/2115 Annex III GAEC 9 (per the issue text, recalled from memory).
    expect(gate).toMatchObject({
      gate: true,
      level: 4,
      params: { aboveShare: 0 },
      citation: { source: 'Regulation (EU) 2021/2115' },
    });
    expect(gate.citation.article).toMatch(/GAEC 9/);
  });

  it('is read-only', async () => {
    expect((await api('POST', '/api/rule-sets/tarrow-screening/draft', { session: admin })).status).toBe(409);
  });
});

describe('a copy edited, published and diffed', () => {
  it('only admins copy a set', async () => {
    const body = {
      from: { id: 'tarrow-screening' },
      id,
      title: 'Upper Tarrow stricter rules',
      description: 'A 7-year window for adding conversions up',
      reason: 'Board asked for a longer look-back on holdings.',
    };
    expect((await api('POST', '/api/rule-sets', { session: assessor, body })).status).toBe(403);
    const res = await api('POST', '/api/rule-sets', { session: admin, body });
    expect(res.status).toBe(201);
    expect(res.body).toEqual({ id, version: 1, revision: 1 });
    revision = 1;
  });

  it('refuses an edit without a reason, and leaves the draft as it was', async () => {
    const rule = { ...(await holdingRule(`${id}?version=draft`)), params: { atLeastHa: 2, windowYears: 7 } };
    const res = await api('PATCH', `/api/rule-sets/${id}/draft`, {
      session: admin,
      body: { action: 'put', ruleId: rule.id, rule, reason: '', revision },
    });
    expect(res.status).toBe(422);
    expect(res.body.error.issues[0].path).toEqual(['reason']);
    const view = await api('GET', `/api/rule-sets/${id}?version=draft`, { session: admin });
    expect(view.body.revision).toBe(1);
    expect((await holdingRule(`${id}?version=draft`)).params.windowYears).toBe(5);
  });

  it('refuses an invalid rule (a gate below level 4) with the field named', async () => {
    const rule = { ...(await holdingRule(`${id}?version=draft`)), gate: true };
    const res = await api('PATCH', `/api/rule-sets/${id}/draft`, {
      session: admin,
      body: { action: 'put', ruleId: rule.id, rule, reason: 'Trying to make it a gate', revision },
    });
    expect(res.status).toBe(422);
    expect(res.body.error.issues.map((i: { path: string[] }) => i.path.join('.'))).toContain('rule.level');
  });

  it('records an edit with its reason; a stale revision gets 409 and changes nothing', async () => {
    const rule = { ...(await holdingRule(`${id}?version=draft`)), params: { atLeastHa: 2, windowYears: 7 } };
    const ok = await api('PATCH', `/api/rule-sets/${id}/draft`, {
      session: admin,
      body: { action: 'put', ruleId: rule.id, rule, reason: 'Board minute 2026/14: seven-year look-back', revision },
    });
    expect(ok.status).toBe(200);
    expect(ok.body).toEqual({ version: 1, revision: 2 });
    const stale = await api('PATCH', `/api/rule-sets/${id}/draft`, {
      session: admin,
      body: {
        action: 'put',
        ruleId: rule.id,
        rule: { ...rule, params: { atLeastHa: 1, windowYears: 7 } },
        reason: 'An edit made on an old copy',
        revision,
      },
    });
    expect(stale.status).toBe(409);
    expect(stale.body.error.message).toMatch(/Someone else changed/);
    revision = 2;
    expect((await holdingRule(`${id}?version=draft`)).params).toEqual({ atLeastHa: 2, windowYears: 7 });
    const audit = await testDb('audit_event').where({ action: 'rule-set.edit', entity_id: `${id}@1` });
    expect(audit).toHaveLength(1);
    expect(audit[0].details.reason).toMatch(/seven-year/);
    const view = await api('GET', `/api/rule-sets/${id}?version=draft`, { session: admin });
    expect(view.body.edits[0]).toMatchObject({
      rule: 'holding-cumulative-2ha',
      action: 'put',
      reason: expect.stringMatching(/seven-year/),
    });
  });

  it('only admins edit and publish', async () => {
    expect(
      (
        await api('POST', `/api/rule-sets/${id}/publish`, {
          session: assessor,
          body: { note: 'Seven-year window', revision },
        })
      ).status,
    ).toBe(403);
    expect(
      (
        await api('PATCH', `/api/rule-sets/${id}/draft`, {
          session: board,
          body: { action: 'remove', ruleId: 'co2e-500', reason: 'Not allowed for board', revision },
        })
      ).status,
    ).toBe(403);
  });

  it('publishes with the revision read; then the version is immutable', async () => {
    expect(
      (
        await api('POST', `/api/rule-sets/${id}/publish`, {
          session: admin,
          body: { note: 'Seven-year window', revision: 1 },
        })
      ).status,
    ).toBe(409);
    const pub = await api('POST', `/api/rule-sets/${id}/publish`, {
      session: admin,
      body: { note: 'Seven-year window', revision },
    });
    expect(pub.status).toBe(200);
    expect(pub.body).toEqual({ version: 1 });
    const edit = await api('PATCH', `/api/rule-sets/${id}/draft`, {
      session: admin,
      body: { action: 'remove', ruleId: 'co2e-500', reason: 'Try to change a published version', revision },
    });
    expect(edit.status).toBe(409);
    expect(edit.body.error.message).toMatch(/no draft/);
  });

  it('the database itself refuses to change or delete a published version', async () => {
    await expect(
      testDb.raw(
        `update rule_set_version set document = jsonb_set(document, '{title}', '"Changed behind the app"') where set_id = ? and version = 1`,
        [id],
      ),
    ).rejects.toThrow(/published and cannot be changed/);
    await expect(
      testDb.raw(`update rule_set_version set status = 'draft' where set_id = ? and version = 1`, [id]),
    ).rejects.toThrow(/published and cannot be changed/);
    await expect(testDb.raw('delete from rule_set_version where set_id = ? and version = 1', [id])).rejects.toThrow(
      /cannot be deleted/,
    );
    expect((await holdingRule(id)).params.windowYears).toBe(7);
  });

  it('the diff shows exactly the change', async () => {
    const res = await api('GET', `/api/rule-sets/diff?a=tarrow-screening@1&b=${id}@1`, { session: board });
    expect(res.status).toBe(200);
    expect(res.body.items).toHaveLength(1);
    expect(res.body.items[0]).toMatchObject({
      rule: 'holding-cumulative-2ha',
      presence: 'both',
      changed: ['params'],
      a: { params: { windowYears: 5 } },
      b: { params: { windowYears: 7 } },
    });
  });

  it('a new draft removes a rule; the diff of draft against published shows it', async () => {
    const draft = await api('POST', `/api/rule-sets/${id}/draft`, { session: admin });
    expect(draft.body).toEqual({ version: 2, revision: 1 });
    const rm = await api('PATCH', `/api/rule-sets/${id}/draft`, {
      session: admin,
      body: { action: 'remove', ruleId: 'co2e-500', reason: 'Covered by the budget-share rules now', revision: 1 },
    });
    expect(rm.status).toBe(200);
    const diff = await api('GET', `/api/rule-sets/diff?a=${id}@1&b=${id}@draft`, { session: admin });
    expect(diff.body.items.map((i: { rule: string; presence: string }) => [i.rule, i.presence])).toEqual([
      ['co2e-500', 'only-a'],
    ]);
  });

  it('the default is chosen by an admin, only among published sets', async () => {
    expect((await api('PUT', '/api/settings/default-rule-set', { session: assessor, body: { id } })).status).toBe(403);
    expect(
      (await api('PUT', '/api/settings/default-rule-set', { session: admin, body: { id: 'no-such-set' } })).status,
    ).toBe(422);
    expect((await api('PUT', '/api/settings/default-rule-set', { session: admin, body: { id } })).status).toBe(204);
    const list = await api('GET', '/api/rule-sets', { session: admin });
    expect(list.body.items.find((s: { id: string }) => s.id === id).isDefault).toBe(true);
    expect(
      (await api('PUT', '/api/settings/default-rule-set', { session: admin, body: { id: 'tarrow-screening' } })).status,
    ).toBe(204);
  });
});

describe('syncing the shipped set (what npm run migrate does after the migrations)', () => {
  it('twice in a row changes nothing: stored jsonb and shipped file are compared in canonical JSON', async () => {
    const stored = (await testDb('rule_set_version').where({ set_id: 'tarrow-screening', version: 1 }).first())
      .document;
    // jsonb gives keys back in its own order, so a plain JSON.stringify comparison would see a change.
    expect(JSON.stringify(stored)).not.toBe(JSON.stringify(TARROW_SCREENING));
    expect(await syncShippedRuleSets(testDb)).toEqual([]);
    expect(await syncShippedRuleSets(testDb)).toEqual([]);
    const count = async (q: ReturnType<typeof testDb>) =>
      Number(((await q.count('* as n').first()) as unknown as { n: number | string }).n);
    expect(await count(testDb('rule_set_version').where({ set_id: 'tarrow-screening' }))).toBe(1);
    expect(await count(testDb('audit_event').where({ action: 'rule-set.ship' }))).toBe(1);
  });

  it('refuses a shipped document changed without a new version number', async () => {
    const trx = await testDb.transaction();
    let outcome: unknown;
    try {
      await trx.raw('alter table rule_set_version disable trigger rule_set_version_immutable');
      await trx('rule_set_version')
        .where({ set_id: 'tarrow-screening', version: 1 })
        .update({ document: JSON.stringify({ ...TARROW_SCREENING, title: 'Edited in place' }) });
      outcome = await syncShippedRuleSets(trx).catch((err: Error) => err);
    } finally {
      await trx.rollback();
    }
    expect(outcome).toBeInstanceOf(Error);
    expect((outcome as Error).message).toMatch(/differs from the stored one/);
    expect(await syncShippedRuleSets(testDb)).toEqual([]);
  });
});

describe('loadRuleSet (what assessments grade with)', () => {
  it('gives the default set, newest published, or a pinned version; never an unpublished one', async () => {
    const def = await loadRuleSet(testDb);
    expect(def.ref).toEqual({ id: 'tarrow-screening', version: 1 });
    expect(def.document.rules).toHaveLength(11);
    expect((await loadRuleSet(testDb, id)).ref).toEqual({ id, version: 1 });
    expect(
      (await loadRuleSet(testDb, id, 1)).document.rules.find((r) => r.id === 'holding-cumulative-2ha')!.params,
    ).toEqual({ atLeastHa: 2, windowYears: 7 });
    await expect(loadRuleSet(testDb, id, 2)).rejects.toMatchObject({ status: 422 });
    await expect(loadRuleSet(testDb, 'no-such-set')).rejects.toThrow(/no published rule set "no-such-set"/);
  });
});

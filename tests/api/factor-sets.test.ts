/** Factor sets as data: shipped read-only sets, a country-specific copy edited with reasons, published, confirmed and diffed. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { WORKED_EXAMPLES } from '../fixtures/worked-examples';
import { testDb } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';

let admin: Session;
let assessor: Session;
const id = `tarrow-tier2-${Date.now().toString(36)}`;
// Worked example 1 (warm temperate moist, HAC): SOC_REF 88 t C/ha, IPCC 2006 Vol 4 Ch 2 Table 2.3.
const we1 = WORKED_EXAMPLES[0]!.request;

beforeAll(async () => {
  admin = await signIn(DEMO.admin);
  assessor = await signIn(DEMO.assessor);
});
afterAll(() => testDb.destroy());

describe('shipped sets', () => {
  it('both IPCC sets are listed, 2006 as the default, with their unconfirmed tables named', async () => {
    const res = await api('GET', '/api/factor-sets', { session: assessor });
    const ids = res.body.items.map((s: { id: string }) => s.id);
    expect(ids).toEqual(expect.arrayContaining(['ipcc-2006', 'ipcc-2019']));
    const s2006 = res.body.items.find((s: { id: string }) => s.id === 'ipcc-2006');
    expect(s2006.isDefault).toBe(true);
    expect(s2006.origin).toBe('shipped');
    expect(s2006.versions[0].unconfirmedTables).toContain('soc-ref');
  });

  it('a table shows its source', async () => {
    const res = await api('GET', '/api/factor-sets/ipcc-2006', { session: assessor });
    const soc = res.body.document.tables.find((t: { key: string }) => t.key === 'soc-ref');
    expect(soc.source.table).toBe('Table 2.3');
    expect(soc.source.document).toMatch(/2006 IPCC Guidelines/);
  });

  it('shipped sets are read-only', async () => {
    const res = await api('POST', '/api/factor-sets/ipcc-2006/draft', { session: admin });
    expect(res.status).toBe(409);
  });
});

describe('a country-specific set', () => {
  it('is cloned by an admin as a draft, and cannot be used until published', async () => {
    const res = await api('POST', '/api/factor-sets', {
      session: admin,
      body: {
        from: { id: 'ipcc-2006' },
        id,
        title: 'Upper Tarrow Tier 2',
        description: 'Regional soil survey stocks',
        reason: 'Regional soil survey of 2025 gives local reference stocks.',
      },
    });
    expect(res.status).toBe(201);
    expect(res.body).toEqual({ id, version: 1 });
    const est = await api('POST', '/api/estimates', { session: assessor, body: { ...we1, factorSet: id } });
    expect(est.status).toBe(422);
    expect(est.body.error.issues[0].path).toEqual(['factorSet']);
  });

  it('refuses an edit without a reason, and one of a not-applicable cell', async () => {
    const noReason = await api('PATCH', `/api/factor-sets/${id}/draft`, {
      session: admin,
      body: { tableKey: 'soc-ref', entryKey: 'warm-temperate-moist/hac', value: 92, reason: '' },
    });
    expect(noReason.status).toBe(422);
    expect(noReason.body.error.issues[0].path).toEqual(['reason']);
    const na = await api('PATCH', `/api/factor-sets/${id}/draft`, {
      session: admin,
      body: { tableKey: 'soc-ref', entryKey: 'polar/hac', value: 10, reason: 'Trying a cell with no value' },
    });
    expect(na.status).toBe(422);
    expect(na.body.error.message).toMatch(/not applicable/);
  });

  it('records an edit with its reason, publishes, and computes with the new value', async () => {
    const edit = await api('PATCH', `/api/factor-sets/${id}/draft`, {
      session: admin,
      body: {
        tableKey: 'soc-ref',
        entryKey: 'warm-temperate-moist/hac',
        value: 100,
        reason: 'Tarrow soil survey 2025, 212 cores, mean 0-30 cm stock',
      },
    });
    expect(edit.status).toBe(204);
    const pub = await api('POST', `/api/factor-sets/${id}/publish`, {
      session: admin,
      body: { note: 'Local HAC reference stock' },
    });
    expect(pub.body).toEqual({ version: 1 });
    const est = await api('POST', '/api/estimates', { session: assessor, body: { ...we1, factorSet: id } });
    expect(est.status).toBe(200);
    // 100 x F_LU 0.69 (Table 5.5, temperate moist, long-term cultivated) = 69; change 31 t C on 1 ha.
    expect(est.body.socBeforePerHa).toBeCloseTo(100, 6);
    expect(est.body.socAfterPerHa).toBeCloseTo(69, 6);
    expect(est.body.factorSet).toEqual({ id, version: 1 });
    const view = await api('GET', `/api/factor-sets/${id}`, { session: assessor });
    expect(view.body.edits[0]).toMatchObject({
      table: 'soc-ref',
      entry: 'warm-temperate-moist/hac',
      reason: expect.stringMatching(/soil survey/),
    });
    const audit = await testDb('audit_event')
      .where({ action: 'factor-set.edit', entity_id: `${id}@1` })
      .first();
    expect(audit.details.reason).toMatch(/soil survey/);
  });

  it('a published version is immutable: edits need a new draft', async () => {
    const res = await api('PATCH', `/api/factor-sets/${id}/draft`, {
      session: admin,
      body: {
        tableKey: 'soc-ref',
        entryKey: 'warm-temperate-moist/hac',
        value: 101,
        reason: 'A second look at the survey',
      },
    });
    expect(res.status).toBe(409);
    const draft = await api('POST', `/api/factor-sets/${id}/draft`, { session: admin });
    expect(draft.body).toEqual({ version: 2 });
  });

  it('the diff against the IPCC set shows exactly the changed value', async () => {
    const res = await api('GET', `/api/factor-sets/diff?a=ipcc-2006@1&b=${id}@1`, { session: assessor });
    expect(res.status).toBe(200);
    const valueChanges = res.body.items.filter((d: { changed: string[] }) => d.changed.includes('value'));
    expect(valueChanges).toHaveLength(1);
    expect(valueChanges[0]).toMatchObject({
      table: 'soc-ref',
      entry: 'warm-temperate-moist/hac',
      a: { value: 88 },
      b: { value: 100 },
    });
  });

  it('confirming every table the estimate uses makes it ready for sign-off; confirmation is audited', async () => {
    const first = await api('POST', '/api/estimates', { session: assessor, body: { ...we1, factorSet: id } });
    expect(first.body.signOffReady).toBe(false);
    for (const tableKey of first.body.unconfirmedTablesUsed) {
      const res = await api('POST', `/api/factor-sets/${id}/versions/1/confirmations`, {
        session: admin,
        body: { tableKey, document: 'Tarrow soil survey report 2025 and IPCC 2006 Vol 4', page: '12' },
      });
      expect(res.status).toBe(204);
    }
    const again = await api('POST', '/api/estimates', { session: assessor, body: { ...we1, factorSet: id } });
    expect(again.body.signOffReady).toBe(true);
    expect(again.body.factors.every((f: { status: string }) => f.status === 'confirmed')).toBe(true);
    const audits = await testDb('audit_event').where({ action: 'factor-set.confirm-table', entity_id: `${id}@1` });
    expect(audits.length).toBe(first.body.unconfirmedTablesUsed.length);
  });

  it('an assessor cannot change factor sets', async () => {
    const res = await api('POST', `/api/factor-sets/${id}/publish`, {
      session: assessor,
      body: { note: 'sneaky publish' },
    });
    expect(res.status).toBe(403);
  });
});

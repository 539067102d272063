/**
 * The staff dashboard against the register and the region figures, recomputed here from the
 * database and the regions API. Source of the ratio rule: Reg. (EU) 2021/2115 Annex III, GAEC 1 —
 * at most a 5 % fall of the permanent-grassland ratio against the reference year (from memory).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CONDITION, decidedProposal } from '../support/board';
import { testDb } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';

let s: { planner: Session; assessor: Session; board: Session; chair: Session; admin: Session };
beforeAll(async () => {
  const [planner, assessor, board, chair, admin] = await Promise.all(
    [DEMO.planner, DEMO.assessor, DEMO.board, DEMO.chair, DEMO.admin].map((e) => signIn(e)),
  );
  s = { planner, assessor, board, chair, admin };
  await testDb('app_setting').where({ key: 'board.quorum' }).delete();
}, 60_000);
afterAll(() => testDb.destroy());

const CURRENT = 'not exists (select 1 from register_entry s where s.supersedes_seq = e.seq)';

describe('GET /api/dashboard', () => {
  it('is for staff only', async () => {
    expect((await api('GET', '/api/dashboard')).status).toBe(401);
    for (const who of [s.planner, s.assessor, s.board, s.chair, s.admin])
      expect((await api('GET', '/api/dashboard', { session: who })).status).toBe(200);
  });

  it('committed CO2e per budget year is the sum of current approvals by start year; the budget is the setting', async () => {
    const d = (await api('GET', '/api/dashboard', { session: s.board })).body;
    const rows = (
      await testDb.raw(`select (content->'proposal'->>'startYear')::int as y, sum((content->'figures'->>'co2eTotal')::float8) as t from register_entry e
      where outcome in ('approved', 'approved-with-conditions') and ${CURRENT} group by 1 order by 1`)
    ).rows;
    expect(rows.length).toBeGreaterThan(3); // the demo history spans 2021-2026
    expect(d.budget.years.map((y: { year: number }) => y.year)).toEqual(rows.map((r: { y: number }) => r.y));
    d.budget.years.forEach((y: { committedT: number; leftT: number }, i: number) => {
      expect(y.committedT).toBeCloseTo(Number(rows[i].t), 6);
      expect(y.leftT).toBeCloseTo(5000 - Number(rows[i].t), 6); // default budget.yearly-co2e-t
    });
    expect(d.budget.budgetT).toBe(5000);
  });

  it('each region’s headroom is its permanent grassland less pending conversions less 95 % of the reference ratio times its farmed area', async () => {
    // Other test files add parcels meanwhile: compare a dashboard read between two equal region reads.
    let d = await api('GET', '/api/dashboard', { session: s.assessor });
    let regions = await api('GET', '/api/regions', { session: s.assessor });
    for (let i = 0; i < 20; i++) {
      const first = JSON.stringify((await api('GET', '/api/regions', { session: s.assessor })).body.items);
      d = await api('GET', '/api/dashboard', { session: s.assessor });
      regions = await api('GET', '/api/regions', { session: s.assessor });
      if (JSON.stringify(regions.body.items) === first) break;
      await new Promise((r) => setTimeout(r, 500));
    }
    expect(d.body.ratioRule).toMatchObject({ ruleId: 'region-ratio-fall', maxRelativeFall: 0.05 });
    expect(d.body.regions.length).toBe(regions.body.items.length);
    for (const r of regions.body.items) {
      const row = d.body.regions.find((x: { key: string }) => x.key === r.key);
      expect(row.agriculturalHa).toBeCloseTo(r.agriculturalHa, 6);
      expect(row.referenceRatio).toBeCloseTo(r.reference.ratio, 9);
      // Pending conversions cannot take the region below no permanent grassland at all.
      const room =
        Math.max(0, r.permanentGrasslandHa - row.pendingConvertedHa) - r.reference.ratio * 0.95 * r.agriculturalHa;
      expect(row.headroomHa).toBeCloseTo(Math.max(0, room), 6);
      expect(row.shortfallHa).toBeCloseTo(Math.max(0, -room), 6);
    }
    // The demo history approved conversions that the land-use record does not show yet.
    expect(d.body.regions.some((r: { pendingConvertedHa: number }) => r.pendingConvertedHa > 0)).toBe(true);
  });

  it('a new conditional approval adds its CO2e to its budget year and its condition to the open ones', async () => {
    const before = (await api('GET', '/api/dashboard', { session: s.chair })).body;
    const d = await decidedProposal(s, 'approved-with-conditions');
    const entry = (await testDb('register_entry').where({ seq: d.seq }).first()).content;
    const after = (await api('GET', '/api/dashboard', { session: s.chair })).body;
    const year = entry.proposal.startYear;
    const committed = (x: typeof before) =>
      x.budget.years.find((y: { year: number }) => y.year === year)?.committedT ?? 0;
    expect(committed(after) - committed(before)).toBeCloseTo(entry.figures.co2eTotal, 6);
    expect(after.conditions.open).toBe(before.conditions.open + 1);
    expect(after.conditions.items.find((c: { seq: number }) => c.seq === d.seq)).toMatchObject({
      text: CONDITION.text,
      dueDate: CONDITION.dueDate,
      overdue: false,
    });
    // Conditions whose due date has passed are overdue (the demo history has some).
    expect(after.conditions.items.filter((c: { overdue: boolean }) => c.overdue).length).toBe(after.conditions.overdue);
    expect(after.conditions.overdue).toBeGreaterThan(0);
    // Recorded as met through its follow-up task, the condition leaves the open ones.
    const task = await testDb('follow_up_task as t')
      .join('board_decision as b', 'b.id', 't.decision_id')
      .where({ 'b.register_seq': d.seq, 't.kind': 'condition' })
      .first('t.id', 't.version');
    const done = await api('POST', `/api/follow-ups/${task.id}/outcome`, {
      session: s.chair,
      body: { outcome: 'done', note: 'Margin seen on the site visit.', version: task.version },
    });
    expect(done.status).toBe(200);
    const later = (await api('GET', '/api/dashboard', { session: s.chair })).body;
    expect(later.conditions.open).toBe(after.conditions.open - 1);
    expect(later.conditions.items.find((c: { seq: number }) => c.seq === d.seq)).toBeUndefined();
  }, 120_000);

  it('lists proposals past their statutory decision date, and only those', async () => {
    const open = await testDb('proposal')
      .whereIn('state', ['submitted', 'in-assessment', 'assessed', 'on-agenda'])
      .orderBy('id')
      .first();
    await testDb('proposal')
      .where({ id: open.id })
      .update({ decision_due: testDb.raw("current_date - interval '3 days'") });
    try {
      const d = (await api('GET', '/api/dashboard', { session: s.planner })).body;
      expect(d.overdueProposals.find((p: { id: number }) => p.id === Number(open.id))).toMatchObject({
        reference: open.reference,
        daysOverdue: 3,
      });
      const late = (
        await testDb.raw(
          `select count(*)::int as n from proposal where state in ('submitted', 'in-assessment', 'assessed', 'on-agenda') and decision_due < current_date`,
        )
      ).rows[0].n;
      expect(d.overdueProposals).toHaveLength(late);
    } finally {
      await testDb('proposal').where({ id: open.id }).update({ decision_due: open.decision_due });
    }
  });
});

/**
 * Compensation parcels and their permanence through the API: an approval whose assessment named a
 * cropland parcel to restore credits its gain in the register; ploughing that parcel within the
 * permanence period appends a `compensation-reversed` entry (chain still valid, no personal data),
 * counts the gain again in the committed CO2e of the ploughing year, and tells the chair. Outside
 * the period, before the approval took effect, or with work that leaves the sward, nothing happens.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { committedCo2e } from '~/lib/db/register';
import { addDays } from '~/lib/proposals/states';
import { createMeeting, decide, today, vote } from '../support/board';
import { lastMailId, testDb, waitForMail } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';
import { allowSignOff, APPLICANT, assess, drawParcel, fileProposal, submit } from '../support/proposals';

let planner: Session, assessor: Session, board: Session, chair: Session;
beforeAll(async () => {
  [planner, assessor, board, chair] = await Promise.all(
    [DEMO.planner, DEMO.assessor, DEMO.board, DEMO.chair].map((e) => signIn(e)),
  );
  await allowSignOff();
  await testDb('app_setting').where({ key: 'compensation.permanence-years' }).delete();
});
afterAll(async () => {
  await testDb.destroy();
});

const OWNER = 'HLD-COMP-4471';

/** An approval of a grass parcel's conversion with an arable parcel as compensation, taking effect on `effectiveDate`. */
async function approvedWithCompensation(effectiveDate: string) {
  const field = await drawParcel(planner);
  const arable = await drawParcel(planner, undefined, 'arable');
  await testDb('parcel').whereIn('id', [field, arable]).update({ owner_ref: OWNER });
  const p = await fileProposal(planner, [{ parcelId: field }]);
  await submit(planner, p.id);
  const a = await assess(assessor, p.id, { compensationParcelId: arable });
  expect(a.status).toBe(200);
  const alt = a.body.alternatives.find((x: { key: string }) => x.key === 'compensation');
  expect(alt.available).toBe(true);
  const signed = await api('POST', `/api/assessments/${a.body.id}/sign-off`, {
    session: assessor,
    body: { findings: 'Compensation weighed.', version: a.body.version },
  });
  expect(signed.status).toBe(200);
  const m = await createMeeting(chair, [p.id]);
  const item = m.items.find((i) => i.proposalId === p.id)!;
  for (const who of [board, chair]) expect((await vote(who, m.id, item.id, 'approve')).status).toBe(200);
  const d = await decide(chair, m.id, item.id, { outcome: 'approved', conditions: [], effectiveDate });
  expect(d.status).toBe(201);
  const reference = (await testDb('parcel').where({ id: arable }).first()).reference as string;
  return {
    proposal: p,
    arable,
    arableReference: reference,
    seq: d.body.registerSeq as number,
    gainT: -alt.differenceFromProposal as number,
  };
}

const plough = (parcelId: number, date: string, kind = 'tillage', value = 'ploughing') =>
  api('POST', `/api/parcels/${parcelId}/events`, {
    session: planner,
    body: { date, kind, value, evidence: 'Field officer visit (test)' },
  });

describe('crediting a compensation parcel', () => {
  it('puts the credited gain and the permanence date in the decision entry and tracks the site', async () => {
    const effective = addDays(today(), -400);
    const c = await approvedWithCompensation(effective);
    const entry = (await api('GET', `/api/register/${c.seq}`)).body;
    expect(entry.content.compensation.parcelReference).toBe(c.arableReference);
    // The credit is the restoration's CO2e removal, as the assessment's "with compensation" alternative weighed it (rounded to 3 decimals in the register).
    expect(entry.content.compensation.creditedCo2e).toBeCloseTo(c.gainT, 3);
    expect(c.gainT).toBeGreaterThan(0);
    // 5 years: the period re-converted land had to stay permanent grassland under Reg. (EU) No 1307/2013 Art. 45 and
    // Delegated Reg. (EU) No 639/2014 Art. 44 (from memory), the default of compensation.permanence-years.
    const until = `${Number(effective.slice(0, 4)) + 5}${effective.slice(4)}`;
    expect(entry.content.compensation.permanenceUntil).toBe(until);
    const site = await testDb('compensation_site').where({ register_seq: c.seq }).first();
    expect(site.status).toBe('held');
    expect(Number(site.parcel_id)).toBe(c.arable);
    expect(site.credited_co2e_t).toBeCloseTo(c.gainT, 6);
    const tasks = await testDb('follow_up_task').where({ proposal_id: c.proposal.id }).orderBy('kind');
    expect(tasks.map((t) => t.kind)).toEqual(['compensation-check', 'site-check']);
  }, 120_000);
});

describe('a condition that requires a parcel restored', () => {
  it('holds the parcel for the permanence period with nothing credited; ploughing it tells the chair and leaves the register as it is', async () => {
    const field = await drawParcel(planner);
    const arable = await drawParcel(planner, undefined, 'arable');
    const reference = (await testDb('parcel').where({ id: arable }).first()).reference as string;
    const p = await fileProposal(planner, [{ parcelId: field }]);
    await submit(planner, p.id);
    const a = await assess(assessor, p.id);
    expect(
      (
        await api('POST', `/api/assessments/${a.body.id}/sign-off`, {
          session: assessor,
          body: { findings: 'Signed off for the condition test.', version: a.body.version },
        })
      ).status,
    ).toBe(200);
    const m = await createMeeting(chair, [p.id]);
    const item = m.items.find((i) => i.proposalId === p.id)!;
    for (const who of [board, chair])
      expect((await vote(who, m.id, item.id, 'approve-with-conditions')).status).toBe(200);
    const condition = {
      text: `Sow parcel ${reference} to permanent grass before the conversion starts.`,
      dueDate: addDays(today(), 30),
      checkedBy: 'Field officer',
    };
    const entries = Number((await testDb('register_entry').count('* as n').first())?.n);
    const unknown = await decide(chair, m.id, item.id, {
      outcome: 'approved-with-conditions',
      conditions: [{ ...condition, restoreParcel: 'NO-SUCH-PARCEL' }],
      effectiveDate: addDays(today(), -100),
    });
    expect(unknown.status).toBe(422);
    expect(unknown.body.error.issues[0].path).toEqual(['conditions', 0, 'restoreParcel']);
    expect(Number((await testDb('register_entry').count('* as n').first())?.n)).toBe(entries);
    // The reference is matched as parcel references are (case and spacing do not matter).
    const d = await decide(chair, m.id, item.id, {
      outcome: 'approved-with-conditions',
      conditions: [{ ...condition, restoreParcel: ` ${reference.toLowerCase()} ` }],
      effectiveDate: addDays(today(), -100),
    });
    expect(d.status).toBe(201);
    const site = await testDb('compensation_site').where({ register_seq: d.body.registerSeq }).first();
    expect(site).toMatchObject({ status: 'held', credited_co2e_t: 0 });
    expect(Number(site.parcel_id)).toBe(arable);
    const since = await lastMailId();
    const res = await plough(arable, addDays(today(), -2));
    expect(res.status).toBe(201);
    expect(res.body.compensationReversedBy).toBeUndefined();
    expect(Number((await testDb('register_entry').count('* as n').first())?.n)).toBe(entries + 1);
    expect((await testDb('compensation_site').where({ id: site.id }).first()).status).toBe('reversed');
    expect(
      await testDb('follow_up_task').where({
        proposal_id: p.id,
        kind: 'compensation-reversed',
        assignee_role: 'chair',
      }),
    ).toHaveLength(1);
    const mail = await waitForMail(DEMO.chair, new RegExp(`Compensation for ${p.reference} reversed`), since);
    expect(mail.body_text).toContain('the register is unchanged');
  }, 120_000);
});

describe('ploughing a compensation parcel', () => {
  it('within the permanence period: a reversal entry, a valid chain, the gain counted again, the chair told', async () => {
    const c = await approvedWithCompensation(addDays(today(), -400));
    const ploughedOn = addDays(today(), -30);
    const year = Number(ploughedOn.slice(0, 4));
    const committedBefore = await committedCo2e(testDb, year);
    const since = await lastMailId();
    const res = await plough(c.arable, ploughedOn);
    expect(res.status).toBe(201);
    expect(res.body.compensationReversedBy).toHaveLength(1);
    const seq = res.body.compensationReversedBy[0];
    const entry = (await api('GET', `/api/register/${seq}`)).body;
    expect(entry.content).toMatchObject({
      kind: 'compensation-reversed',
      supersedes: null,
      outcome: 'approved',
      reverses: { seq: c.seq, parcelReference: c.arableReference, eventDate: ploughedOn, budgetYear: year },
      proposal: { reference: c.proposal.reference },
    });
    expect(entry.content.figures.co2eTotal).toBeCloseTo(c.gainT, 3);
    expect(entry.content.parcels.map((p: { reference: string }) => p.reference)).toEqual([c.arableReference]);
    // The approval itself stands: nothing supersedes the crediting entry.
    expect((await api('GET', `/api/register/${c.seq}`)).body.supersededBy).toBeNull();
    // No personal data: not the applicant, not the holding reference.
    const text = JSON.stringify(entry);
    for (const secret of [APPLICANT.name, APPLICANT.contact, OWNER]) expect(text).not.toContain(secret);
    const verify = (await api('GET', '/api/register/verify')).body;
    expect(verify).toMatchObject({ ok: true, firstBrokenEntry: null });
    expect(await committedCo2e(testDb, year)).toBeCloseTo(committedBefore + entry.content.reverses.creditedCo2e, 3);
    const task = await testDb('follow_up_task')
      .where({ proposal_id: c.proposal.id, kind: 'compensation-reversed' })
      .first();
    expect(task).toMatchObject({ assignee_role: 'chair', status: 'open' });
    expect(task.title).toContain(`register entry ${seq}`);
    const mail = await waitForMail(DEMO.chair, new RegExp(`Compensation for ${c.proposal.reference} reversed`), since);
    expect(mail.body_text).toContain(`register entry ${seq}`);
    // Ploughed again: already reversed, no second entry.
    const again = await plough(c.arable, addDays(today(), -1));
    expect(again.status).toBe(201);
    expect(again.body.compensationReversedBy).toBeUndefined();
    expect(await testDb('register_entry').whereRaw("content->'reverses'->>'seq' = ?", [String(c.seq)])).toHaveLength(1);
  }, 120_000);

  it('outside the period, before the approval took effect, or with work that keeps the sward: no reversal', async () => {
    await testDb('app_setting')
      .insert({ key: 'compensation.permanence-years', value: JSON.stringify(1) })
      .onConflict('key')
      .merge();
    try {
      const old = await approvedWithCompensation(addDays(today(), -800)); // in grass until 435 days ago
      const entries = Number((await testDb('register_entry').count('* as n').first())?.n);
      expect((await plough(old.arable, addDays(today(), -10))).body.compensationReversedBy).toBeUndefined();
      const recent = await approvedWithCompensation(addDays(today(), -100));
      expect((await plough(recent.arable, addDays(today(), -200))).body.compensationReversedBy).toBeUndefined(); // before it took effect
      expect(
        (await plough(recent.arable, addDays(today(), -5), 'tillage', 'harrowing')).body.compensationReversedBy,
      ).toBeUndefined();
      expect(
        (await plough(recent.arable, addDays(today(), -4), 'land-use', 'meadow')).body.compensationReversedBy,
      ).toBeUndefined();
      expect(Number((await testDb('register_entry').count('* as n').first())?.n)).toBe(entries + 1); // only the second approval's decision
      expect(
        (await testDb('compensation_site').whereIn('register_seq', [old.seq, recent.seq]).orderBy('id')).map(
          (x) => x.status,
        ),
      ).toEqual(['held', 'held']);
      // A change of use to arable inside the period does reverse it.
      expect(
        (await plough(recent.arable, addDays(today(), -3), 'land-use', 'arable')).body.compensationReversedBy,
      ).toHaveLength(1);
    } finally {
      await testDb('app_setting').where({ key: 'compensation.permanence-years' }).delete();
    }
  }, 180_000);
});

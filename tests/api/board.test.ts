/**
 * The board through the API: building an agenda, conflicts of interest, votes, the quorum,
 * every outcome, a deferral carried to the next meeting, and one decision per item even when
 * two people record it at the same moment.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { lastMailId, testDb, waitForMail } from '../support/db';
import { api, DEMO, signIn, type Session } from '../support/http';
import { assessedProposal, CONDITION, createMeeting, decide, today, vote } from '../support/board';
import { fileProposal, drawParcel } from '../support/proposals';

let planner: Session, assessor: Session, board: Session, chair: Session, admin: Session;
beforeAll(async () => {
  [planner, assessor, board, chair, admin] = await Promise.all(
    [DEMO.planner, DEMO.assessor, DEMO.board, DEMO.chair, DEMO.admin].map((e) => signIn(e)),
  );
  await testDb('app_setting').whereIn('key', ['board.quorum']).delete(); // default quorum: 2 eligible votes
});
afterAll(async () => {
  await testDb('app_setting').whereIn('key', ['board.quorum']).delete();
  await testDb.destroy();
});

const state = async (id: number) => (await testDb('proposal').where({ id }).first()).state;
const entries = async () => Number((await testDb('register_entry').count('* as n').first())?.n);
const inAYear = () => new Date(Date.now() + 365 * 86_400_000).toISOString().slice(0, 10);

describe('building an agenda', () => {
  it('the chair lists assessed proposals in order; they become on-agenda; anything else is refused and nothing is created', async () => {
    const [a, b] = [await assessedProposal(planner, assessor), await assessedProposal(planner, assessor)];
    const draft = await fileProposal(planner, [{ parcelId: await drawParcel(planner) }]);
    const meetings = Number((await testDb('meeting').count('* as n').first())?.n);
    const refused = await api('POST', '/api/meetings', {
      session: chair,
      body: { date: today(), place: 'Tarrow Hall', proposalIds: [a.id, draft.id] },
    });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/only proposals whose assessment is signed off/);
    expect(Number((await testDb('meeting').count('* as n').first())?.n)).toBe(meetings);
    expect(await state(a.id)).toBe('assessed');

    expect(
      (
        await api('POST', '/api/meetings', {
          session: board,
          body: { date: today(), place: 'Tarrow Hall', proposalIds: [a.id] },
        })
      ).status,
    ).toBe(403);
    const m = await createMeeting(chair, [b.id, a.id]);
    expect(m.items.filter((i) => [a.id, b.id].includes(i.proposalId)).map((i) => i.proposalId)).toEqual([b.id, a.id]);
    expect([await state(a.id), await state(b.id)]).toEqual(['on-agenda', 'on-agenda']);
    // One open item per proposal: listing it on another meeting is refused.
    const again = await createMeeting(admin, []);
    expect(
      (await api('POST', `/api/meetings/${again.id}/items`, { session: chair, body: { proposalId: a.id } })).status,
    ).toBe(409);
    const detail = (await api('GET', `/api/meetings/${m.id}`, { session: board })).body;
    expect(detail.quorum).toBe(2);
    expect((await api('GET', `/api/meetings/${m.id}`, { session: planner })).status).toBe(403);
  });
});

describe('votes, conflicts and the quorum', () => {
  it('a decision without enough eligible votes is refused and nothing is recorded', async () => {
    const p = await assessedProposal(planner, assessor);
    const m = await createMeeting(chair, [p.id]);
    const item = m.items.find((i) => i.proposalId === p.id)!;
    expect((await vote(chair, m.id, item.id, 'approve')).status).toBe(200);
    const before = await entries();
    const res = await decide(chair, m.id, item.id, { outcome: 'approved' });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/No quorum .* 1 eligible vote .* 2 needed/);
    expect(await entries()).toBe(before);
    expect(await state(p.id)).toBe('on-agenda');
    expect(await testDb('board_decision').where({ item_id: item.id }).first()).toBeUndefined();
    // An abstention is a vote cast: it counts toward the quorum.
    expect((await vote(board, m.id, item.id, 'abstain')).status).toBe(200);
    expect((await decide(chair, m.id, item.id, { outcome: 'approved' })).status).toBe(201);
  });

  it('a member who declared a conflict cannot vote, a vote already cast is withdrawn, and the quorum counts only eligible votes', async () => {
    const p = await assessedProposal(planner, assessor);
    const m = await createMeeting(chair, [p.id]);
    const item = m.items.find((i) => i.proposalId === p.id)!;
    expect((await vote(board, m.id, item.id, 'refuse', 'Neighbouring land of mine.')).status).toBe(200);
    const declared = await api('POST', `/api/meetings/${m.id}/items/${item.id}/conflicts`, {
      session: board,
      body: { reason: 'I farm the neighbouring holding.' },
    });
    expect(declared.status).toBe(201);
    const refused = await vote(board, m.id, item.id, 'approve');
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/declared a conflict of interest/);
    expect((await vote(chair, m.id, item.id, 'approve')).status).toBe(200);
    const detail = (await api('GET', `/api/meetings/${m.id}`, { session: chair })).body;
    const it = detail.items.find((i: { id: number }) => i.id === item.id);
    expect(it.votes.map((v: { choice: string }) => v.choice)).toEqual(['approve']);
    expect(it.tally).toMatchObject({ eligible: 1, declaredConflicts: 1, approve: 1, refuse: 0 });
    expect(it.quorumReached).toBe(false);
    expect((await decide(chair, m.id, item.id, { outcome: 'approved' })).status).toBe(409);
    // With a quorum of one (a smaller board), the chair's eligible vote is enough.
    await testDb('app_setting')
      .insert({ key: 'board.quorum', value: JSON.stringify(1) })
      .onConflict('key')
      .merge();
    try {
      const ok = await decide(chair, m.id, item.id, { outcome: 'approved' });
      expect(ok.status).toBe(201);
      const entry = (await api('GET', `/api/register/${ok.body.registerSeq}`)).body;
      expect(entry.content.votes).toEqual({
        approve: 1,
        approveWithConditions: 0,
        refuse: 0,
        defer: 0,
        abstain: 0,
        declaredConflicts: 1,
      });
    } finally {
      await testDb('app_setting').where({ key: 'board.quorum' }).delete();
    }
  });

  it('bad votes are refused naming the field', async () => {
    const p = await assessedProposal(planner, assessor);
    const m = await createMeeting(chair, [p.id]);
    const item = m.items.find((i) => i.proposalId === p.id)!;
    const res = await vote(board, m.id, item.id, 'maybe');
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/approve, approve-with-conditions, refuse, defer or abstain/);
    expect((await vote(planner, m.id, item.id, 'approve')).status).toBe(403);
  });
});

describe('every outcome', () => {
  for (const outcome of ['approved', 'approved-with-conditions', 'refused'] as const) {
    it(`${outcome}: one transaction writes the register entry, moves the proposal to decided and mails the planner`, async () => {
      const p = await assessedProposal(planner, assessor);
      const m = await createMeeting(chair, [p.id]);
      const item = m.items.find((i) => i.proposalId === p.id)!;
      const choice = { approved: 'approve', 'approved-with-conditions': 'approve-with-conditions', refused: 'refuse' }[
        outcome
      ];
      for (const s of [board, chair]) expect((await vote(s, m.id, item.id, choice)).status).toBe(200);
      const conditions = outcome === 'approved-with-conditions' ? [CONDITION] : [];
      if (outcome === 'approved-with-conditions') {
        const none = await decide(chair, m.id, item.id, { outcome });
        expect(none.status).toBe(422);
        expect(none.body.error.message).toMatch(/needs at least one condition/);
      } else {
        expect((await decide(chair, m.id, item.id, { outcome, conditions: [CONDITION] })).status).toBe(422);
      }
      const mailFrom = await lastMailId();
      const res = await decide(outcome === 'refused' ? admin : chair, m.id, item.id, {
        outcome,
        conditions,
        appealDays: 21,
      });
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({
        outcome,
        proposalState: 'decided',
        registerSeq: expect.any(Number),
        registerHash: expect.stringMatching(/^[0-9a-f]{64}$/),
      });
      expect(await state(p.id)).toBe('decided');
      const entry = (await api('GET', `/api/register/${res.body.registerSeq}`)).body;
      expect(entry.content).toMatchObject({
        kind: 'decision',
        outcome,
        conditions,
        proposal: { reference: p.reference },
        meeting: { date: today() },
        supersedes: null,
      });
      // The appeal window: 21 days from the decision day.
      const until = new Date(Date.parse(`${entry.content.decidedOn}T00:00:00Z`) + 21 * 86_400_000)
        .toISOString()
        .slice(0, 10);
      expect(entry.content.appealUntil).toBe(until);
      expect(entry.content.parcels[0].geometry.type).toBe('MultiPolygon');
      const mail = await waitForMail(DEMO.planner, new RegExp(`Board decision on ${p.reference}`), mailFrom);
      expect(mail.body_text).toContain(`entry ${res.body.registerSeq} of the public register`);
      // Decided: no further votes or decisions on the item.
      expect((await vote(board, m.id, item.id, 'refuse')).status).toBe(409);
      expect((await decide(chair, m.id, item.id, { outcome: 'refused' })).status).toBe(409);
    });
  }
});

describe('deferral', () => {
  it('a deferred item is not registered and goes to the next meeting: a later meeting already planned, or the next one created', async () => {
    const [p, q] = [await assessedProposal(planner, assessor), await assessedProposal(planner, assessor)];
    const m = await createMeeting(chair, [p.id, q.id]);
    const [ip, iq] = [m.items.find((i) => i.proposalId === p.id)!, m.items.find((i) => i.proposalId === q.id)!];
    const before = await entries();
    // A deferral needs no quorum: a board without quorum defers.
    const dp = await decide(chair, m.id, ip.id, {
      outcome: 'deferred',
      reasons: 'The board needs the drainage survey first.',
    });
    expect(dp.status).toBe(201);
    expect(dp.body).toMatchObject({ outcome: 'deferred', registerSeq: null, proposalState: 'on-agenda' });
    expect(await entries()).toBe(before);
    expect(await state(p.id)).toBe('on-agenda');
    // No later meeting yet: the next one created carries it in first.
    const later = await createMeeting(chair, [], inAYear(), 'Tarrow Hall');
    const carried = later.items.find((i) => i.proposalId === p.id)!;
    expect(carried).toMatchObject({ carriedFrom: ip.id, status: 'listed' });
    expect(later.items[0]!.proposalId).toBe(p.id);
    // A later meeting exists now: deferring q lists it there straight away.
    const dq = await decide(admin, m.id, iq.id, {
      outcome: 'deferred',
      reasons: 'Waiting for the applicant’s revised plan.',
    });
    expect(dq.body.carriedToMeeting).toBe(later.id);
    const l = (await api('GET', `/api/meetings/${later.id}`, { session: board })).body;
    expect(l.items.map((i: { proposalId: number }) => i.proposalId)).toEqual(expect.arrayContaining([p.id, q.id]));
    // The carried item is decided at the later meeting.
    for (const s of [board, chair]) await vote(s, later.id, carried.id, 'refuse');
    expect((await decide(chair, later.id, carried.id, { outcome: 'refused' })).status).toBe(201);
    expect(await state(p.id)).toBe('decided');
  });
});

describe('one decision per item', () => {
  it('two people recording at the same moment: one wins, the other gets 409, one register entry', async () => {
    const p = await assessedProposal(planner, assessor);
    const m = await createMeeting(chair, [p.id]);
    const item = m.items.find((i) => i.proposalId === p.id)!;
    for (const s of [board, chair]) await vote(s, m.id, item.id, 'approve');
    const results = await Promise.all([
      decide(chair, m.id, item.id, { outcome: 'approved' }),
      decide(admin, m.id, item.id, { outcome: 'refused' }),
      decide(chair, m.id, item.id, { outcome: 'approved' }),
    ]);
    expect(results.map((r) => r.status).sort()).toEqual([201, 409, 409]);
    expect(Number((await testDb('board_decision').where({ item_id: item.id }).count('* as n').first())?.n)).toBe(1);
    const regs = await testDb('register_entry').whereRaw("content->'proposal'->>'reference' = ?", [p.reference]);
    expect(regs).toHaveLength(1);
    expect(regs[0].content.outcome).toBe(results.find((r) => r.status === 201)!.body.outcome);
  });
});

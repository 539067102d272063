/**
 * Board use cases: build a meeting's agenda, declare conflicts, vote, record the decision.
 * Recording a decision is one transaction: the decision row, the register entry (approvals and
 * refusals), the proposal moved to `decided` and the planner's mail all land together or not at all.
 */
import { formatDate } from '~/lib/format/dates';
import type { MultiPolygon } from 'geojson';
import { tally, type DecisionOutcome, type VoteChoice } from '../board/settings';
import { recordAudit } from '../db/audit';
import * as assessments from '../db/assessments';
import { db, withTransaction, type Db } from '../db/client';
import * as store from '../db/meetings';
import * as proposals from '../db/proposals';
import { appendEntry } from '../db/register';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';
import { enqueueMail } from '../mail/outbox';
import { boardDecisionMail } from '../mail/templates';
import { addDays } from '../proposals/states';
import { decisionContent } from '../register/build';
import type { Condition } from '../register/content';
import type { StoredResult } from './assessments';
import { compensationCredit, conditionSites, recordCompensationSite } from './compensation';
import { createDecisionTasks } from './follow-ups';
import { proposalUrl } from './proposals';

const isUniqueViolation = (e: unknown) => (e as { code?: string })?.code === '23505';

/** Puts an assessed proposal on a meeting's agenda (proposal → on-agenda), inside the caller's transaction. */
async function listProposal(trx: Db, by: Caller, meeting: store.MeetingRow, proposalId: number): Promise<number> {
  const p = await proposals.getProposal(trx, proposalId, { lock: true });
  if (!p)
    throw new HttpError('UNPROCESSABLE_CONTENT', `No proposal with id ${proposalId}.`, [
      { path: ['proposalIds'], message: 'unknown proposal' },
    ]);
  if (p.state !== 'assessed')
    throw new HttpError(
      'CONFLICT',
      `Proposal ${p.reference} is "${p.state}"; only proposals whose assessment is signed off ("assessed") go on an agenda.`,
    );
  const signed = await store.latestSigned(trx, p.id);
  if (!signed) throw new HttpError('CONFLICT', `Proposal ${p.reference} has no signed assessment.`);
  const itemId = await store.insertItem(trx, { meetingId: meeting.id, proposalId: p.id, assessmentId: signed.id });
  await proposals.setState(trx, p.id, {
    from: p.state,
    to: 'on-agenda',
    reason: `On the agenda of the board meeting of ${formatDate(meeting.meeting_date)} (${meeting.place}).`,
    by: by.id,
  });
  await recordAudit(trx, {
    actorId: by.id,
    action: 'meeting.add-item',
    entityType: 'meeting',
    entityId: String(meeting.id),
    details: { proposal: p.reference, itemId, assessment: signed.number },
  });
  return itemId;
}

export async function createMeeting(by: Caller, input: { date: string; place: string; proposalIds: number[] }) {
  return withTransaction(db, async (trx) => {
    const id = await store.insertMeeting(trx, { date: input.date, place: input.place, by: by.id });
    const meeting = (await store.getMeeting(trx, id))!;
    // Deferred items waiting for a meeting come first, in the order they were deferred.
    for (const d of await store.waitingDeferred(trx)) {
      const itemId = await store.insertItem(trx, {
        meetingId: id,
        proposalId: d.proposal_id,
        assessmentId: d.assessment_id,
        carriedFrom: d.id,
      });
      await recordAudit(trx, {
        actorId: by.id,
        action: 'meeting.carry-item',
        entityType: 'meeting',
        entityId: String(id),
        details: { itemId, from: d.id },
      });
    }
    for (const pid of input.proposalIds) await listProposal(trx, by, meeting, pid);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'meeting.create',
      entityType: 'meeting',
      entityId: String(id),
      details: { date: input.date, place: input.place },
    });
    return meetingDetail(id, trx);
  });
}

export async function addItem(by: Caller, meetingId: number, proposalId: number) {
  return withTransaction(db, async (trx) => {
    const meeting = await store.getMeeting(trx, meetingId, { lock: true });
    if (!meeting) throw new HttpError('NOT_FOUND', `No meeting with id ${meetingId}.`);
    try {
      await listProposal(trx, by, meeting, proposalId);
      await store.bumpMeetingVersion(trx, meetingId);
    } catch (e) {
      if (isUniqueViolation(e)) throw new HttpError('CONFLICT', 'That proposal is already on an agenda.');
      throw e;
    }
    return meetingDetail(meetingId, trx);
  });
}

export async function listMeetings() {
  return {
    items: (await store.listMeetings(db)).map((m) => ({
      id: m.id,
      date: m.meeting_date,
      place: m.place,
      items: m.items,
      openItems: m.open_items,
    })),
  };
}

export async function meetingDetail(id: number, conn: Db = db) {
  const m = await store.getMeeting(conn, id);
  if (!m) throw new HttpError('NOT_FOUND', `No meeting with id ${id}.`);
  const items = await store.listItems(conn, id);
  const ids = items.map((i) => i.id);
  // One after another: `conn` may be a transaction, whose one client runs one query at a time.
  const votes = await store.votesOf(conn, ids);
  const conflicts = await store.conflictsOf(conn, ids);
  const decisions = await store.decisionsOf(conn, ids);
  const settings = await store.getBoardSettings(conn);
  return {
    id: m.id,
    date: m.meeting_date,
    place: m.place,
    version: m.version,
    quorum: settings['board.quorum'],
    items: items.map((i) => {
      const v = votes.filter((x) => x.item_id === i.id);
      const c = conflicts.filter((x) => x.item_id === i.id);
      const d = decisions.find((x) => x.item_id === i.id);
      const t = tally(
        v.map((x) => ({ userId: x.user_id, choice: x.choice })),
        c.map((x) => x.user_id),
      );
      return {
        id: i.id,
        position: i.position,
        status: i.status,
        proposalId: i.proposal_id,
        reference: i.reference,
        title: i.title,
        proposalState: i.proposal_state,
        assessmentId: i.assessment_id,
        carriedFrom: i.carried_from,
        votes: v.map((x) => ({
          userId: x.user_id,
          name: x.name,
          choice: x.choice,
          comment: x.comment,
          at: x.voted_at.toISOString(),
        })),
        conflicts: c.map((x) => ({
          userId: x.user_id,
          name: x.name,
          reason: x.reason,
          at: x.declared_at.toISOString(),
        })),
        tally: t,
        quorumReached: t.eligible >= settings['board.quorum'],
        decision: d
          ? {
              id: d.id,
              outcome: d.outcome,
              reasons: d.reasons,
              conditions: d.conditions as Condition[],
              appealDays: d.appeal_days,
              effectiveDate: d.effective_date,
              registerSeq: d.register_seq,
              decidedBy: d.decided_by,
              decidedAt: d.decided_at.toISOString(),
            }
          : null,
      };
    }),
  };
}

async function openItem(trx: Db, meetingId: number, itemId: number): Promise<store.ItemRow> {
  const item = await store.getItem(trx, meetingId, itemId, { lock: true });
  if (!item) throw new HttpError('NOT_FOUND', `No item ${itemId} on meeting ${meetingId}.`);
  if (item.status !== 'listed')
    throw new HttpError('CONFLICT', `Item ${item.reference} has already been ${item.status}; nothing was changed.`);
  if (item.proposal_state !== 'on-agenda')
    throw new HttpError(
      'CONFLICT',
      `Proposal ${item.reference} is "${item.proposal_state}", no longer before the board.`,
    );
  return item;
}

export async function declareConflict(by: Caller, meetingId: number, itemId: number, reason: string) {
  return withTransaction(db, async (trx) => {
    const item = await openItem(trx, meetingId, itemId);
    await store.declareConflict(trx, itemId, by.id, reason);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'meeting.declare-conflict',
      entityType: 'meeting_item',
      entityId: String(itemId),
      details: { proposal: item.reference },
    });
    return { itemId, declared: true };
  });
}

export async function castVote(
  by: Caller,
  meetingId: number,
  itemId: number,
  input: { choice: VoteChoice; comment?: string },
) {
  return withTransaction(db, async (trx) => {
    const item = await openItem(trx, meetingId, itemId);
    if (await store.hasConflict(trx, itemId, by.id))
      throw new HttpError(
        'CONFLICT',
        `You declared a conflict of interest on ${item.reference}, so you cannot vote on it.`,
      );
    await store.castVote(trx, itemId, by.id, input.choice, input.comment?.trim() || null);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'meeting.vote',
      entityType: 'meeting_item',
      entityId: String(itemId),
      details: { proposal: item.reference, choice: input.choice },
    });
    return { itemId, choice: input.choice };
  });
}

export type DecisionInput = {
  outcome: DecisionOutcome;
  reasons: string;
  conditions: Condition[];
  appealDays?: number;
  effectiveDate?: string;
};

function checkDecisionInput(input: DecisionInput): void {
  if (input.outcome === 'approved-with-conditions' && input.conditions.length === 0) {
    throw new HttpError('UNPROCESSABLE_CONTENT', 'An approval with conditions needs at least one condition.', [
      { path: ['conditions'], message: 'at least one condition' },
    ]);
  }
  if (input.outcome !== 'approved-with-conditions' && input.conditions.length > 0) {
    throw new HttpError(
      'UNPROCESSABLE_CONTENT',
      'Only an approval with conditions carries conditions; choose that outcome or remove them.',
      [{ path: ['conditions'], message: 'conditions need the outcome approved-with-conditions' }],
    );
  }
}

async function deferItem(trx: Db, by: Caller, item: store.ItemRow, input: DecisionInput) {
  const decisionId = await store.insertDecision(trx, {
    itemId: item.id,
    proposalId: item.proposal_id,
    outcome: 'deferred',
    reasons: input.reasons,
    conditions: [],
    appealDays: null,
    effectiveDate: null,
    registerSeq: null,
    by: by.id,
  });
  await store.setItemStatus(trx, item.id, 'deferred');
  const next = await store.nextMeetingAfter(trx, item.meeting_date);
  let carriedTo: number | null = null;
  if (next && !(await trx('meeting_item').where({ meeting_id: next.id, proposal_id: item.proposal_id }).first())) {
    await store.insertItem(trx, {
      meetingId: next.id,
      proposalId: item.proposal_id,
      assessmentId: item.assessment_id,
      carriedFrom: item.id,
    });
    carriedTo = next.id;
  }
  const p = (await proposals.getProposal(trx, item.proposal_id, { lock: true }))!;
  await proposals.setState(trx, p.id, {
    from: p.state,
    to: 'on-agenda',
    reason: `Deferred by the board on ${formatDate(item.meeting_date)}: ${input.reasons}${
      carriedTo
        ? ` Listed for ` + `the meeting of ${formatDate(next!.meeting_date)}.`
        : ' It goes on the next meeting’s agenda.'
    }`,
    by: by.id,
  });
  await recordAudit(trx, {
    actorId: by.id,
    action: 'meeting.defer',
    entityType: 'meeting_item',
    entityId: String(item.id),
    details: { proposal: item.reference, carriedTo },
  });
  return {
    decisionId,
    outcome: 'deferred' as const,
    registerSeq: null,
    registerHash: null,
    proposalState: 'on-agenda',
    carriedToMeeting: carriedTo,
  };
}

async function decide(
  trx: Db,
  by: Caller,
  item: store.ItemRow,
  input: DecisionInput & { outcome: Exclude<DecisionOutcome, 'deferred'> },
  t: ReturnType<typeof tally>,
  now: Date,
) {
  const settings = await store.getBoardSettings(trx);
  const p = (await proposals.getProposal(trx, item.proposal_id, { lock: true }))!;
  const a = (await assessments.getAssessment(trx, item.assessment_id))!;
  const r = a.result as unknown as StoredResult;
  const parcels = await proposals.listParcels(trx, p.id);
  const facts = r.facts as { parcels?: { regionKey: string | null; areaHa: number }[] };
  const decidedOn = now.toISOString().slice(0, 10);
  const appealDays = input.appealDays ?? settings['board.appeal-days'];
  const appealUntil = addDays(decidedOn, appealDays);
  const effectiveDate = input.effectiveDate ?? (input.outcome === 'refused' ? decidedOn : addDays(appealUntil, 1));
  const credit = input.outcome === 'refused' ? null : await compensationCredit(trx, a, effectiveDate);
  const content = decisionContent({
    proposal: {
      reference: p.reference,
      title: p.title,
      proposed: p.proposed as { landUse: string },
      startYear: p.start_year,
    },
    parcels: parcels.map((x) => ({
      reference: x.reference,
      areaHa: x.area_ha,
      part: x.part !== null,
      geometry: (x.part ?? x.geometry) as MultiPolygon as { type: 'MultiPolygon'; coordinates: number[][][][] },
    })),
    assessment: {
      number: a.number,
      totals: r.totals,
      grade: r.grade,
      factorSet: r.factorSet,
      ruleSet: r.grade.ruleSet ?? null,
      gwp: r.gwp,
      regionAreas: (facts.parcels ?? [])
        .filter((x) => x.regionKey)
        .map((x) => ({ key: x.regionKey!, areaHa: x.areaHa })),
    },
    meeting: { date: item.meeting_date, place: item.place },
    votes: {
      approve: t.approve,
      approveWithConditions: t.approveWithConditions,
      refuse: t.refuse,
      defer: t.defer,
      abstain: t.abstain,
      declaredConflicts: t.declaredConflicts,
    },
    outcome: input.outcome,
    reasons: input.reasons,
    conditions: input.conditions,
    appealUntil,
    effectiveDate,
    decidedOn,
    recordedAt: now.toISOString(),
    compensation: credit
      ? {
          parcelReference: credit.parcelReference,
          areaHa: credit.areaHa,
          creditedCo2e: credit.creditedCo2e,
          permanenceUntil: credit.permanenceUntil,
        }
      : undefined,
  });
  const entry = await appendEntry(trx, content);
  const decisionId = await store.insertDecision(trx, {
    itemId: item.id,
    proposalId: p.id,
    outcome: input.outcome,
    reasons: input.reasons,
    conditions: input.conditions,
    appealDays,
    effectiveDate,
    registerSeq: entry.seq,
    by: by.id,
  });
  const held = [
    ...(credit ? [credit] : []),
    ...(await conditionSites(trx, input.conditions, effectiveDate, credit?.parcelId ?? null)),
  ];
  for (const site of held)
    await recordCompensationSite(trx, { ...site, proposalId: p.id, decisionId, registerSeq: entry.seq, effectiveDate });
  const taskIds = await createDecisionTasks(trx, {
    proposalId: p.id,
    decisionId,
    outcome: input.outcome,
    conditions: input.conditions,
    effectiveDate,
    parcelReferences: parcels.map((x) => x.reference),
    compensationParcel: credit?.parcelReference ?? null,
  });
  await store.setItemStatus(trx, item.id, 'decided');
  await proposals.setState(trx, p.id, {
    from: p.state,
    to: 'decided',
    reason: `Board decision: ${input.outcome}. Register entry ${entry.seq}.`,
    by: by.id,
  });
  if (p.created_by) {
    const u = await trx('user').select('name', 'email').where({ id: p.created_by }).first();
    if (u)
      await enqueueMail(trx, {
        to: u.email,
        ...boardDecisionMail({
          reference: p.reference,
          title: p.title,
          url: proposalUrl(p.id),
          name: u.name,
          outcome: input.outcome,
          reasons: input.reasons,
          conditions: input.conditions,
          appealUntil,
          effectiveDate,
          registerSeq: entry.seq,
        }),
      });
  }
  await recordAudit(trx, {
    actorId: by.id,
    action: 'meeting.decide',
    entityType: 'meeting_item',
    entityId: String(item.id),
    details: {
      proposal: p.reference,
      outcome: input.outcome,
      registerSeq: entry.seq,
      hash: entry.hash,
      followUpTasks: taskIds,
      compensationParcel: credit?.parcelReference ?? null,
    },
  });
  return {
    decisionId,
    outcome: input.outcome,
    registerSeq: entry.seq,
    registerHash: entry.hash,
    proposalState: 'decided',
    carriedToMeeting: null,
  };
}

/**
 * The chair (or an admin as clerk) records the decision on an item: once only; a second attempt gets 409.
 * `now` dates the decision and its register entry (the demo history records past decisions in order).
 */
export async function recordDecision(
  by: Caller,
  meetingId: number,
  itemId: number,
  input: DecisionInput,
  now = new Date(),
) {
  checkDecisionInput(input);
  try {
    return await withTransaction(db, async (trx) => {
      const item = await openItem(trx, meetingId, itemId);
      if (input.outcome === 'deferred') return deferItem(trx, by, item, input);
      const settings = await store.getBoardSettings(trx);
      const votes = await store.votesOf(trx, [itemId]);
      const conflicts = await store.conflictsOf(trx, [itemId]);
      const t = tally(
        votes.map((v) => ({ userId: v.user_id, choice: v.choice })),
        conflicts.map((c) => c.user_id),
      );
      if (t.eligible < settings['board.quorum']) {
        throw new HttpError(
          'CONFLICT',
          `No quorum on ${item.reference}: ${t.eligible} eligible vote${t.eligible === 1 ? '' : 's'} (members ` +
            `without a declared conflict), ${settings['board.quorum']} needed. Nothing was recorded; defer the item or collect the votes.`,
        );
      }
      return decide(trx, by, item, { ...input, outcome: input.outcome }, t, now);
    });
  } catch (e) {
    if (isUniqueViolation(e))
      throw new HttpError(
        'CONFLICT',
        'A decision on this item was recorded at the same moment by someone else; nothing was changed.',
      );
    throw e;
  }
}

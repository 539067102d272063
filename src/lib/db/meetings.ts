/** SQL of the board aggregate: meetings, items, conflicts, votes, decisions. */
import type { Db } from './client';
import { BOARD_SETTING_KEYS, readBoardSettings, type BoardSettings, type VoteChoice } from '../board/settings';

export type MeetingRow = { id: number; meeting_date: string; place: string; version: number; created_at: Date };
export type ItemRow = {
  id: number;
  meeting_id: number;
  proposal_id: number;
  assessment_id: number;
  position: number;
  status: 'listed' | 'decided' | 'deferred' | 'withdrawn';
  carried_from: number | null;
  reference: string;
  title: string;
  proposal_state: string;
  meeting_date: string;
  place: string;
};

const MEETING_COLS = `id::int as id, to_char(meeting_date, 'YYYY-MM-DD') as meeting_date, place, version, created_at`;

export async function getBoardSettings(db: Db): Promise<BoardSettings> {
  return readBoardSettings(await db('app_setting').select('key', 'value').whereIn('key', BOARD_SETTING_KEYS));
}

export async function insertMeeting(db: Db, m: { date: string; place: string; by: string }): Promise<number> {
  const [row] = await db('meeting').insert({ meeting_date: m.date, place: m.place, created_by: m.by }).returning('id');
  return Number(row.id);
}

export async function getMeeting(db: Db, id: number, opts: { lock?: boolean } = {}): Promise<MeetingRow | null> {
  const r = await db.raw(`select ${MEETING_COLS} from meeting where id = ? ${opts.lock ? 'for update' : ''}`, [id]);
  return r.rows[0] ?? null;
}

export async function listMeetings(db: Db) {
  const r = await db.raw(
    `select m.id::int as id, to_char(m.meeting_date, 'YYYY-MM-DD') as meeting_date, m.place, m.version, m.created_at,
            (select count(*)::int from meeting_item i where i.meeting_id = m.id) as items,
            (select count(*)::int from meeting_item i where i.meeting_id = m.id and i.status = 'listed') as open_items
     from meeting m order by m.meeting_date desc, m.id desc limit 200`,
  );
  return r.rows as (MeetingRow & { items: number; open_items: number })[];
}

/** The next meeting after a date (for carrying a deferred item). */
export async function nextMeetingAfter(db: Db, date: string): Promise<MeetingRow | null> {
  const r = await db.raw(
    `select ${MEETING_COLS} from meeting where meeting_date > ? order by meeting_date, id limit 1`,
    [date],
  );
  return r.rows[0] ?? null;
}

const ITEM_SELECT =
  `select i.id::int as id, i.meeting_id::int as meeting_id, i.proposal_id::int as proposal_id, ` +
  `i.assessment_id::int as assessment_id, i.position, i.status,
  i.carried_from::int as carried_from, p.reference, p.title, p.state as proposal_state, to_char(m.meeting_date, 'YYYY-MM-DD') as meeting_date, m.place
  from meeting_item i join proposal p on p.id = i.proposal_id join meeting m on m.id = i.meeting_id`;

export async function getItem(
  db: Db,
  meetingId: number,
  itemId: number,
  opts: { lock?: boolean } = {},
): Promise<ItemRow | null> {
  const r = await db.raw(`${ITEM_SELECT} where i.id = ? and i.meeting_id = ? ${opts.lock ? 'for update of i' : ''}`, [
    itemId,
    meetingId,
  ]);
  return r.rows[0] ?? null;
}

export async function listItems(db: Db, meetingId: number): Promise<ItemRow[]> {
  return (await db.raw(`${ITEM_SELECT} where i.meeting_id = ? order by i.position, i.id`, [meetingId])).rows;
}

export async function insertItem(
  db: Db,
  it: { meetingId: number; proposalId: number; assessmentId: number; carriedFrom?: number },
): Promise<number> {
  const r = await db.raw(
    `insert into meeting_item (meeting_id, proposal_id, assessment_id, position, carried_from)
     values (?, ?, ?, (select coalesce(max(position), 0) + 1 from meeting_item where meeting_id = ?), ?) returning id`,
    [it.meetingId, it.proposalId, it.assessmentId, it.meetingId, it.carriedFrom ?? null],
  );
  return Number(r.rows[0].id);
}

export async function setItemStatus(db: Db, itemId: number, status: ItemRow['status']): Promise<void> {
  await db('meeting_item').where({ id: itemId }).update({ status });
}

/** Deferred items whose proposal waits for a meeting (still on-agenda, no open item). */
export async function waitingDeferred(db: Db) {
  const r = await db.raw(
    `select distinct on (i.proposal_id) i.id::int as id, i.proposal_id::int as proposal_id, i.assessment_id::int as assessment_id
     from meeting_item i join proposal p on p.id = i.proposal_id
     where i.status = 'deferred' and p.state = 'on-agenda'
       and not exists (select 1 from meeting_item o where o.proposal_id = i.proposal_id and o.status = 'listed')
     order by i.proposal_id, i.id desc`,
  );
  return r.rows as { id: number; proposal_id: number; assessment_id: number }[];
}

/** The latest signed assessment of a proposal. */
export async function latestSigned(db: Db, proposalId: number): Promise<{ id: number; number: number } | null> {
  const r = await db.raw(
    `select id::int as id, number from assessment where proposal_id = ? and status = 'signed' order by number desc limit 1`,
    [proposalId],
  );
  return r.rows[0] ?? null;
}

export async function declareConflict(db: Db, itemId: number, userId: string, reason: string): Promise<void> {
  await db('meeting_conflict')
    .insert({ item_id: itemId, user_id: userId, reason })
    .onConflict(['item_id', 'user_id'])
    .merge({ reason, declared_at: db.fn.now() });
  await db('meeting_vote').where({ item_id: itemId, user_id: userId }).delete();
}

export async function hasConflict(db: Db, itemId: number, userId: string): Promise<boolean> {
  return !!(await db('meeting_conflict').where({ item_id: itemId, user_id: userId }).first());
}

export async function castVote(
  db: Db,
  itemId: number,
  userId: string,
  choice: VoteChoice,
  comment: string | null,
): Promise<void> {
  await db('meeting_vote')
    .insert({ item_id: itemId, user_id: userId, choice, comment })
    .onConflict(['item_id', 'user_id'])
    .merge({ choice, comment, voted_at: db.fn.now() });
}

export async function votesOf(db: Db, itemIds: number[]) {
  const r = await db.raw(
    `select v.item_id::int as item_id, v.user_id, u.name, v.choice, v.comment, v.voted_at from meeting_vote v join "user" u on u.id = v.user_id
     where v.item_id = any(?::bigint[]) order by v.voted_at`,
    [itemIds],
  );
  return r.rows as {
    item_id: number;
    user_id: string;
    name: string;
    choice: VoteChoice;
    comment: string | null;
    voted_at: Date;
  }[];
}

export async function conflictsOf(db: Db, itemIds: number[]) {
  const r = await db.raw(
    `select c.item_id::int as item_id, c.user_id, u.name, c.reason, c.declared_at from meeting_conflict c join "user" u on u.id = c.user_id
     where c.item_id = any(?::bigint[]) order by c.declared_at`,
    [itemIds],
  );
  return r.rows as { item_id: number; user_id: string; name: string; reason: string; declared_at: Date }[];
}

export type DecisionInsert = {
  itemId: number;
  proposalId: number;
  outcome: string;
  reasons: string;
  conditions: unknown[];
  appealDays: number | null;
  effectiveDate: string | null;
  registerSeq: number | null;
  by: string;
};

export async function insertDecision(db: Db, d: DecisionInsert): Promise<number> {
  const [row] = await db('board_decision')
    .insert({
      item_id: d.itemId,
      proposal_id: d.proposalId,
      outcome: d.outcome,
      reasons: d.reasons,
      conditions: JSON.stringify(d.conditions),
      appeal_days: d.appealDays,
      effective_date: d.effectiveDate,
      register_seq: d.registerSeq,
      decided_by: d.by,
    })
    .returning('id');
  return Number(row.id);
}

export async function decisionsOf(db: Db, itemIds: number[]) {
  const r = await db.raw(
    `select d.id::int as id, d.item_id::int as item_id, d.outcome, d.reasons, d.conditions, d.appeal_days, ` +
      `to_char(d.effective_date, 'YYYY-MM-DD') as effective_date,
            d.register_seq::int as register_seq, u.name as decided_by, d.decided_at
     from board_decision d left join "user" u on u.id = d.decided_by where d.item_id = any(?::bigint[])`,
    [itemIds],
  );
  return r.rows as {
    id: number;
    item_id: number;
    outcome: string;
    reasons: string;
    conditions: unknown[];
    appeal_days: number | null;
    effective_date: string | null;
    register_seq: number | null;
    decided_by: string | null;
    decided_at: Date;
  }[];
}

/** Bumps the meeting's row version (the agenda changed); returns the new version. */
export async function bumpMeetingVersion(db: Db, meetingId: number): Promise<number> {
  const [row] = await db('meeting').where({ id: meetingId }).increment('version', 1).returning('version');
  return Number(row.version);
}

/** Writes positions 1..n in the given order (the caller has checked the ids are the meeting's). */
export async function setPositions(db: Db, meetingId: number, itemIds: number[]): Promise<void> {
  await db.raw(
    `update meeting_item i set position = o.n from unnest(?::bigint[]) with ordinality as o(id, n) where i.id = o.id and i.meeting_id = ?`,
    [itemIds, meetingId],
  );
}

/** The agenda order of a meeting: the chair (or an admin as clerk) sets it, guarded by the meeting's row version. */
import { recordAudit } from '../db/audit';
import { db, withTransaction } from '../db/client';
import * as store from '../db/meetings';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';

export async function reorderAgenda(by: Caller, meetingId: number, input: { itemIds: number[]; version: number }) {
  return withTransaction(db, async (trx) => {
    const meeting = await store.getMeeting(trx, meetingId, { lock: true });
    if (!meeting) throw new HttpError('NOT_FOUND', `No meeting with id ${meetingId}.`);
    if (meeting.version !== input.version) {
      throw new HttpError(
        'CONFLICT',
        `The agenda was changed by someone else after you opened it (it is at version ${meeting.version}, you ` +
          `sent ${input.version}). Reload the page and order it again; nothing was saved.`,
      );
    }
    const items = await store.listItems(trx, meetingId);
    const have = new Set(items.map((i) => i.id));
    const sent = new Set(input.itemIds);
    if (sent.size !== input.itemIds.length || sent.size !== have.size || input.itemIds.some((x) => !have.has(x))) {
      throw new HttpError(
        'UNPROCESSABLE_CONTENT',
        `List every item of this meeting exactly once (it has ${have.size}: ${items.map((i) => i.id).join(', ')}).`,
        [{ path: ['itemIds'], message: 'not the meeting’s items' }],
      );
    }
    await store.setPositions(trx, meetingId, input.itemIds);
    const version = await store.bumpMeetingVersion(trx, meetingId);
    await recordAudit(trx, {
      actorId: by.id,
      action: 'meeting.reorder',
      entityType: 'meeting',
      entityId: String(meetingId),
      details: { order: input.itemIds.map((x) => items.find((i) => i.id === x)!.reference) },
    });
    return { id: meetingId, version, itemIds: input.itemIds };
  });
}

/** Proposals that may go on an agenda: assessed (a signed-off assessment), the nearest deadline first. */
export async function agendaCandidates() {
  const r = await db.raw(
    `select p.id::int as id, p.reference, p.title, to_char(p.decision_due, 'YYYY-MM-DD') as decision_due,
            (select a.grade_level from assessment a where a.proposal_id = p.id and a.status = 'signed' order by a.number desc limit 1) as risk_level,
            (select a.grade_label from assessment a where a.proposal_id = p.id and a.status = 'signed' order by a.number desc limit 1) as risk_label
     from proposal p where p.state = 'assessed' order by p.decision_due nulls last, p.id limit 200`,
  );
  return (
    r.rows as {
      id: number;
      reference: string;
      title: string;
      decision_due: string | null;
      risk_level: number | null;
      risk_label: string | null;
    }[]
  ).map((x) => ({
    id: x.id,
    reference: x.reference,
    title: x.title,
    decisionDue: x.decision_due,
    riskLevel: x.risk_level,
    riskLabel: x.risk_label,
  }));
}

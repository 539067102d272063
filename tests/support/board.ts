/** Getting proposals through assessment and onto the board's agenda, through the running test server. */
import { testDb } from './db';
import { api, type Session } from './http';
import { allowSignOff, assess, drawParcel, fileProposal, submit } from './proposals';

/** A fresh parcel, filed, submitted, assessed and signed off: a proposal ready for an agenda. Its parcel gets a holding reference (private). */
export async function assessedProposal(
  planner: Session,
  assessor: Session,
  ownerRef = 'HLD-TEST-77',
): Promise<{ id: number; reference: string; parcelId: number }> {
  await allowSignOff();
  const parcelId = await drawParcel(planner);
  await testDb('parcel').where({ id: parcelId }).update({ owner_ref: ownerRef });
  const p = await fileProposal(planner, [{ parcelId }]);
  await submit(planner, p.id);
  const a = await assess(assessor, p.id);
  if (a.status !== 200) throw new Error(`assess: ${a.status} ${JSON.stringify(a.body)}`);
  const s = await api('POST', `/api/assessments/${a.body.id}/sign-off`, {
    session: assessor,
    body: { findings: 'Signed off for the board tests.', version: a.body.version },
  });
  if (s.status !== 200) throw new Error(`sign-off: ${s.status} ${JSON.stringify(s.body)}`);
  return { id: p.id, reference: p.reference, parcelId };
}

export const today = () => new Date().toISOString().slice(0, 10);

export async function createMeeting(
  chair: Session,
  proposalIds: number[],
  date = today(),
  place = 'Tarrow Hall, council room',
) {
  const res = await api('POST', '/api/meetings', { session: chair, body: { date, place, proposalIds } });
  if (res.status !== 201) throw new Error(`meeting: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as {
    id: number;
    items: { id: number; proposalId: number; reference: string; carriedFrom: number | null; status: string }[];
  };
}

export async function vote(session: Session, meetingId: number, itemId: number, choice: string, comment?: string) {
  return api('PUT', `/api/meetings/${meetingId}/items/${itemId}/vote`, {
    session,
    body: { choice, ...(comment ? { comment } : {}) },
  });
}

export async function decide(session: Session, meetingId: number, itemId: number, body: Record<string, unknown>) {
  return api('POST', `/api/meetings/${meetingId}/items/${itemId}/decision`, {
    session,
    body: { reasons: 'The board weighed the assessment and the risk reasons.', ...body },
  });
}

export const CONDITION = {
  text: 'Keep a 6 m grass margin along the watercourse.',
  dueDate: '2027-09-30',
  checkedBy: 'Field officer',
};

/** A proposal decided with `outcome` by the two demo members (quorum 2): returns the register entry. */
export async function decidedProposal(
  s: { planner: Session; assessor: Session; board: Session; chair: Session },
  outcome: 'approved' | 'approved-with-conditions' | 'refused',
  comment?: string,
) {
  const p = await assessedProposal(s.planner, s.assessor);
  const m = await createMeeting(s.chair, [p.id]);
  const item = m.items.find((i) => i.proposalId === p.id)!;
  const choice = outcome === 'approved' ? 'approve' : outcome === 'refused' ? 'refuse' : 'approve-with-conditions';
  for (const who of [s.board, s.chair])
    if ((await vote(who, m.id, item.id, choice, comment)).status !== 200) throw new Error('vote failed');
  const d = await decide(s.chair, m.id, item.id, {
    outcome,
    conditions: outcome === 'approved-with-conditions' ? [CONDITION] : [],
  });
  if (d.status !== 201) throw new Error(`decide: ${d.status} ${JSON.stringify(d.body)}`);
  return {
    proposal: p,
    meetingId: m.id,
    itemId: item.id,
    seq: d.body.registerSeq as number,
    hash: d.body.registerHash as string,
  };
}

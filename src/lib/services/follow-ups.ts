/**
 * Follow-up tasks of board decisions: created in the decision's transaction, listed (overdue first),
 * closed with an outcome (optimistic locking: a stale version gets 409) and backed by evidence files.
 */
import { checkDocument, storeDocument } from './documents';
import { formatDate } from '~/lib/format/dates';
import { recordAudit } from '../db/audit';
import { db, withTransaction, type Db } from '../db/client';
import * as store from '../db/follow-ups';
import { config } from '../config';
import type { TaskOutcome } from '../follow-ups/settings';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';
import { addDays } from '../proposals/states';
import type { Condition } from '../register/content';

export const followUpsUrl = () => `${config().BETTER_AUTH_URL}/follow-ups`;
const today = () => new Date().toISOString().slice(0, 10);

export type DecisionTaskFacts = {
  proposalId: number;
  decisionId: number;
  outcome: string;
  conditions: Condition[];
  effectiveDate: string;
  parcelReferences: string[];
  compensationParcel: string | null;
};

/** The tasks a decision leaves: one per condition, one site check per approval, one per compensation parcel. Inside the decision's transaction. */
export async function createDecisionTasks(trx: Db, f: DecisionTaskFacts): Promise<number[]> {
  if (f.outcome !== 'approved' && f.outcome !== 'approved-with-conditions') return [];
  const settings = await store.getFollowUpSettings(trx);
  const siteDue = addDays(f.effectiveDate, settings['follow-up.site-check-days']);
  const ids: number[] = [];
  for (const [i, c] of f.conditions.entries()) {
    ids.push(
      await store.insertTask(trx, {
        proposalId: f.proposalId,
        decisionId: f.decisionId,
        kind: 'condition',
        conditionIndex: i,
        title: c.text,
        dueDate: c.dueDate,
        checkedBy: c.checkedBy,
        assigneeRole: 'assessor',
      }),
    );
  }
  const parcels = f.parcelReferences.join(', ');
  ids.push(
    await store.insertTask(trx, {
      proposalId: f.proposalId,
      decisionId: f.decisionId,
      kind: 'site-check',
      dueDate: siteDue,
      checkedBy: 'Field officer',
      assigneeRole: 'assessor',
      title:
        `Confirm on site that the conversion ` +
        `of ${f.parcelReferences.length === 1 ? 'parcel' : 'parcels'} ${parcels} follows the decision (effective ${formatDate(f.effectiveDate)}).`,
    }),
  );
  if (f.compensationParcel) {
    ids.push(
      await store.insertTask(trx, {
        proposalId: f.proposalId,
        decisionId: f.decisionId,
        kind: 'compensation-check',
        dueDate: siteDue,
        checkedBy: 'Field officer',
        assigneeRole: 'assessor',
        title: `Confirm on site that parcel ${f.compensationParcel} has been restored to grassland as the compensation for this approval.`,
      }),
    );
  }
  return ids;
}

function view(t: store.TaskRow, evidence: store.EvidenceRow[], on: string) {
  return {
    id: t.id,
    proposalId: t.proposal_id,
    reference: t.reference,
    proposalTitle: t.proposal_title,
    decisionId: t.decision_id,
    registerSeq: t.register_seq,
    kind: t.kind,
    title: t.title,
    dueDate: t.due_date,
    checkedBy: t.checked_by,
    assigneeRole: t.assignee_role,
    status: t.status,
    overdue: t.status === 'open' && t.due_date < on,
    outcomeNote: t.outcome_note,
    outcomeBy: t.outcome_by_name,
    outcomeAt: t.outcome_at?.toISOString() ?? null,
    version: t.version,
    createdAt: t.created_at.toISOString(),
    evidence: evidence
      .filter((e) => e.task_id === t.id)
      .map((e) => ({
        id: e.id,
        fileName: e.file_name,
        mediaType: e.media_type,
        sizeBytes: e.size_bytes,
        sha256: e.sha256,
        uploadedBy: e.uploaded_by_name,
        uploadedAt: e.uploaded_at.toISOString(),
      })),
  };
}

export type FollowUpView = ReturnType<typeof view>;

export async function listFollowUps(
  q: { status?: string; overdue?: boolean; reference?: string; page: number; pageSize: number },
  on = today(),
) {
  const { rows, total } = await store.listTasks(db, { ...q, today: on });
  const evidence = await store.listEvidence(
    db,
    rows.map((r) => r.id),
  );
  const overdueOpen = (await store.listTasks(db, { overdue: true, today: on, page: 1, pageSize: 1 })).total;
  return {
    items: rows.map((r) => view(r, evidence, on)),
    total,
    page: q.page,
    pageSize: q.pageSize,
    overdueOpen,
    today: on,
  };
}

export async function followUpDetail(id: number, conn: Db = db) {
  const t = await store.getTask(conn, id);
  if (!t) throw new HttpError('NOT_FOUND', `No follow-up task with id ${id}.`);
  return view(t, await store.listEvidence(conn, [id]), today());
}

/** Records (or changes) the outcome; the version read must still be current. */
export async function recordOutcome(
  by: Caller,
  id: number,
  input: { outcome: TaskOutcome; note: string; version: number },
) {
  return withTransaction(db, async (trx) => {
    const t = await store.getTask(trx, id, { lock: true });
    if (!t) throw new HttpError('NOT_FOUND', `No follow-up task with id ${id}.`);
    if (t.version !== input.version) {
      throw new HttpError(
        'CONFLICT',
        `Someone else recorded an outcome for this task after you opened it (it is at version ${t.version}, you ` +
          `sent ${input.version}). Reload it; nothing was saved.`,
      );
    }
    if (input.outcome !== 'done' && !input.note.trim())
      throw new HttpError(
        'UNPROCESSABLE_CONTENT',
        'Say what was found when the task is not done or only partly done.',
        [{ path: ['note'], message: 'required unless done' }],
      );
    const version = await store.setOutcome(trx, id, { outcome: input.outcome, note: input.note.trim(), by: by.id });
    await recordAudit(trx, {
      actorId: by.id,
      action: 'follow-up.outcome',
      entityType: 'follow_up_task',
      entityId: String(id),
      details: { proposal: t.reference, kind: t.kind, from: t.status, outcome: input.outcome },
    });
    return followUpDetail(id, trx).then((v) => ({ ...v, version }));
  });
}

export async function addEvidence(by: Caller, id: number, file: { fileName: string; bytes: Uint8Array }) {
  const mediaType = await checkDocument(db, file, { plural: 'evidence files', added: 'added', add: 'Add' });
  return withTransaction(db, async (trx) => {
    const t = await store.getTask(trx, id, { lock: true });
    if (!t) throw new HttpError('NOT_FOUND', `No follow-up task with id ${id}.`);
    return storeDocument(
      trx,
      by,
      file,
      mediaType,
      (row) => store.insertEvidence(trx, { ...row, taskId: id, by: by.id }),
      {
        action: 'follow-up.evidence',
        entityType: 'follow_up_task',
        entityId: String(id),
        details: (evidenceId) => ({ proposal: t.reference, evidenceId }),
      },
    );
  });
}

export async function readEvidence(taskId: number, evidenceId: string) {
  const e = await store.getEvidence(db, taskId, evidenceId);
  if (!e) throw new HttpError('NOT_FOUND', 'No such evidence file on this task.');
  return e;
}

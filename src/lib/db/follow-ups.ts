/** SQL of follow-up tasks, their evidence files, the follow-up settings and the notices already sent. */
import type { Knex } from 'knex';
import {
  FOLLOW_UP_SETTING_KEYS,
  readFollowUpSettings,
  type FollowUpSettings,
  type TaskKind,
  type TaskOutcome,
} from '../follow-ups/settings';
import type { Db } from './client';

export async function getFollowUpSettings(db: Db): Promise<FollowUpSettings> {
  return readFollowUpSettings(await db('app_setting').select('key', 'value').whereIn('key', FOLLOW_UP_SETTING_KEYS));
}

export type NewTask = {
  proposalId: number;
  decisionId: number | null;
  kind: TaskKind;
  conditionIndex?: number | null;
  title: string;
  dueDate: string;
  checkedBy: string;
  assigneeRole: 'assessor' | 'chair';
};

export async function insertTask(db: Db, t: NewTask): Promise<number> {
  const [row] = await db('follow_up_task')
    .insert({
      proposal_id: t.proposalId,
      decision_id: t.decisionId,
      kind: t.kind,
      condition_index: t.conditionIndex ?? null,
      title: t.title,
      due_date: t.dueDate,
      checked_by: t.checkedBy,
      assignee_role: t.assigneeRole,
    })
    .returning('id');
  return Number(row.id);
}

export type TaskRow = {
  id: number;
  proposal_id: number;
  reference: string;
  proposal_title: string;
  decision_id: number | null;
  register_seq: number | null;
  kind: TaskKind;
  condition_index: number | null;
  title: string;
  due_date: string;
  checked_by: string;
  assignee_role: 'assessor' | 'chair';
  status: 'open' | TaskOutcome;
  outcome_note: string | null;
  outcome_by_name: string | null;
  outcome_at: Date | null;
  version: number;
  created_at: Date;
  evidence_count: number;
};

const SELECT =
  `select t.id::int as id, t.proposal_id::int as proposal_id, p.reference, p.title as proposal_title, ` +
  `t.decision_id::int as decision_id, d.register_seq::int as register_seq,
  t.kind, t.condition_index, t.title, to_char(t.due_date, 'YYYY-MM-DD') as due_date, t.checked_by, t.assignee_role,` +
  ` t.status, t.outcome_note, u.name as outcome_by_name,
  t.outcome_at, t.version, t.created_at, (select count(*)::int from follow_up_evidence e where e.task_id = t.id) as evidence_count
  from follow_up_task t join proposal p on p.id = t.proposal_id left join board_decision d on d.id = t.decision_id left join "user" u on u.id = t.outcome_by`;

export async function getTask(db: Db, id: number, opts: { lock?: boolean } = {}): Promise<TaskRow | null> {
  if (opts.lock) await db.raw('select 1 from follow_up_task where id = ? for update', [id]);
  const r = await db.raw(`${SELECT} where t.id = ?`, [id]);
  return r.rows[0] ?? null;
}

export type TaskFilter = {
  status?: string;
  overdue?: boolean;
  reference?: string;
  today: string;
  page: number;
  pageSize: number;
};

/** Open overdue tasks first (oldest due date first), then the rest by due date. */
export async function listTasks(db: Db, f: TaskFilter): Promise<{ rows: TaskRow[]; total: number }> {
  const where: string[] = ['true'];
  const args: Knex.Value[] = [];
  if (f.status) where.push('t.status = ?') && args.push(f.status);
  if (f.overdue !== undefined)
    where.push(
      f.overdue ? "(t.status = 'open' and t.due_date < ?::date)" : "not (t.status = 'open' and t.due_date < ?::date)",
    ) && args.push(f.today);
  if (f.reference) where.push('p.reference ilike ?') && args.push(`%${f.reference.replace(/[%_\\]/g, '\\$&')}%`);
  const w = where.join(' and ');
  const [rows, total] = await Promise.all([
    db.raw(
      `${SELECT} where ${w} order by (t.status = 'open' and t.due_date < ?::date) desc, (t.status = 'open') desc, t.due_date, t.id limit ? offset ?`,
      [...args, f.today, f.pageSize, (f.page - 1) * f.pageSize],
    ),
    db.raw(`select count(*)::int as n from follow_up_task t join proposal p on p.id = t.proposal_id where ${w}`, args),
  ]);
  return { rows: rows.rows, total: Number(total.rows[0].n) };
}

export async function setOutcome(
  db: Db,
  id: number,
  o: { outcome: TaskOutcome; note: string; by: string },
): Promise<number> {
  const [row] = await db('follow_up_task')
    .where({ id })
    .update({
      status: o.outcome,
      outcome_note: o.note,
      outcome_by: o.by,
      outcome_at: db.fn.now(),
      version: db.raw('version + 1'),
    })
    .returning('version');
  return row.version;
}

/** Open tasks whose due date has passed (for the overdue notices). */
export async function overdueOpenTasks(db: Db, today: string): Promise<TaskRow[]> {
  return (await db.raw(`${SELECT} where t.status = 'open' and t.due_date < ?::date order by t.due_date, t.id`, [today]))
    .rows;
}

export type EvidenceRow = {
  id: string;
  task_id: number;
  file_name: string;
  media_type: string;
  size_bytes: number;
  sha256: string;
  uploaded_by_name: string | null;
  uploaded_at: Date;
};

export async function insertEvidence(
  db: Db,
  e: { id: string; taskId: number; fileName: string; mediaType: string; bytes: Uint8Array; sha256: string; by: string },
): Promise<void> {
  await db('follow_up_evidence').insert({
    id: e.id,
    task_id: e.taskId,
    file_name: e.fileName,
    media_type: e.mediaType,
    size_bytes: e.bytes.length,
    sha256: e.sha256,
    bytes: Buffer.from(e.bytes),
    uploaded_by: e.by,
  });
}

export async function listEvidence(db: Db, taskIds: number[]): Promise<EvidenceRow[]> {
  if (!taskIds.length) return [];
  return db('follow_up_evidence as e')
    .leftJoin('user as u', 'u.id', 'e.uploaded_by')
    .select(
      'e.id',
      db.raw('e.task_id::int as task_id'),
      'e.file_name',
      'e.media_type',
      'e.size_bytes',
      'e.sha256',
      'u.name as uploaded_by_name',
      'e.uploaded_at',
    )
    .whereIn('e.task_id', taskIds)
    .orderBy('e.uploaded_at');
}

export async function getEvidence(
  db: Db,
  taskId: number,
  id: string,
): Promise<(EvidenceRow & { bytes: Buffer }) | null> {
  return (
    (await db('follow_up_evidence as e')
      .leftJoin('user as u', 'u.id', 'e.uploaded_by')
      .select(
        'e.id',
        'e.task_id',
        'e.file_name',
        'e.media_type',
        'e.size_bytes',
        'e.sha256',
        'e.bytes',
        'u.name as uploaded_by_name',
        'e.uploaded_at',
      )
      .where({ 'e.task_id': taskId, 'e.id': id })
      .first()) ?? null
  );
}

/** Claims a notice: true when this call recorded it (send it now), false when it was sent before. */
export async function claimNotice(
  db: Db,
  subjectType: 'proposal' | 'follow_up_task',
  subjectId: number,
  notice: string,
): Promise<boolean> {
  const r = await db.raw(
    'insert into notice_sent (subject_type, subject_id, notice) values (?, ?, ?) on conflict do nothing returning notice',
    [subjectType, subjectId, notice],
  );
  return r.rows.length === 1;
}

export async function countRecipients(
  db: Db,
  subjectType: string,
  subjectId: number,
  notice: string,
  recipients: number,
): Promise<void> {
  await db('notice_sent').where({ subject_type: subjectType, subject_id: subjectId, notice }).update({ recipients });
}

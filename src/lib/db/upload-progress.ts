/** Where an upload's long work stands (table upload_progress; server-only). */
import type { Db } from './client';

export type ProgressPhase =
  | 'reading'
  | 'staged'
  | 'checking'
  | 'keeping'
  | 'comparing'
  | 'validated'
  | 'storing'
  | 'overlay'
  | 'saved'
  | 'failed'
  | 'cancelled';

export type ProgressRow = {
  upload_id: string;
  purpose: 'parcels' | 'reference';
  file_name: string;
  created_by: string;
  phase: ProgressPhase;
  done: number | null;
  total: number | null;
  message: string | null;
  failed_in: ProgressPhase | null;
  batch_id: string | null;
  result: Record<string, unknown> | null;
  started_at: Date;
  phase_at: Date;
  updated_at: Date;
};

/** A new step of an upload (read, check or save) begins: its first phase, its start time, no failure. */
export async function beginStep(
  db: Db,
  row: {
    uploadId: string;
    purpose: string;
    fileName: string;
    createdBy: string;
    phase: ProgressPhase;
    total?: number | null;
  },
): Promise<void> {
  await db.raw(
    `insert into upload_progress (upload_id, purpose, file_name, created_by, phase, total)
     values (?, ?, ?, ?, ?, ?)
     on conflict (upload_id) do update set phase = excluded.phase, done = null, total = excluded.total, message = null,
       failed_in = null, started_at = now(), phase_at = now(), updated_at = now()`,
    [row.uploadId, row.purpose, row.fileName, row.createdBy, row.phase, row.total ?? null],
  );
}

/**
 * Moves to a phase or counts within it. A change of phase is always written; within a phase at
 * most one write per `minIntervalMs` (the database decides, so it holds whichever instance writes), unless
 * the total changes.
 */
export async function setProgress(
  db: Db,
  uploadId: string,
  p: { phase: ProgressPhase; done?: number | null; total?: number | null },
  minIntervalMs: number,
): Promise<void> {
  await db.raw(
    `update upload_progress set phase = :phase, done = :done, total = coalesce(:total, total),
       phase_at = case when phase = :phase then phase_at else now() end, updated_at = now()
     where upload_id = :uploadId and phase not in ('failed', 'cancelled', 'saved')
       and (phase <> :phase or total is distinct from coalesce(:total, total)
            or updated_at < now() - make_interval(secs => :seconds))`,
    { phase: p.phase, done: p.done ?? null, total: p.total ?? null, uploadId, seconds: minIntervalMs / 1000 },
  );
}

/** The last phase of a step, written inside the step's own transaction so it commits with the work. */
export async function endStep(
  db: Db,
  uploadId: string,
  p: {
    phase: 'staged' | 'validated' | 'saved' | 'cancelled';
    total?: number | null;
    batchId?: string;
    result?: unknown;
  },
): Promise<void> {
  await db('upload_progress')
    .where({ upload_id: uploadId })
    .update({
      phase: p.phase,
      done: p.total ?? null,
      total: p.total ?? null,
      message: null,
      failed_in: null,
      ...(p.batchId ? { batch_id: p.batchId, result: JSON.stringify(p.result ?? null) } : {}),
      phase_at: db.fn.now(),
      updated_at: db.fn.now(),
    });
}

export async function failStep(db: Db, uploadId: string, message: string): Promise<void> {
  await db.raw(
    `update upload_progress set failed_in = phase, phase = 'failed', message = ?, phase_at = now(), updated_at = now()
     where upload_id = ? and phase <> 'failed'`,
    [message, uploadId],
  );
}

export async function deleteProgress(db: Db, uploadId: string): Promise<void> {
  await db('upload_progress').where({ upload_id: uploadId }).delete();
}

export async function getProgress(db: Db, uploadId: string): Promise<ProgressRow | null> {
  return (await db('upload_progress').where({ upload_id: uploadId }).first()) ?? null;
}

/** The caller's uploads touched in the last `days` days, newest first. */
export async function recentProgress(db: Db, userId: string, days: number, limit: number): Promise<ProgressRow[]> {
  return db('upload_progress')
    .where({ created_by: userId })
    .andWhere('updated_at', '>', db.raw(`now() - make_interval(days => ?)`, [days]))
    .orderBy('updated_at', 'desc')
    .limit(limit);
}

/** Rows of uploads not touched for `days` days (their staging has long expired). */
export async function deleteOldProgress(db: Db, days: number): Promise<number> {
  return db('upload_progress')
    .where('updated_at', '<', db.raw(`now() - make_interval(days => ?)`, [days]))
    .delete();
}

/**
 * The progress of an upload's long work, kept in PostgreSQL (db/upload-progress.ts) so a reload,
 * a later visit or another instance finds it: the steps call `trackStep` around their work and
 * `recordProgress` at phase changes and now and then within a phase (at most once a second).
 */
import { BroadcastChannel } from 'node:worker_threads';
import { hasAnyRole } from '../auth/roles';
import { db, type Db } from '../db/client';
import * as progress from '../db/upload-progress';
import type { ProgressPhase } from '../db/upload-progress';
import * as uploads from '../db/uploads';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';
import { logger } from '../log.mjs';

/** Within a phase, one write a second at most: enough for a person watching, nothing for the pipeline. */
export const PROGRESS_INTERVAL_MS = 1000;
/** A running phase not written for this long belongs to work that stopped (an instance restarted). */
export const STALLED_AFTER_MS = 10 * 60_000;
export const RUNNING: readonly ProgressPhase[] = ['reading', 'checking', 'keeping', 'comparing', 'storing', 'overlay'];
const FAILED_WORDS = 'That step stopped on the server; try again.';

/** Records a phase or a count within it; never fails the upload (a lost progress write only delays what the user sees). */
export async function recordProgress(
  uploadId: string,
  phase: ProgressPhase,
  done?: number | null,
  total?: number | null,
) {
  await progress.setProgress(db, uploadId, { phase, done, total }, PROGRESS_INTERVAL_MS).catch((error: unknown) => {
    logger.warn({ err: { message: (error as Error).message } }, 'upload progress not recorded');
  });
}

/**
 * Runs one step of a staged upload (check or save) with its progress: the first phase now, the
 * failure's message if it throws. Only the uploader's (or an administrator's) staged upload is
 * tracked; anything else is left to the step, which answers 404.
 */
export async function trackStep<T>(by: Caller, id: string, phase: ProgressPhase, fn: () => Promise<T>): Promise<T> {
  const row = await uploads.getStaging(db, id);
  const tracked = !!row && (row.created_by === by.id || hasAnyRole(by.roles, ['admin']));
  if (tracked)
    await progress.beginStep(db, {
      uploadId: id,
      purpose: row.purpose,
      fileName: row.file_name,
      createdBy: row.created_by,
      phase,
    });
  try {
    return await fn();
  } catch (error) {
    if (tracked) await progress.failStep(db, id, error instanceof HttpError ? error.message : FAILED_WORDS);
    throw error;
  }
}

/**
 * A channel the worker pool posts `{ done, total }` on while it checks a file's features
 * (gis-tasks.ts, stageFile), recorded as `phase`. `stop()` closes it and waits for
 * the last write, so no late count overwrites the next phase.
 */
export function watchChunks(
  uploadId: string,
  phase: ProgressPhase = 'checking',
): { name: string; stop: () => Promise<void> } {
  const name = `upload-progress:${uploadId}`;
  const channel = new BroadcastChannel(name);
  let last: Promise<void> = Promise.resolve();
  let open = true;
  channel.onmessage = (event) => {
    const { done, total } = (event as { data: { done: number; total: number } }).data;
    if (open) last = last.then(() => recordProgress(uploadId, phase, done, total));
  };
  return {
    name,
    stop: async () => {
      open = false;
      channel.close();
      await last;
    },
  };
}

export { beginStep, endStep, deleteProgress } from '../db/upload-progress';

/** Who may read an upload's progress: its uploader, and administrators (who may continue anyone's). */
export function mayRead(by: Caller, ownerId: string): boolean {
  return ownerId === by.id || hasAnyRole(by.roles, ['admin']);
}

export type UploadState = 'running' | 'staged' | 'validated' | 'saved' | 'failed' | 'cancelled' | 'expired';

/** The state in words the wizard acts on, from the stored phase, the staged upload and the clock. */
export function stateOf(
  row: Pick<progress.ProgressRow, 'phase' | 'updated_at' | 'message'> | null,
  staging: { validated_at: Date | null; expires_at: Date } | null,
  now: number,
): { state: UploadState; message: string | null } {
  const live = !!staging && staging.expires_at.getTime() >= now;
  if (row && RUNNING.includes(row.phase)) {
    if (now - row.updated_at.getTime() < STALLED_AFTER_MS) return { state: 'running', message: null };
    return {
      state: 'failed',
      message: 'This step stopped without finishing (the server may have restarted). Try it again.',
    };
  }
  if (row?.phase === 'saved' || row?.phase === 'cancelled') return { state: row.phase, message: null };
  if (row?.phase === 'failed') return { state: 'failed', message: row.message };
  if (!live) return { state: 'expired', message: 'This upload has expired or is gone; upload the file again.' };
  return { state: staging.validated_at ? 'validated' : 'staged', message: null };
}

export async function loadReadable(conn: Db, by: Caller, id: string) {
  const [row, staging] = await Promise.all([progress.getProgress(conn, id), uploads.getStaging(conn, id)]);
  const owner = row?.created_by ?? staging?.created_by;
  if (!owner || !mayRead(by, owner) || (!hasAnyRole(by.roles, ['admin']) && (row ?? staging)!.purpose === 'reference'))
    throw new HttpError('NOT_FOUND', 'No such upload. It may belong to someone else, or the link is wrong.');
  return { row, staging };
}

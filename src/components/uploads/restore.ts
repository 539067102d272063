/**
 * Picking an upload up again from what the server stored (GET /api/uploads/{id}) after a reload or
 * a later visit: which step to show and with what, and the `?upload=<id>` parameter that names it.
 */
import { useEffect, useState } from 'react';
import { apiFetch } from '../ui/api-client';
import type { PhaseKey, PhaseState } from './Progress';
import { CHECK_PHASES } from './progress-words';
import type { Mapping, UploadStatus } from './types';

export const UPLOAD_PARAM = 'upload';

export function uploadParam(): string | null {
  return new URL(window.location.href).searchParams.get(UPLOAD_PARAM);
}

/** Names the upload in the address (replacing the entry, so Back still leaves the page), or forgets it. */
export function setUploadParam(id: string | null): void {
  const url = new URL(window.location.href);
  if (id) url.searchParams.set(UPLOAD_PARAM, id);
  else url.searchParams.delete(UPLOAD_PARAM);
  window.history.replaceState(window.history.state, '', url);
}

const done: PhaseState = { state: 'done' };
const waiting: PhaseState = { state: 'waiting' };

/** The wizard's four phases as the stored state tells them (no timings: those belong to the page that ran them). */
export function phasesOf(s: UploadStatus): Record<PhaseKey, PhaseState> {
  const inCheck = CHECK_PHASES.includes(s.state === 'failed' ? (s.failedIn ?? 'checking') : s.phase);
  const check: PhaseState =
    s.state === 'running' && inCheck
      ? { state: 'running' }
      : s.state === 'failed' && inCheck
        ? { state: 'failed' }
        : s.state === 'staged' || s.state === 'cancelled' || s.state === 'expired'
          ? waiting
          : done;
  const save: PhaseState =
    s.state === 'saved'
      ? done
      : s.state === 'running' && !inCheck
        ? { state: 'running' }
        : s.state === 'failed' && !inCheck
          ? { state: 'failed' }
          : waiting;
  return { upload: done, parse: done, validate: check, save };
}

export type Restored = {
  step: 'file' | 'mapping' | 'report' | 'saved' | 'working';
  layerName: string;
  mapping: Mapping | null;
  epsg: number | null;
  error: string | null;
};

/** Where the wizard resumes for a stored state; `mapping: null` means "suggest one from the columns". */
export function restoredView(s: UploadStatus): Restored {
  const layerName = s.choice?.layer ?? s.staged?.layers[0]?.name ?? '';
  const base = {
    layerName,
    mapping: (s.choice?.mapping as Mapping) ?? null,
    epsg: s.choice?.epsg ?? null,
    error: null,
  };
  if (s.state === 'running') return { ...base, step: 'working' };
  if (s.state === 'saved' && s.saved) return { ...base, step: 'saved' };
  if (s.state === 'validated' && s.report) return { ...base, step: 'report' };
  if (s.state === 'staged' && s.staged) return { ...base, step: 'mapping' };
  if (s.state === 'failed' && s.staged) {
    const saving = s.failedIn === 'storing' || s.failedIn === 'overlay';
    return { ...base, step: saving && s.report ? 'report' : 'mapping', error: s.message };
  }
  const why =
    s.state === 'cancelled'
      ? `The upload of “${s.fileName}” was cancelled; nothing of it was kept.`
      : (s.message ?? `The upload of “${s.fileName}” has expired; upload the file again.`);
  return { ...base, step: 'file', error: why };
}

/**
 * Polls the stored state every second while `active`; the latest answer, or null before the first.
 * A new `round` starts afresh (no answer read before it is returned).
 */
export function useUploadStatus(id: string | null, active: boolean, round = 0): UploadStatus | null {
  const key = active && id ? `${id}:${round}` : null;
  // Each answer carries the key it was read under, so a render after a change of key never sees an older one.
  const [got, setGot] = useState<{ key: string; status: UploadStatus } | null>(null);
  useEffect(() => {
    if (!key || !id) return;
    let stopped = false;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const tick = async () => {
      const status = await apiFetch<UploadStatus>(`/api/uploads/${id}`).catch(() => null);
      if (stopped) return;
      if (status) setGot({ key, status });
      timer = setTimeout(() => void tick(), 1000);
    };
    void tick();
    return () => {
      stopped = true;
      clearTimeout(timer);
    };
  }, [key, id]);
  return got && got.key === key ? got.status : null;
}

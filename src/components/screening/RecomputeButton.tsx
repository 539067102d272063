/** Recomputes the screening map on request (assessors and admins) and reloads the page with the new run. */
import { useState } from 'react';
import { ApiError, apiFetch } from '../ui/api-client';

export function RecomputeButton() {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  async function run() {
    setBusy(true);
    setError(null);
    try {
      await apiFetch<{ screened: number; ms: number }>('/api/screening/recompute', { method: 'POST' });
      window.location.reload();
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The map could not be recomputed.');
      setBusy(false);
    }
  }
  return (
    <div className="flex flex-col gap-1">
      <button type="button" className="btn self-start" onClick={run} disabled={busy} aria-busy={busy}>
        {busy ? 'Recomputing…' : 'Recompute now'}
      </button>
      {error && (
        <p className="notice notice-warn" role="alert">
          ⚠ {error}
        </p>
      )}
    </div>
  );
}

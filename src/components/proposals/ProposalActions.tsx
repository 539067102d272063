/** The state changes the signed-in user may make on a proposal, each with a reason field when the rules ask for one. */
import { useState } from 'react';
import { ApiError, apiFetch } from '../ui/api-client';

export type ActionOption = { to: string; label: string; reasonRequired: boolean };

export function ProposalActions({ id, version, actions }: { id: number; version: number; actions: ActionOption[] }) {
  const [open, setOpen] = useState<ActionOption | null>(null);
  const [reason, setReason] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function go(a: ActionOption) {
    setBusy(true);
    setError(null);
    try {
      await apiFetch(`/api/proposals/${id}/transitions`, {
        body: { to: a.to, version, reason: reason.trim() || undefined },
      });
      window.location.reload();
    } catch (e) {
      setError(
        e instanceof ApiError
          ? e.status === 409 && /someone else/i.test(e.message)
            ? `Someone else changed this proposal while you had it open. ${e.message}`
            : e.message
          : 'The change could not be made.',
      );
      setBusy(false);
    }
  }

  if (actions.length === 0) return null;
  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap gap-2">
        {actions.map((a) => (
          <button
            key={`${a.to}-${a.label}`}
            type="button"
            className={a.to === 'withdrawn' || a.to === 'returned' ? 'btn btn-quiet' : 'btn'}
            disabled={busy}
            onClick={() => (a.reasonRequired ? (setOpen(a), setError(null)) : void go(a))}
          >
            {a.label}
          </button>
        ))}
      </div>
      {open && (
        <form
          className="flex flex-col gap-2 rounded border border-line p-3"
          onSubmit={(e) => (e.preventDefault(), void go(open))}
        >
          <label className="field" htmlFor="transition-reason">
            <span>Reason for “{open.label}” (kept in the proposal history and shown to the planner)</span>
            <textarea
              id="transition-reason"
              className="input"
              rows={3}
              value={reason}
              onChange={(e) => setReason(e.target.value)}
              required
              minLength={3}
            />
          </label>
          <div className="flex flex-wrap gap-2">
            <button className="btn" type="submit" disabled={busy}>
              {open.label}
            </button>
            <button className="btn btn-quiet" type="button" onClick={() => setOpen(null)}>
              Cancel
            </button>
          </div>
        </form>
      )}
      {error && (
        <p className="notice notice-warn" role="alert">
          ⚠ {error}
        </p>
      )}
    </div>
  );
}

/** Starts (or re-runs) the draft assessment with the authority's defaults, then opens it. */
export function RunAssessmentButton({
  proposalId,
  label,
  draftVersion,
}: {
  proposalId: number;
  label: string;
  draftVersion?: number;
}) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  async function run() {
    setBusy(true);
    setError(null);
    try {
      const a = await apiFetch<{ id: number }>(`/api/proposals/${proposalId}/assessment`, {
        body: draftVersion ? { version: draftVersion } : {},
      });
      window.location.href = `/assessments/${a.id}`;
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The assessment could not be run.');
      setBusy(false);
    }
  }
  return (
    <div className="flex flex-col gap-2">
      <button type="button" className="btn self-start" disabled={busy} onClick={() => void run()}>
        {busy ? 'Running the estimate for every parcel…' : label}
      </button>
      {error && (
        <p className="notice notice-warn" role="alert">
          ⚠ {error}
        </p>
      )}
    </div>
  );
}

/** The chair's agenda tools on a meeting: move items up or down (sent with the meeting version) and add an assessed proposal. */
import { useState } from 'react';
import { apiFetch } from '../ui/api-client';
import { problemText } from './errors';
import type { Candidate } from './MeetingForm';

type Item = { id: number; reference: string; title: string };

export function AgendaTools({
  meetingId,
  version,
  items,
  candidates,
}: {
  meetingId: number;
  version: number;
  items: Item[];
  candidates: Candidate[];
}) {
  const [order, setOrder] = useState(items);
  const [pick, setPick] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const changed = order.some((x, i) => x.id !== items[i]!.id);
  const move = (i: number, d: -1 | 1) =>
    setOrder((o) => {
      const n = [...o];
      [n[i], n[i + d]] = [n[i + d]!, n[i]!];
      return n;
    });

  async function run(f: () => Promise<unknown>, fallback: string) {
    setBusy(true);
    setError(null);
    try {
      await f();
      window.location.reload();
    } catch (e) {
      setError(problemText(e, fallback));
      setBusy(false);
    }
  }

  return (
    <div className="flex flex-col gap-3">
      {items.length > 1 && (
        <div>
          <h3 className="text-sm font-medium text-muted">Order of the agenda</h3>
          <ol className="mt-1 flex flex-col gap-1">
            {order.map((x, i) => (
              <li key={x.id} className="flex flex-wrap items-center gap-2 text-sm">
                <span className="min-w-0 flex-1 break-words">
                  {i + 1}. {x.reference} {x.title}
                </span>
                <button
                  type="button"
                  className="btn btn-quiet px-2 py-1"
                  disabled={busy || i === 0}
                  onClick={() => move(i, -1)}
                  aria-label={`Move ${x.reference} up`}
                >
                  ↑
                </button>
                <button
                  type="button"
                  className="btn btn-quiet px-2 py-1"
                  disabled={busy || i === order.length - 1}
                  onClick={() => move(i, 1)}
                  aria-label={`Move ${x.reference} down`}
                >
                  ↓
                </button>
              </li>
            ))}
          </ol>
          <button
            type="button"
            className="btn mt-2"
            disabled={busy || !changed}
            onClick={() =>
              void run(
                () =>
                  apiFetch(`/api/meetings/${meetingId}/order`, {
                    method: 'PUT',
                    body: { itemIds: order.map((x) => x.id), version },
                  }),
                'The order was not saved.',
              )
            }
          >
            Save the order
          </button>
        </div>
      )}
      <form
        className="flex flex-wrap items-end gap-2"
        onSubmit={(e) => (
          e.preventDefault(),
          void run(
            () => apiFetch(`/api/meetings/${meetingId}/items`, { body: { proposalId: Number(pick) } }),
            'The item was not added.',
          )
        )}
      >
        <label className="field min-w-0 flex-1" htmlFor="add-item">
          <span>Add an assessed proposal</span>
          <select
            id="add-item"
            className="input w-full"
            value={pick}
            onChange={(e) => setPick(e.target.value)}
            required
          >
            <option value="">{candidates.length ? 'Choose a proposal…' : 'No assessed proposal is waiting'}</option>
            {candidates.map((c) => (
              <option key={c.id} value={c.id}>
                {c.reference} {c.title}
              </option>
            ))}
          </select>
        </label>
        <button className="btn" type="submit" disabled={busy || !pick}>
          Add to the agenda
        </button>
      </form>
      {error && (
        <p className="notice notice-warn" role="alert">
          ⚠ {error}
        </p>
      )}
    </div>
  );
}

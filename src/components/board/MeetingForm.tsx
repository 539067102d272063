/** The chair (or an admin as clerk) builds a meeting: date, place, and the assessed proposals in agenda order. */
import { formatDate } from '~/lib/format/dates';
import { useState } from 'react';
import { apiFetch } from '../ui/api-client';
import { problemText } from './errors';

export type Candidate = {
  id: number;
  reference: string;
  title: string;
  riskLabel: string | null;
  riskLevel: number | null;
  decisionDue: string | null;
};

export function MeetingForm({ candidates, defaultDate }: { candidates: Candidate[]; defaultDate: string }) {
  const [date, setDate] = useState(defaultDate);
  const [place, setPlace] = useState('');
  const [order, setOrder] = useState<number[]>([]);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const byId = new Map(candidates.map((c) => [c.id, c]));
  const toggle = (id: number) => setOrder((o) => (o.includes(id) ? o.filter((x) => x !== id) : [...o, id]));
  const move = (i: number, d: -1 | 1) =>
    setOrder((o) => {
      const n = [...o];
      [n[i], n[i + d]] = [n[i + d]!, n[i]!];
      return n;
    });

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const m = await apiFetch<{ id: number }>('/api/meetings', { body: { date, place, proposalIds: order } });
      window.location.href = `/board/meetings/${m.id}`;
    } catch (err) {
      setError(problemText(err, 'The meeting was not created.'));
      setBusy(false);
    }
  }

  return (
    <form className="flex flex-col gap-3" onSubmit={(e) => void submit(e)} aria-labelledby="new-meeting-h">
      <div className="grid gap-3 sm:grid-cols-[10rem_1fr]">
        <label className="field" htmlFor="meeting-date">
          <span>Date</span>
          <input
            id="meeting-date"
            className="input"
            type="date"
            required
            value={date}
            onChange={(e) => setDate(e.target.value)}
          />
        </label>
        <label className="field" htmlFor="meeting-place">
          <span>Place</span>
          <input
            id="meeting-place"
            className="input"
            required
            minLength={2}
            maxLength={200}
            value={place}
            onChange={(e) => setPlace(e.target.value)}
            placeholder="e.g. Tarrow Hall, council room"
          />
        </label>
      </div>
      <fieldset className="flex flex-col gap-1">
        <legend className="text-sm font-medium text-muted">
          Assessed proposals (signed-off assessments) to put on the agenda
        </legend>
        {candidates.length === 0 && (
          <p className="text-sm text-muted">
            No proposal is waiting with a signed-off assessment. Deferred items are carried in by themselves.
          </p>
        )}
        {candidates.map((c) => (
          <label key={c.id} className="flex items-start gap-2 text-sm">
            <input type="checkbox" className="mt-1" checked={order.includes(c.id)} onChange={() => toggle(c.id)} />
            <span className="min-w-0 break-words">
              <strong>{c.reference}</strong> {c.title}
              {c.riskLevel ? ` · risk ${c.riskLevel} of 4 (${c.riskLabel})` : ''}
              {c.decisionDue ? ` · decision due ${formatDate(c.decisionDue)}` : ''}
            </span>
          </label>
        ))}
      </fieldset>
      {order.length > 0 && (
        <div>
          <p className="text-sm font-medium text-muted">Agenda order</p>
          <ol className="mt-1 flex flex-col gap-1">
            {order.map((id, i) => (
              <li key={id} className="flex flex-wrap items-center gap-2 text-sm">
                <span className="min-w-0 flex-1 break-words">
                  {i + 1}. {byId.get(id)?.reference} {byId.get(id)?.title}
                </span>
                <button
                  type="button"
                  className="btn btn-quiet px-2 py-1"
                  disabled={i === 0}
                  onClick={() => move(i, -1)}
                  aria-label={`Move ${byId.get(id)?.reference} up`}
                >
                  ↑
                </button>
                <button
                  type="button"
                  className="btn btn-quiet px-2 py-1"
                  disabled={i === order.length - 1}
                  onClick={() => move(i, 1)}
                  aria-label={`Move ${byId.get(id)?.reference} down`}
                >
                  ↓
                </button>
              </li>
            ))}
          </ol>
        </div>
      )}
      <button className="btn self-start" type="submit" disabled={busy}>
        {busy ? 'Creating…' : 'Create the meeting'}
      </button>
      {error && (
        <p className="notice notice-warn" role="alert">
          ⚠ {error}
        </p>
      )}
    </form>
  );
}

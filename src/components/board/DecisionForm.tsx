/** The chair (or an admin as clerk) records the board's decision on an item: outcome, reasons, conditions, appeal window, effective date. */
import { useState } from 'react';
import { apiFetch } from '../ui/api-client';
import { problemText } from './errors';

const OUTCOMES = [
  ['approved', 'Approve'],
  ['approved-with-conditions', 'Approve with conditions'],
  ['refused', 'Refuse'],
  ['deferred', 'Defer to a later meeting'],
] as const;
type Outcome = (typeof OUTCOMES)[number][0];
type Condition = { text: string; dueDate: string; checkedBy: string };

type Props = {
  meetingId: number;
  itemId: number;
  reference: string;
  eligible: number;
  quorum: number;
  appealDays: number;
};

export function DecisionForm({ meetingId, itemId, reference, eligible, quorum, appealDays }: Props) {
  const reached = eligible >= quorum;
  const [outcome, setOutcome] = useState<Outcome | ''>('');
  const [reasons, setReasons] = useState('');
  const [conditions, setConditions] = useState<Condition[]>([{ text: '', dueDate: '', checkedBy: '' }]);
  const [days, setDays] = useState(String(appealDays));
  const [effective, setEffective] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const withConditions = outcome === 'approved-with-conditions';
  const setCond = (i: number, k: keyof Condition, v: string) =>
    setConditions((c) => c.map((x, j) => (j === i ? { ...x, [k]: v } : x)));

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    const body = {
      outcome,
      reasons,
      conditions: withConditions ? conditions : [],
      ...(outcome !== 'deferred' && days !== '' ? { appealDays: Number(days) } : {}),
      ...(outcome !== 'deferred' && effective ? { effectiveDate: effective } : {}),
    };
    try {
      await apiFetch(`/api/meetings/${meetingId}/items/${itemId}/decision`, { body });
      window.location.reload();
    } catch (err) {
      setError(problemText(err, 'The decision was not recorded.'));
      setBusy(false);
    }
  }

  return (
    <form className="flex flex-col gap-3" onSubmit={(e) => void submit(e)} aria-label={`Decision on ${reference}`}>
      <p className={reached ? 'notice text-sm' : 'notice notice-warn text-sm'} data-testid={`quorum-${itemId}`}>
        {reached
          ? `Quorum reached: ${eligible} eligible vote${eligible === 1 ? '' : 's'}, ${quorum} needed.`
          : `No quorum yet: ${eligible} eligible vote${eligible === 1 ? '' : 's'} of the ${quorum} needed ` +
            '(members who declared a conflict do not count). Until the votes are in, only a deferral can be recorded.'}
      </p>
      <label className="field" htmlFor={`outcome-${itemId}`}>
        <span>Outcome</span>
        <select
          id={`outcome-${itemId}`}
          className="input"
          required
          value={outcome}
          onChange={(e) => setOutcome(e.target.value as Outcome)}
        >
          <option value="">Choose…</option>
          {OUTCOMES.map(([v, l]) => (
            <option key={v} value={v} disabled={!reached && v !== 'deferred'}>
              {l}
            </option>
          ))}
        </select>
      </label>
      <label className="field" htmlFor={`reasons-${itemId}`}>
        <span>Reasons (published in the register)</span>
        <textarea
          id={`reasons-${itemId}`}
          className="input"
          rows={3}
          required
          minLength={10}
          maxLength={10000}
          value={reasons}
          onChange={(e) => setReasons(e.target.value)}
        />
      </label>
      {withConditions && (
        <fieldset className="flex flex-col gap-2">
          <legend className="text-sm font-medium text-muted">
            Conditions (each with its due date and who checks it)
          </legend>
          {conditions.map((c, i) => (
            <div key={i} className="grid gap-2 rounded border border-line p-2 sm:grid-cols-[1fr_10rem_12rem]">
              <label className="field" htmlFor={`cond-${itemId}-${i}-text`}>
                <span>Condition {i + 1}</span>
                <input
                  id={`cond-${itemId}-${i}-text`}
                  className="input"
                  required
                  minLength={5}
                  value={c.text}
                  onChange={(e) => setCond(i, 'text', e.target.value)}
                />
              </label>
              <label className="field" htmlFor={`cond-${itemId}-${i}-due`}>
                <span>Due</span>
                <input
                  id={`cond-${itemId}-${i}-due`}
                  className="input"
                  type="date"
                  required
                  value={c.dueDate}
                  onChange={(e) => setCond(i, 'dueDate', e.target.value)}
                />
              </label>
              <label className="field" htmlFor={`cond-${itemId}-${i}-who`}>
                <span>Checked by</span>
                <input
                  id={`cond-${itemId}-${i}-who`}
                  className="input"
                  required
                  minLength={2}
                  placeholder="e.g. Field officer"
                  value={c.checkedBy}
                  onChange={(e) => setCond(i, 'checkedBy', e.target.value)}
                />
              </label>
              {conditions.length > 1 && (
                <button
                  type="button"
                  className="btn btn-quiet self-start"
                  onClick={() => setConditions((x) => x.filter((_, j) => j !== i))}
                >
                  Remove condition {i + 1}
                </button>
              )}
            </div>
          ))}
          <button
            type="button"
            className="btn btn-quiet self-start"
            onClick={() => setConditions((x) => [...x, { text: '', dueDate: '', checkedBy: '' }])}
          >
            Add a condition
          </button>
        </fieldset>
      )}
      {outcome !== 'deferred' && (
        <div className="grid gap-3 sm:grid-cols-2">
          <label className="field" htmlFor={`appeal-${itemId}`}>
            <span>Appeal window, days</span>
            <input
              id={`appeal-${itemId}`}
              className="input"
              type="number"
              min={0}
              max={365}
              value={days}
              onChange={(e) => setDays(e.target.value)}
            />
          </label>
          <label className="field" htmlFor={`effective-${itemId}`}>
            <span>Effective date (empty: the day after the appeal window; the decision day for a refusal)</span>
            <input
              id={`effective-${itemId}`}
              className="input"
              type="date"
              value={effective}
              onChange={(e) => setEffective(e.target.value)}
            />
          </label>
        </div>
      )}
      <button className="btn self-start" type="submit" disabled={busy || !outcome}>
        Record the decision
      </button>
      {error && (
        <p className="notice notice-warn" role="alert">
          ⚠ {error}
        </p>
      )}
    </form>
  );
}

/** Recomputes the register's hash chain on the server (GET /api/register/verify) and says what it found. */
import { formatDateTime } from '~/lib/format/dates';
import { useEffect, useState } from 'react';

type Result = {
  ok: boolean;
  entries: number;
  firstBrokenEntry: number | null;
  problem: string | null;
  headHash: string | null;
  checkedAt: string;
};

export function VerifyChain() {
  const [result, setResult] = useState<Result | null>(null);
  const [failed, setFailed] = useState(false);
  const run = () => {
    setResult(null);
    setFailed(false);
    fetch('/api/register/verify')
      .then((r) => (r.ok ? r.json() : Promise.reject(r.status)))
      .then(setResult, () => setFailed(true));
  };
  useEffect(run, []);
  return (
    <div aria-live="polite" className="text-sm">
      {!result && !failed && <p>Checking the chain of every entry…</p>}
      {failed && <p className="error-text">The check could not be run just now. Try again in a moment.</p>}
      {result && result.ok && (
        <p>
          <strong>Chain intact.</strong> All {result.entries.toLocaleString('en')} entries match their hashes and each
          names the one before it (checked {formatDateTime(result.checkedAt)}).
        </p>
      )}
      {result && !result.ok && (
        <p className="notice notice-warn">
          <strong>Chain broken at entry {result.firstBrokenEntry}.</strong> {result.problem}. Entries before it still
          match.
        </p>
      )}
      <button type="button" className="btn btn-quiet mt-2" onClick={run}>
        Check again
      </button>
    </div>
  );
}

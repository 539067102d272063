/** A member's part on an item: declare a conflict of interest, or vote with an optional comment. */
import { useState } from 'react';
import { VOTE_CHOICES, VOTE_LABELS, type VoteChoice } from '~/lib/board/vote-choices';
import { apiFetch } from '../ui/api-client';
import { problemText } from './errors';

type Props = {
  meetingId: number;
  itemId: number;
  reference: string;
  myVote: { choice: VoteChoice; comment: string | null } | null;
  myConflict: string | null;
};

export function VotePanel({ meetingId, itemId, reference, myVote, myConflict }: Props) {
  const [choice, setChoice] = useState<VoteChoice | ''>(myVote?.choice ?? '');
  const [comment, setComment] = useState(myVote?.comment ?? '');
  const [reason, setReason] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const base = `/api/meetings/${meetingId}/items/${itemId}`;

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

  if (myConflict)
    return (
      <p className="notice text-sm">
        You declared a conflict of interest on {reference} (“{myConflict}”), so you do not vote on it.
      </p>
    );
  return (
    <div className="flex flex-col gap-3">
      <form
        className="flex flex-col gap-2"
        aria-label={`Your vote on ${reference}`}
        onSubmit={(e) => (
          e.preventDefault(),
          void run(
            () =>
              apiFetch(`${base}/vote`, {
                method: 'PUT',
                body: { choice, ...(comment.trim() ? { comment: comment.trim() } : {}) },
              }),
            'Your vote was not recorded.',
          )
        )}
      >
        <fieldset className="flex flex-wrap gap-x-4 gap-y-1">
          <legend className="mb-1 text-sm font-medium text-muted">
            {myVote ? `Your vote: ${VOTE_LABELS[myVote.choice]} (voting again replaces it)` : 'Your vote'}
          </legend>
          {VOTE_CHOICES.map((c) => (
            <label key={c} className="flex items-center gap-1.5 text-sm">
              <input
                type="radio"
                name={`vote-${itemId}`}
                value={c}
                checked={choice === c}
                onChange={() => setChoice(c)}
                required
              />{' '}
              {VOTE_LABELS[c]}
            </label>
          ))}
        </fieldset>
        <label className="field" htmlFor={`comment-${itemId}`}>
          <span>Comment (optional; seen by the board only)</span>
          <textarea
            id={`comment-${itemId}`}
            className="input"
            rows={2}
            maxLength={2000}
            value={comment}
            onChange={(e) => setComment(e.target.value)}
          />
        </label>
        <button className="btn self-start" type="submit" disabled={busy || !choice}>
          Record my vote
        </button>
      </form>
      <details className="text-sm">
        <summary className="cursor-pointer">Declare a conflict of interest</summary>
        <form
          className="mt-2 flex flex-col gap-2"
          onSubmit={(e) => (
            e.preventDefault(),
            void run(() => apiFetch(`${base}/conflicts`, { body: { reason } }), 'The declaration was not recorded.')
          )}
        >
          <label className="field" htmlFor={`conflict-${itemId}`}>
            <span>What is your interest? (You will not vote on this item; a vote you cast is withdrawn.)</span>
            <textarea
              id={`conflict-${itemId}`}
              className="input"
              rows={2}
              minLength={3}
              maxLength={2000}
              required
              value={reason}
              onChange={(e) => setReason(e.target.value)}
            />
          </label>
          <button className="btn btn-quiet self-start" type="submit" disabled={busy}>
            Declare the conflict
          </button>
        </form>
      </details>
      {error && (
        <p className="notice notice-warn" role="alert">
          ⚠ {error}
        </p>
      )}
    </div>
  );
}

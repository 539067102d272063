/** The four phases of an upload with their state in words and symbols (never colour alone). */
export type PhaseKey = 'upload' | 'parse' | 'validate' | 'save';
export type PhaseState = { state: 'waiting' | 'running' | 'done' | 'failed'; detail?: string };

const LABELS: Record<PhaseKey, string> = { upload: 'Upload', parse: 'Read file', validate: 'Validate', save: 'Save' };
const MARK = { waiting: '○', running: '◐', done: '✓', failed: '✕' } as const;
const WORD = { waiting: 'waiting', running: 'in progress', done: 'done', failed: 'failed' } as const;

export function Progress({ phases }: { phases: Record<PhaseKey, PhaseState> }) {
  return (
    <ol className="flex flex-wrap gap-x-5 gap-y-1 text-sm" aria-label="Upload progress" aria-live="polite">
      {(Object.keys(LABELS) as PhaseKey[]).map((k) => {
        const p = phases[k];
        return (
          <li key={k} className={p.state === 'failed' ? 'text-clay-700' : p.state === 'waiting' ? 'text-muted' : ''}>
            <span aria-hidden="true" className="mr-1 font-semibold">
              {MARK[p.state]}
            </span>
            {LABELS[k]}: {WORD[p.state]}
            {p.detail ? ` (${p.detail})` : ''}
          </li>
        );
      })}
    </ol>
  );
}

export const initialPhases = (): Record<PhaseKey, PhaseState> => ({
  upload: { state: 'waiting' },
  parse: { state: 'waiting' },
  validate: { state: 'waiting' },
  save: { state: 'waiting' },
});

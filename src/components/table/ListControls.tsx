/** Controls shared by lists paged on the server: the risk-level filter, the sort menu and the count line. */
import { LEVELS, RISK_LEVELS } from '~/lib/rules/levels';

const labelClass = 'text-sm font-medium text-muted';

/** A risk-level filter: "Any level" or one of the levels with its label. */
export function LevelFilter({
  id,
  label,
  value,
  onChange,
}: {
  id: string;
  label: string;
  value: string;
  onChange: (v: string) => void;
}) {
  return (
    <div className="field">
      <label htmlFor={id} className={labelClass}>
        {label}
      </label>
      <select id={id} className="input" value={value} onChange={(e) => onChange(e.target.value)}>
        <option value="">Any level</option>
        {RISK_LEVELS.map((l) => (
          <option key={l} value={l}>
            {l} · {LEVELS[l].label}
          </option>
        ))}
      </select>
    </div>
  );
}

/** A sort menu of [column, direction, words] choices (on phones, where the table's headers are not shown). */
export function SortChoice({
  id,
  labelClassName = labelClass,
  sort,
  dir,
  choices,
  onChange,
}: {
  id: string;
  labelClassName?: string;
  sort: string;
  dir: 'asc' | 'desc';
  choices: [string, 'asc' | 'desc', string][];
  onChange: (sort: string, dir: 'asc' | 'desc') => void;
}) {
  return (
    <>
      <label htmlFor={id} className={labelClassName}>
        Sort by
      </label>
      <select
        id={id}
        className="input"
        value={`${sort}:${dir}`}
        onChange={(e) => {
          const [s, d] = e.target.value.split(':');
          onChange(s!, d as 'asc' | 'desc');
        }}
      >
        {choices.map(([s, d, l]) => (
          <option key={s} value={`${s}:${d}`}>
            {l}
          </option>
        ))}
      </select>
    </>
  );
}

/** "Loading…", "No … match." or "Things 1–25 of 300", read out when it changes. */
export function ListCount({
  loading,
  total,
  from,
  shown,
  things,
}: {
  loading: boolean;
  total: number;
  from: number;
  shown: number;
  /** Plural noun with a capital: "Proposals", "Parcels". */
  things: string;
}) {
  return (
    <p aria-live="polite" className="text-sm">
      {loading
        ? 'Loading…'
        : total === 0
          ? `No ${things.toLowerCase()} match.`
          : `${things} ${from}–${from + shown - 1} of ${total}`}
    </p>
  );
}

/** The warning shown when a page of the list could not be fetched. */
export function ListError({ error }: { error: string | null }) {
  return error ? (
    <p className="notice notice-warn" role="alert">
      ⚠ {error}
    </p>
  ) : null;
}

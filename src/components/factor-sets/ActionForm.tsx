import { useState, type FormEvent, type ReactNode } from 'react';
import { apiFetch, ApiError } from '../ui/api-client';

type Props = {
  label: string;
  busyLabel?: string;
  method?: string;
  url: string;
  body?: (form: FormData) => unknown;
  children?: ReactNode;
  quiet?: boolean;
  className?: string;
  /** Where a response with a new set id leads: its factor-set or rule-set draft page, or just a reload. */ next?:
    'factor-set' | 'rule-set' | 'reload';
};

/** A small form that calls one API route and reloads the page on success; errors are shown beside it. */
export function ActionForm({
  label,
  busyLabel,
  method = 'POST',
  url,
  body,
  children,
  quiet,
  className,
  next = 'factor-set',
}: Props) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const data = body ? body(new FormData(e.currentTarget)) : undefined;
      const res = await apiFetch<{ id?: string } | undefined>(url, { method, body: data });
      const target =
        next !== 'reload' && typeof res === 'object' && res && 'id' in res && res.id
          ? `/admin/${next === 'rule-set' ? 'rule-sets' : 'factor-sets'}/${res.id}?version=draft`
          : null;
      if (target) window.location.assign(target);
      else window.location.reload();
    } catch (err) {
      setError(err instanceof ApiError ? err.message : 'That did not work.');
      setBusy(false);
    }
  }
  return (
    <form onSubmit={submit} className={className ?? 'flex flex-col gap-2'}>
      {children}
      <div className="flex flex-wrap items-center gap-2">
        <button type="submit" className={quiet ? 'btn btn-quiet' : 'btn'} disabled={busy}>
          {busy ? (busyLabel ?? 'Working…') : label}
        </button>
        {error && (
          <p className="error-text" role="alert">
            {error}
          </p>
        )}
      </div>
    </form>
  );
}

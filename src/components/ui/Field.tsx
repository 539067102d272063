import type { ReactNode } from 'react';

type Props = { label: string; error?: string; hint?: string; children: ReactNode; htmlFor: string };

/** A labelled form field with its error text tied to the input for screen readers. */
export function Field({ label, error, hint, children, htmlFor }: Props) {
  return (
    <div className="field">
      <label htmlFor={htmlFor} className="text-sm font-medium text-muted">
        {label}
      </label>
      {children}
      {hint && !error && <p className="text-xs text-muted">{hint}</p>}
      {error && (
        <p id={`${htmlFor}-error`} className="error-text" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}

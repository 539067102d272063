import { useState, type FormEvent } from 'react';
import { ROLES, ROLE_LABELS } from '~/lib/auth/roles';
import { apiFetch, ApiError } from '../ui/api-client';
import { Field } from '../ui/Field';

type FieldErrors = Partial<Record<'name' | 'email' | 'roles', string>>;

/**
 * Invites a user. The server checks the fields (inviteInputSchema) and its messages are shown by
 * each field; the island carries no schema library (script budgets, DEVELOPERS.md).
 */
export function InviteUserForm({ onInvited }: { onInvited: () => void }) {
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [busy, setBusy] = useState(false);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    const data = new FormData(form);
    const body = {
      name: String(data.get('name') ?? '').trim(),
      email: String(data.get('email') ?? '').trim(),
      roles: data.getAll('roles').map(String),
    };
    setErrors({});
    setMessage(null);
    setBusy(true);
    try {
      await apiFetch('/api/users', { body });
      setMessage({ ok: true, text: `Invitation sent to ${body.email}.` });
      form.reset();
      onInvited();
    } catch (e) {
      if (e instanceof ApiError && e.issues.length) {
        const byField: FieldErrors = {};
        for (const i of e.issues)
          if (['name', 'email', 'roles'].includes(String(i.path[0])))
            byField[i.path[0] as keyof FieldErrors] ??= i.message;
        setErrors(byField);
      }
      setMessage({ ok: false, text: e instanceof ApiError ? e.message : 'The invitation could not be sent.' });
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={(e) => void onSubmit(e)} noValidate className="grid gap-3 md:grid-cols-2">
      <Field label="Name" htmlFor="invite-name" error={errors.name}>
        <input id="invite-name" name="name" className="input" aria-invalid={!!errors.name} />
      </Field>
      <Field label="E-mail address" htmlFor="invite-email" error={errors.email}>
        <input id="invite-email" name="email" type="email" className="input" aria-invalid={!!errors.email} />
      </Field>
      <fieldset className="md:col-span-2">
        <legend className="text-sm font-medium text-muted">Roles</legend>
        <div className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
          {ROLES.map((r) => (
            <label key={r} className="flex items-center gap-1.5">
              <input type="checkbox" name="roles" value={r} /> {ROLE_LABELS[r]}
            </label>
          ))}
        </div>
        {errors.roles && <p className="error-text">{errors.roles}</p>}
      </fieldset>
      <div className="flex flex-wrap items-center gap-3 md:col-span-2">
        <button type="submit" className="btn" disabled={busy}>
          Send invitation
        </button>
        {message && (
          <p role={message.ok ? 'status' : 'alert'} className={message.ok ? 'text-sward-700' : 'error-text'}>
            {message.text}
          </p>
        )}
      </div>
    </form>
  );
}

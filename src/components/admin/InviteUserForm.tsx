import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { inviteInputSchema } from '~/lib/api/users';
import { ROLES, ROLE_LABELS } from '~/lib/auth/roles';
import { apiFetch, ApiError } from '../ui/api-client';
import { Field } from '../ui/Field';

type Values = z.input<typeof inviteInputSchema>;

export function InviteUserForm({ onInvited }: { onInvited: () => void }) {
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const { register, handleSubmit, formState, reset } = useForm<Values>({ resolver: zodResolver(inviteInputSchema), defaultValues: { roles: [] } });
  const onSubmit = handleSubmit(async (v) => {
    setMessage(null);
    try {
      await apiFetch('/api/users', { body: v });
      setMessage({ ok: true, text: `Invitation sent to ${v.email}.` });
      reset({ name: '', email: '', roles: [] });
      onInvited();
    } catch (e) {
      setMessage({ ok: false, text: e instanceof ApiError ? e.message : 'The invitation could not be sent.' });
    }
  });
  const errors = formState.errors;
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-3 md:grid-cols-2">
      <Field label="Name" htmlFor="invite-name" error={errors.name?.message}>
        <input id="invite-name" className="input" aria-invalid={!!errors.name} {...register('name')} />
      </Field>
      <Field label="E-mail address" htmlFor="invite-email" error={errors.email?.message}>
        <input id="invite-email" type="email" className="input" aria-invalid={!!errors.email} {...register('email')} />
      </Field>
      <fieldset className="md:col-span-2">
        <legend className="text-sm font-medium text-muted">Roles</legend>
        <div className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
          {ROLES.map((r) => (
            <label key={r} className="flex items-center gap-1.5">
              <input type="checkbox" value={r} {...register('roles')} /> {ROLE_LABELS[r]}
            </label>
          ))}
        </div>
        {errors.roles && <p className="error-text">{errors.roles.message}</p>}
      </fieldset>
      <div className="flex flex-wrap items-center gap-3 md:col-span-2">
        <button type="submit" className="btn" disabled={formState.isSubmitting}>
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

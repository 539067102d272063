import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { passwordLengthProblem, PASSWORD_MIN } from '~/lib/auth/password-length';
import { apiFetch, ApiError } from '../ui/api-client';
import { Field } from '../ui/Field';
import { resetPassword } from './auth-requests';
import { SignInForm } from './SignInForm';

const schema = z
  .object({ password: z.string(), confirm: z.string() })
  .superRefine((v, ctx) => {
    // The full check (common passwords, guessability) runs on the server, which explains a refusal.
    const problem = passwordLengthProblem(v.password);
    if (problem) ctx.addIssue({ code: 'custom', path: ['password'], message: problem });
    if (v.password !== v.confirm) ctx.addIssue({ code: 'custom', path: ['confirm'], message: 'The two passwords differ.' });
  });
type Values = z.infer<typeof schema>;

/**
 * Sets a password from an invitation (mode "invite") or a reset link (mode "reset"). Once set, the
 * prompt and form give way to a confirmation and the sign-in form with the e-mail address filled in
 * (`email`: known to the page for a reset link; an accepted invitation answers with it).
 */
export function NewPasswordForm({ token, mode, prompt, email = null }: { token: string; mode: 'invite' | 'reset'; prompt?: string; email?: string | null }) {
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const [signInEmail, setSignInEmail] = useState<string | null>(email);
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(schema) });
  const onSubmit = handleSubmit(async (v) => {
    setError(null);
    if (mode === 'reset') {
      const problem = await resetPassword(token, v.password);
      return problem ? setError(problem) : setDone(true);
    }
    try {
      const r = await apiFetch<{ email: string }>('/api/invitations/accept', { body: { token, password: v.password } });
      setSignInEmail(r.email);
      setDone(true);
    } catch (e) {
      // A field problem (a cut-off link, a weak password) reads best in the field's own words.
      setError(e instanceof ApiError ? (e.issues[0]?.message ?? e.message) : 'The password could not be set. Try again.');
    }
  });
  if (done) {
    return (
      <div className="flex flex-col gap-3">
        <p className="notice" role="status" data-testid="password-set">
          ✓ Your password is {mode === 'invite' ? 'set' : 'changed'}. Sign in with it now{signInEmail ? '' : ' (your e-mail address and the new password)'}.
        </p>
        <SignInForm next="/work" defaultEmail={signInEmail ?? undefined} />
      </div>
    );
  }
  const errors = formState.errors;
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      {prompt && <p className="text-sm text-muted">{prompt}</p>}
      <Field label="New password" htmlFor="password" error={errors.password?.message} hint={`At least ${PASSWORD_MIN} characters. A short sentence works well.`}>
        <input id="password" type="password" autoComplete="new-password" className="input" aria-invalid={!!errors.password} {...register('password')} />
      </Field>
      <Field label="The same password again" htmlFor="confirm" error={errors.confirm?.message}>
        <input id="confirm" type="password" autoComplete="new-password" className="input" aria-invalid={!!errors.confirm} {...register('confirm')} />
      </Field>
      {error && (
        <p className="notice notice-warn" role="alert">
          {error}
        </p>
      )}
      <button className="btn self-start" type="submit" disabled={formState.isSubmitting}>
        {mode === 'invite' ? 'Set password' : 'Change password'}
      </button>
    </form>
  );
}

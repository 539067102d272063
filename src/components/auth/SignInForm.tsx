import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Field } from '../ui/Field';
import { signIn } from './auth-requests';

const schema = z.object({ email: z.email('Give your e-mail address.'), password: z.string().min(1, 'Give your password.') });
type Values = z.infer<typeof schema>;

export function SignInForm({ next, initialError = null, defaultEmail }: { next: string; initialError?: string | null; defaultEmail?: string }) {
  const [error, setError] = useState<string | null>(initialError);
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(schema), defaultValues: defaultEmail ? { email: defaultEmail, password: '' } : undefined });
  const onSubmit = handleSubmit(async (v) => {
    setError(null);
    const problem = await signIn(v.email, v.password);
    if (problem) return setError(problem);
    window.location.assign(next);
  });
  const errors = formState.errors;
  return (
    <form method="post" action={`/sign-in?next=${encodeURIComponent(next)}`} onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-describedby={error ? 'signin-error' : undefined}>
      <Field label="E-mail address" htmlFor="email" error={errors.email?.message}>
        <input id="email" type="email" autoComplete="username" className="input" aria-invalid={!!errors.email} {...register('email')} />
      </Field>
      <Field label="Password" htmlFor="password" error={errors.password?.message}>
        <input id="password" type="password" autoComplete="current-password" className="input" aria-invalid={!!errors.password} {...register('password')} />
      </Field>
      {error && (
        <p id="signin-error" className="notice notice-warn" role="alert">
          {error}
        </p>
      )}
      <button className="btn self-start" type="submit" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? 'Signing in…' : 'Sign in'}
      </button>
    </form>
  );
}

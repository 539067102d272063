import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Field } from '../ui/Field';
import { requestReset } from './auth-requests';

const schema = z.object({ email: z.email('Give your e-mail address.') });

export function ForgotPasswordForm() {
  const [state, setState] = useState<{ sent: boolean; error: string | null }>({ sent: false, error: null });
  const { register, handleSubmit, formState } = useForm<z.infer<typeof schema>>({ resolver: zodResolver(schema) });
  const onSubmit = handleSubmit(async (v) => {
    const problem = await requestReset(v.email);
    setState({ sent: !problem, error: problem });
  });
  if (state.sent) {
    return (
      <p className="notice" role="status">
        If an account uses that address, a reset link is on its way. It works once and expires in one hour.
      </p>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      <Field label="E-mail address" htmlFor="email" error={formState.errors.email?.message}>
        <input id="email" type="email" autoComplete="username" className="input" aria-invalid={!!formState.errors.email} {...register('email')} />
      </Field>
      {state.error && (
        <p className="notice notice-warn" role="alert">
          {state.error}
        </p>
      )}
      <button className="btn self-start" type="submit" disabled={formState.isSubmitting}>
        Send reset link
      </button>
    </form>
  );
}

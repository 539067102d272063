/**
 * Contracts of better-auth's endpoints that Swardkeep uses, served by src/pages/api/auth/[...all].ts.
 * Listed so the OpenAPI document is complete; better-auth validates them itself and answers
 * errors as { code, message } (its own shape), not ours.
 */
import { z } from 'zod';
import { defineSpec } from '../http/spec';

const ok = z.object({ status: z.boolean() });

export const signIn = defineSpec({
  method: 'POST',
  path: '/api/auth/sign-in/email',
  tag: 'Sign-in',
  summary: 'Sign in with e-mail and password; sets the session cookie. Rate-limited per client address.',
  access: 'public',
  body: z.object({ email: z.email(), password: z.string().min(1) }),
  response: z.object({
    redirect: z.boolean(),
    token: z.string(),
    user: z.object({ id: z.string(), name: z.string(), email: z.string() }),
  }),
});

export const signOut = defineSpec({
  method: 'POST',
  path: '/api/auth/sign-out',
  tag: 'Sign-in',
  summary: 'End the current session',
  access: 'public',
  response: z.object({ success: z.boolean() }),
});

export const getSession = defineSpec({
  method: 'GET',
  path: '/api/auth/get-session',
  tag: 'Sign-in',
  summary: 'The current session and user, or null',
  access: 'public',
  response: z
    .object({
      session: z.object({ id: z.string(), expiresAt: z.string() }),
      user: z.object({ id: z.string(), name: z.string(), email: z.string(), role: z.string().nullable() }),
    })
    .nullable(),
});

export const requestPasswordReset = defineSpec({
  method: 'POST',
  path: '/api/auth/request-password-reset',
  tag: 'Sign-in',
  summary: 'Mail a one-time reset link (answers the same whether or not the address has an account)',
  access: 'public',
  body: z.object({ email: z.email(), redirectTo: z.string().optional() }),
  response: ok,
});

export const resetPassword = defineSpec({
  method: 'POST',
  path: '/api/auth/reset-password',
  tag: 'Sign-in',
  summary: 'Set a new password with the token from the reset link; ends all sessions of the account',
  access: 'public',
  body: z.object({ token: z.string(), newPassword: z.string().min(10).max(128) }),
  response: ok,
});

export const resetPasswordLink = defineSpec({
  method: 'GET',
  path: '/api/auth/reset-password/{token}',
  tag: 'Sign-in',
  summary: 'The link in the reset mail: checks the token and redirects to the page that sets the new password',
  access: 'public',
  params: z.object({ token: z.string() }),
  query: z.object({ callbackURL: z.string() }),
  response: null,
  status: 302,
});

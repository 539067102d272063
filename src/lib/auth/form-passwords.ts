/**
 * The forgotten-password, reset and invitation forms by plain form POST (their pages ship no
 * script). Each goes through the same gate or service as the API, so caps, throttling, the
 * password policy and auditing apply alike; answers are in the same words the API gives.
 */
import { readForm } from '../http/body';
import { HttpError } from '../http/errors';
import { acceptInvitation } from '../services/invitations';
import { serveAuth } from './endpoints';
import { passwordLengthProblem } from './password-length';

export type FormField = 'email' | 'password' | 'confirm';
export type FormOutcome =
  { ok: true; email?: string } | { ok: false; message: string; field?: FormField; status: number };

const refusal = (message: string, status: number, field?: FormField): FormOutcome => ({
  ok: false,
  message,
  status,
  field,
});

async function formOf(request: Request): Promise<URLSearchParams | FormOutcome> {
  try {
    return await readForm(request);
  } catch (err) {
    if (err instanceof HttpError) return refusal(err.message, err.status);
    throw err;
  }
}

async function callAuth(
  request: Request,
  clientAddress: string,
  path: string,
  body: unknown,
): Promise<{ status: number; data: { code?: string; message?: string } }> {
  const origin = new URL(request.url).origin;
  const headers = new Headers({
    'content-type': 'application/json',
    origin,
    'user-agent': request.headers.get('user-agent') ?? '',
  });
  const res = await serveAuth(
    new Request(`${origin}/api/auth${path}`, { method: 'POST', headers, body: JSON.stringify(body) }),
    clientAddress,
  );
  return {
    status: res.status,
    data: res.ok ? {} : ((await res.json().catch(() => ({}))) as { code?: string; message?: string }),
  };
}

function generic(status: number, data: { code?: string; message?: string }, fallback: string): string {
  if (status === 429)
    return data.code === 'TOO_MANY_ATTEMPTS' && data.message
      ? data.message
      : 'Too many attempts. Wait a minute, then try again.';
  if (status === 413) return 'What you typed is too long.';
  if (status >= 500) return 'The server could not answer. Try again in a moment.';
  return fallback;
}

/** Two password fields: the length and the match are checked here, the full policy by the server. */
function passwordPair(form: URLSearchParams): { password: string } | FormOutcome {
  const password = String(form.get('password') ?? '');
  const problem = passwordLengthProblem(password);
  if (problem) return refusal(problem, 422, 'password');
  if (password !== String(form.get('confirm') ?? '')) return refusal('The two passwords differ.', 422, 'confirm');
  return { password };
}

export async function requestResetFromForm(request: Request, clientAddress: string): Promise<FormOutcome> {
  const form = await formOf(request);
  if (!(form instanceof URLSearchParams)) return form;
  const email = String(form.get('email') ?? '').trim();
  if (!/^[^\s@]+@[^\s@]+$/.test(email)) return refusal('Give your e-mail address.', 422, 'email');
  const { status, data } = await callAuth(request, clientAddress, '/request-password-reset', {
    email,
    redirectTo: '/reset-password',
  });
  return status < 300
    ? { ok: true }
    : refusal(generic(status, data, 'The request could not be sent. Check the address and try again.'), status);
}

export async function resetFromForm(request: Request, clientAddress: string, token: string): Promise<FormOutcome> {
  const form = await formOf(request);
  if (!(form instanceof URLSearchParams)) return form;
  const pair = passwordPair(form);
  if (!('password' in pair)) return pair;
  const { status, data } = await callAuth(request, clientAddress, '/reset-password', {
    token,
    newPassword: pair.password,
  });
  if (status < 300) return { ok: true };
  if (/TOKEN/i.test(String(data.code)))
    return refusal('This reset link is not valid any more (it works once, for one hour). Ask for a new one.', status);
  if (/PASSWORD_TOO/i.test(String(data.code)) || status === 422 || status === 400)
    return refusal(String(data.message ?? 'The password could not be changed.'), status, 'password');
  return refusal(generic(status, data, 'The password could not be changed.'), status);
}

export async function acceptFromForm(request: Request, token: string): Promise<FormOutcome> {
  const form = await formOf(request);
  if (!(form instanceof URLSearchParams)) return form;
  const pair = passwordPair(form);
  if (!('password' in pair)) return pair;
  try {
    const { email } = await acceptInvitation({ token: token.slice(0, 200), password: pair.password });
    return { ok: true, email };
  } catch (err) {
    if (!(err instanceof HttpError)) throw err;
    return refusal(err.issues?.[0]?.message ?? err.message, err.status, err.issues?.length ? 'password' : undefined);
  }
}

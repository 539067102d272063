/**
 * Sign-in by plain form POST, for browsers that have not (yet) run the page's script. It goes
 * through the same gate as the island (lib/auth/endpoints.ts), so the body cap, throttling and
 * auditing apply exactly alike.
 */
import { readForm } from '../http/body';
import { HttpError } from '../http/errors';
import { serveAuth } from './endpoints';

export type FormSignInResult =
  { ok: true; cookies: string[] } | { ok: false; message: string; status: number; email: string };

export async function signInFromForm(request: Request, clientAddress: string): Promise<FormSignInResult> {
  let form: URLSearchParams;
  try {
    form = await readForm(request);
  } catch (err) {
    if (err instanceof HttpError) return { ok: false, message: err.message, status: err.status, email: '' };
    throw err;
  }
  const email = String(form.get('email') ?? '').trim();
  const password = String(form.get('password') ?? '');
  if (!email || !password) return { ok: false, message: 'Give your e-mail address and password.', status: 422, email };
  const origin = new URL(request.url).origin;
  const headers = new Headers({
    'content-type': 'application/json',
    origin,
    'user-agent': request.headers.get('user-agent') ?? '',
  });
  const res = await serveAuth(
    new Request(`${origin}/api/auth/sign-in/email`, {
      method: 'POST',
      headers,
      body: JSON.stringify({ email, password }),
    }),
    clientAddress,
  );
  if (res.ok) return { ok: true, cookies: res.headers.getSetCookie() };
  const data = (await res.json().catch(() => ({}))) as { code?: string; message?: string };
  if (res.status === 429)
    return {
      ok: false,
      message:
        data.code === 'TOO_MANY_ATTEMPTS' && data.message
          ? data.message
          : 'Too many attempts. Wait a minute, then try again.',
      status: 429,
      email,
    };
  if (res.status === 403)
    return { ok: false, message: 'This account has been deactivated. Ask an administrator.', status: 403, email };
  return { ok: false, message: 'The e-mail address or password is not right.', status: 401, email };
}

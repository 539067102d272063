/**
 * Sign-in by plain form POST, for browsers that have not (yet) run the page's script. It goes
 * through better-auth's own handler, so rate limiting and auditing apply exactly as for the island.
 */
import { auth } from './auth';

export type FormSignInResult = { ok: true; cookies: string[] } | { ok: false; message: string };

export async function signInFromForm(request: Request, clientAddress: string): Promise<FormSignInResult> {
  const form = await request.formData();
  const email = String(form.get('email') ?? '').trim();
  const password = String(form.get('password') ?? '');
  if (!email || !password) return { ok: false, message: 'Give your e-mail address and password.' };
  const origin = new URL(request.url).origin;
  const headers = new Headers({ 'content-type': 'application/json', origin, 'x-client-ip': clientAddress });
  const res = await auth.handler(new Request(`${origin}/api/auth/sign-in/email`, { method: 'POST', headers, body: JSON.stringify({ email, password }) }));
  if (res.ok) return { ok: true, cookies: res.headers.getSetCookie() };
  if (res.status === 429) return { ok: false, message: 'Too many attempts. Wait a minute, then try again.' };
  if (res.status === 403) return { ok: false, message: 'This account has been deactivated. Ask an administrator.' };
  return { ok: false, message: 'The e-mail address or password is not right.' };
}

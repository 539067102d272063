/** Browser calls to better-auth's endpoints, with messages in our own words (no detail that helps an attacker). */
async function post(path: string, body: unknown): Promise<Response> {
  return fetch(`/api/auth${path}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body), credentials: 'same-origin' });
}

function messageFor(status: number, fallback: string, data: { code?: unknown; message?: unknown } = {}): string {
  // Our throttle says how long to wait, in plain words.
  if (status === 429 && data.code === 'TOO_MANY_ATTEMPTS' && typeof data.message === 'string') return data.message;
  if (status === 429) return 'Too many attempts. Wait a minute, then try again.';
  if (status === 413) return 'What you typed is too long.';
  if (status >= 500) return 'The server could not answer. Try again in a moment.';
  return fallback;
}

export async function signIn(email: string, password: string): Promise<string | null> {
  const res = await post('/sign-in/email', { email, password });
  if (res.ok) return null;
  const data = await res.json().catch(() => ({}));
  if (res.status === 403 && /banned/i.test(String(data?.code ?? data?.message))) return 'This account has been deactivated. Ask an administrator.';
  return messageFor(res.status, 'The e-mail address or password is not right.', data);
}

export async function requestReset(email: string): Promise<string | null> {
  const res = await post('/request-password-reset', { email, redirectTo: '/reset-password' });
  if (res.ok) return null;
  const data = await res.json().catch(() => ({}));
  return messageFor(res.status, 'The request could not be sent. Check the address and try again.', data);
}

export async function resetPassword(token: string, newPassword: string): Promise<string | null> {
  const res = await post('/reset-password', { token, newPassword });
  if (res.ok) return null;
  const data = await res.json().catch(() => ({}));
  if (/TOKEN/i.test(String(data?.code))) return 'This reset link is not valid any more (it works once, for one hour). Ask for a new one.';
  if (/PASSWORD_TOO/i.test(String(data?.code))) return String(data.message);
  return messageFor(res.status, 'The password could not be changed.', data);
}

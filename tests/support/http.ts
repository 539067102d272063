/** Talking to the running test server as a browser would: cookies, Origin, JSON. */
import { BASE_URL } from './env';

export const DEMO_PASSWORD = 'meadow-lark-2026';
export const DEMO = {
  admin: 'admin@tarrow.example',
  planner: 'planner@tarrow.example',
  assessor: 'assessor@tarrow.example',
  board: 'board@tarrow.example',
  chair: 'chair@tarrow.example',
} as const;

export type Session = { cookie: string };

export async function signIn(email: string, password = DEMO_PASSWORD, base = BASE_URL): Promise<Session> {
  const res = await fetch(`${base}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify({ email, password }),
  });
  if (!res.ok) throw new Error(`sign-in of ${email} failed: ${res.status} ${await res.text()}`);
  return {
    cookie: res.headers
      .getSetCookie()
      .map((c) => c.split(';')[0])
      .join('; '),
  };
}

export async function api(
  method: string,
  path: string,
  opts: { session?: Session; body?: unknown; base?: string; headers?: Record<string, string> } = {},
): Promise<{ status: number; body: any; headers: Headers }> {
  const base = opts.base ?? BASE_URL;
  const headers: Record<string, string> = { origin: base, ...(opts.headers ?? {}) };
  if (opts.session) headers.cookie = opts.session.cookie;
  if (opts.body !== undefined) headers['content-type'] ??= 'application/json';
  const res = await fetch(`${base}${path}`, {
    method,
    headers,
    body: opts.body === undefined ? undefined : typeof opts.body === 'string' ? opts.body : JSON.stringify(opts.body),
    redirect: 'manual',
  });
  const text = await res.text();
  let body: any = text;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {
    /* not JSON */
  }
  return { status: res.status, body, headers: res.headers };
}

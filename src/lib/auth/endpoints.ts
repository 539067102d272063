/**
 * The gate in front of better-auth's handler (src/pages/api/auth/[...all].ts and the plain
 * sign-in form). Only the endpoints Swardkeep uses are served; the rest answer 404 (update-user,
 * change-password, the admin plugin's impersonation and set-password …: our own audited routes do
 * those jobs). Bodies are capped and parsed exactly; sign-ins are throttled per account and per
 * address; sign-out and reset requests are audited (sign-in and reset by the hooks in auth.ts).
 */
import { recordAudit } from '../db/audit';
import { db } from '../db/client';
import { findUserIdByEmail } from '../db/users';
import { MAX_AUTH_BODY_BYTES, mediaTypeOf, readBodyCapped, rejectNul } from '../http/body';
import { errorResponse, HttpError, json } from '../http/errors';
import { auth } from './auth';
import { beginSignIn, pruneAttempts, resetMailRefused, settleSignIn } from './throttle';

type Endpoint = { method: 'GET' | 'POST'; path: RegExp };

/** Every better-auth endpoint Swardkeep calls, relative to /api/auth (see lib/api/auth.ts). */
export const USED_AUTH_ENDPOINTS: Endpoint[] = [
  { method: 'POST', path: /^\/sign-in\/email$/ },
  { method: 'POST', path: /^\/sign-out$/ },
  { method: 'GET', path: /^\/get-session$/ },
  { method: 'POST', path: /^\/request-password-reset$/ },
  { method: 'POST', path: /^\/reset-password$/ },
  // The link in the reset mail: checks the token, then redirects to /reset-password?token=…
  { method: 'GET', path: /^\/reset-password\/[A-Za-z0-9_-]{1,200}$/ },
];

function ownError(err: HttpError): Response {
  return errorResponse(err.code, err.message, err.issues);
}

function tooMany(seconds: number, message: string): Response {
  return json({ code: 'TOO_MANY_ATTEMPTS', message }, 429, { 'retry-after': String(seconds) });
}

function waitWords(seconds: number): string {
  return seconds < 90 ? `${seconds} seconds` : `${Math.ceil(seconds / 60)} minutes`;
}

async function readAuthBody(request: Request): Promise<{ text: string; data: Record<string, unknown> }> {
  const bytes = await readBodyCapped(request, MAX_AUTH_BODY_BYTES);
  if (bytes.byteLength === 0) return { text: '', data: {} };
  if (mediaTypeOf(request) !== 'application/json')
    throw new HttpError('UNSUPPORTED_MEDIA_TYPE', 'Send the request body as application/json.');
  let data: unknown;
  try {
    data = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
  } catch {
    throw new HttpError('BAD_REQUEST', 'The request body is not valid JSON.');
  }
  if (!data || typeof data !== 'object' || Array.isArray(data))
    throw new HttpError('BAD_REQUEST', 'The request body must be a JSON object.');
  rejectNul(data);
  return { text: JSON.stringify(data), data: data as Record<string, unknown> };
}

function forward(request: Request, clientAddress: string, body: string | null): Promise<Response> {
  const headers = new Headers(request.headers);
  headers.set('x-client-ip', clientAddress); // better-auth's own rate limit and session.ipAddress read it
  headers.delete('content-length');
  if (body !== null) headers.set('content-type', 'application/json');
  return auth.handler(new Request(request.url, { method: request.method, headers, body }));
}

async function signIn(
  request: Request,
  clientAddress: string,
  body: string,
  data: Record<string, unknown>,
): Promise<Response> {
  const email = typeof data.email === 'string' ? data.email : '';
  if (!email) return forward(request, clientAddress, body); // better-auth answers the missing field
  if (Math.random() < 0.02) await pruneAttempts(db);
  const ticket = await beginSignIn(db, email, clientAddress);
  if (ticket.wait > 0)
    return tooMany(
      ticket.wait,
      `Too many wrong passwords. Wait ${waitWords(ticket.wait)}, then try again, or reset your password.`,
    );
  const res = await forward(request, clientAddress, body);
  await settleSignIn(db, ticket, email, res.ok ? 'signed-in' : res.status === 401 ? 'wrong-password' : 'other');
  return res;
}

async function signOut(request: Request, clientAddress: string, body: string | null): Promise<Response> {
  const found = await auth.api.getSession({ headers: request.headers });
  const res = await forward(request, clientAddress, body);
  if (res.ok && found)
    await recordAudit(db, {
      actorId: found.user.id,
      action: 'user.sign-out',
      entityType: 'user',
      entityId: found.user.id,
      details: { ip: clientAddress },
    });
  return res;
}

async function requestReset(
  request: Request,
  clientAddress: string,
  body: string,
  data: Record<string, unknown>,
): Promise<Response> {
  const email = typeof data.email === 'string' ? data.email : '';
  if (!email) return forward(request, clientAddress, body);
  // Counted whether or not the address has an account, so the answer tells nothing about it.
  if (await resetMailRefused(db, email))
    return tooMany(
      900,
      'Several reset links were sent to this address a short while ago. Use the newest one, or wait a quarter of an hour.',
    );
  const res = await forward(request, clientAddress, body);
  const userId = res.ok ? await findUserIdByEmail(db, email) : null;
  if (userId)
    await recordAudit(db, {
      actorId: null,
      action: 'user.password-reset-request',
      entityType: 'user',
      entityId: userId,
      details: { ip: clientAddress },
    });
  return res;
}

/** Serves one request to /api/auth/…, or refuses it. */
export async function serveAuth(request: Request, clientAddress: string): Promise<Response> {
  const path = new URL(request.url).pathname.replace(/^\/api\/auth/, '');
  const known = USED_AUTH_ENDPOINTS.filter((e) => e.path.test(path));
  if (known.length === 0) return errorResponse('NOT_FOUND', 'No such API route.');
  if (!known.some((e) => e.method === request.method)) {
    const res = errorResponse('METHOD_NOT_ALLOWED', `Use ${known.map((e) => e.method).join(' or ')} here.`);
    res.headers.set('allow', known.map((e) => e.method).join(', '));
    return res;
  }
  try {
    if (request.method === 'GET') return await forward(request, clientAddress, null);
    const { text, data } = await readAuthBody(request);
    if (path === '/sign-in/email') return await signIn(request, clientAddress, text, data);
    if (path === '/sign-out') return await signOut(request, clientAddress, text || null);
    if (path === '/request-password-reset') return await requestReset(request, clientAddress, text, data);
    return await forward(request, clientAddress, text || null);
  } catch (err) {
    if (err instanceof HttpError) return ownError(err);
    throw err;
  }
}

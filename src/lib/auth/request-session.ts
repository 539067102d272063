/**
 * Who sent a request: the signed-in user and session, or null. Sessions live in PostgreSQL, so any
 * instance can answer any request; a session idle too long ends here. A database outage is an
 * error, never "signed out". Used by the middleware and by the direct lane (lib/http/direct-lane.ts).
 */
import type { Caller } from '../http/handle';
import { db } from '../db/client';
import { auth } from './auth';
import { parseRoles } from './roles';
import { cachedSession, rememberSession, SESSION_CACHED_PATHS } from './session-cache';
import { useSession } from './session-idle';

/** better-auth's session cookie (`better-auth.session_token`, `__Secure-` prefixed over HTTPS). */
const SESSION_COOKIE = /session_token=/;

export type RequestSession = { user: Caller; sessionId: string };

/** `headers()` gives the request's headers for better-auth's look-up (only called when there is one to make). */
export async function sessionOf(
  pathname: string,
  cookie: string | null,
  headers: () => Headers,
): Promise<RequestSession | null> {
  // Pure calculators may recognise a session from a copy a few seconds old (session-cache.ts).
  const copyAllowed = SESSION_CACHED_PATHS.has(pathname);
  const copy = copyAllowed ? cachedSession(cookie) : undefined;
  if (copy) return copy;
  // better-auth finds a session only through its session-token cookie: without one, there is nothing to look up.
  const found = SESSION_COOKIE.test(cookie ?? '') ? await auth.api.getSession({ headers: headers() }) : null;
  if (!found || found.user.banned || !(await useSession(db, found.session))) return null;
  const u = found.user as typeof found.user & { role?: string | null };
  const session = {
    user: { id: u.id, name: u.name, email: u.email, roles: parseRoles(u.role) },
    sessionId: found.session.id,
  };
  if (copyAllowed) rememberSession(cookie, session);
  return session;
}

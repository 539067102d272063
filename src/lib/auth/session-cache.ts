/**
 * A few seconds' memory of who a session cookie belongs to, for routes that only compute and hand out
 * nothing personal (`POST /api/estimates`): a calculator used in bursts should not cost three
 * PostgreSQL round trips per call. PostgreSQL stays the only record of sessions: an entry is a
 * copy at most SESSION_CACHE_TTL_MS old, so signing out, a ban or a role change reaches these
 * routes within that time on every instance; every other route looks the session up each time.
 */
import { LRUCache } from 'lru-cache';
import type { Caller } from '../http/handle';

export const SESSION_CACHE_TTL_MS = 5_000;
/** Paths whose callers may be recognised from the copy. */
export const SESSION_CACHED_PATHS = new Set(['/api/estimates']);

const seen = new LRUCache<string, { user: Caller; sessionId: string }>({
  max: 2_000,
  ttl: SESSION_CACHE_TTL_MS,
  ttlAutopurge: false,
});

export function cachedSession(cookie: string | null) {
  return cookie ? seen.get(cookie) : undefined;
}

export function rememberSession(cookie: string | null, value: { user: Caller; sessionId: string }): void {
  if (cookie) seen.set(cookie, value);
}

import { defineMiddleware } from 'astro:middleware';
import { auth } from './lib/auth/auth';
import { parseRoles } from './lib/auth/roles';
import { config } from './lib/config';
import { startMailWorker } from './lib/mail/worker';

/**
 * Puts the signed-in user (or null) on locals. Sessions live in PostgreSQL, so any instance
 * can answer any request. A database outage is an error, never "signed out".
 */
export const onRequest = defineMiddleware(async (ctx, next) => {
  if (config().MAIL_WORKER === 'on') startMailWorker();
  ctx.locals.user = null;
  ctx.locals.sessionId = null;
  if (ctx.isPrerendered) return next();
  const found = await auth.api.getSession({ headers: ctx.request.headers });
  if (found && !found.user.banned) {
    const u = found.user as typeof found.user & { role?: string | null };
    ctx.locals.user = { id: u.id, name: u.name, email: u.email, roles: parseRoles(u.role) };
    ctx.locals.sessionId = found.session.id;
  }
  const response = await next();
  try {
    // Routes that set their own caching (vector tiles: private, ETag by data version) keep it.
    if ((ctx.url.pathname.startsWith('/api/') || ctx.locals.user) && !response.headers.has('cache-control')) response.headers.set('cache-control', 'no-store');
    response.headers.set('x-content-type-options', 'nosniff');
    response.headers.set('referrer-policy', 'same-origin');
  } catch {
    // Redirect responses have immutable headers; they carry no content to protect.
  }
  return response;
});

import { defineMiddleware } from 'astro:middleware';
import { auth } from './lib/auth/auth';
import { parseRoles } from './lib/auth/roles';
import { cachedSession, rememberSession, SESSION_CACHED_PATHS } from './lib/auth/session-cache';
import { verifyTileToken } from './lib/auth/tile-token';
import { useSession } from './lib/auth/session-idle';
import { config } from './lib/config';
import { db } from './lib/db/client';
import { getGisSettings } from './lib/db/gis-settings';
import { matchApiRoute } from './lib/http/api-routes';
import { declaredTooLarge, MAX_JSON_BYTES } from './lib/http/body';
import { errorResponse, type ErrorCode } from './lib/http/errors';
import { startJobQueue } from './lib/jobs/queue';
import { startMailWorker } from './lib/mail/worker';
import { requestRecord } from './lib/request-context';

/** better-auth's session cookie (`better-auth.session_token`, `__Secure-` prefixed over HTTPS). */
const SESSION_COOKIE = /session_token=/;
const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);
const NEVER = new Set(['TRACE', 'TRACK', 'CONNECT']);

function refuse(api: boolean, code: ErrorCode, message: string, headers: Record<string, string> = {}): Response {
  const res = api
    ? errorResponse(code, message)
    : new Response(message, {
        status: errorResponse(code, message).status,
        headers: { 'content-type': 'text/plain; charset=utf-8' },
      });
  for (const [k, v] of Object.entries(headers)) res.headers.set(k, v);
  return res;
}

/**
 * A state-changing request must come from our own pages: its Origin must be the configured public
 * URL (BETTER_AUTH_URL); without Origin, the browser's Sec-Fetch-Site must say "same-origin".
 * Other ports of the same host are other origins (cookies would count them as same-site).
 */
function foreignOrigin(request: Request): string | null {
  const origin = request.headers.get('origin');
  if (origin !== null)
    return origin === new URL(config().BETTER_AUTH_URL).origin
      ? null
      : `the request came from ${origin === 'null' ? 'an opaque origin' : 'another site'}`;
  const site = request.headers.get('sec-fetch-site');
  if (site === 'same-origin') return null;
  return 'the request did not say where it came from (send an Origin header)';
}

/** Checks every request may go on before anything reads it; a Response means refused. */
function gate(ctx: { request: Request; url: URL }): Response | null {
  const { request, url } = ctx;
  const api = url.pathname.startsWith('/api/');
  if (NEVER.has(request.method))
    return refuse(api, 'METHOD_NOT_ALLOWED', `${request.method} is not served.`, { allow: 'GET, HEAD, POST' });
  let multipart = false;
  if (api && !url.pathname.startsWith('/api/auth/')) {
    const route = matchApiRoute(url.pathname, request.method);
    if (!route) return refuse(true, 'NOT_FOUND', 'No such API route.');
    if (request.method === 'OPTIONS')
      return new Response(null, { status: 204, headers: { allow: [...route.allowed, 'OPTIONS'].join(', ') } });
    if (!route.allowed.includes(request.method))
      return refuse(true, 'METHOD_NOT_ALLOWED', `Use ${route.allowed.join(' or ')} here.`, {
        allow: route.allowed.join(', '),
      });
    multipart = route.multipart;
  }
  if (STATE_CHANGING.has(request.method)) {
    const why = foreignOrigin(request);
    if (why) return refuse(api, 'FORBIDDEN', `Refused: ${why}.`);
    // Uploads have their own, larger cap (lib/http/multipart.ts); everything else stays small.
    if (!multipart && declaredTooLarge(request, MAX_JSON_BYTES))
      return refuse(api, 'PAYLOAD_TOO_LARGE', `The request body is larger than the allowed ${MAX_JSON_BYTES} bytes.`);
  }
  return null;
}

/**
 * Widening of Astro's policy, done here because Astro 5's Astro.csp.insertDirective repeats a new
 * directive many times: style attributes are allowed on every page (React islands set sizes and
 * positions with them, and OpenLayers' scale line sizes itself with them; styles only, scripts stay
 * hash-only), and on pages with a map a configured basemap's host may serve images.
 */
const MAP_PAGES = /^\/(map|screening|admin\/territory|proposals\/new|proposals\/\d+(\/edit)?|register\/\d+)\/?$/;

async function widenPolicy(response: Response, withMap: boolean): Promise<void> {
  const csp = response.headers.get('content-security-policy');
  if (!csp) return;
  const basemap = withMap ? (await getGisSettings(db))['map.basemap-url'] : null;
  const imgSrc = basemap ? `img-src 'self' data: blob: ${new URL(basemap).origin}` : null;
  const widened = (imgSrc ? csp.replace("img-src 'self' data: blob:", imgSrc) : csp)
    .trim()
    .replace(/;?$/, "; style-src-attr 'unsafe-inline';");
  response.headers.set('content-security-policy', widened);
}

function secure(response: Response, ctx: { url: URL; locals: App.Locals }): Response {
  try {
    // Routes that set their own caching (vector tiles: private, ETag by data version) keep it.
    if ((ctx.url.pathname.startsWith('/api/') || ctx.locals.user) && !response.headers.has('cache-control'))
      response.headers.set('cache-control', 'no-store');
    response.headers.set('x-content-type-options', 'nosniff');
    response.headers.set('referrer-policy', 'same-origin');
    response.headers.set('x-frame-options', 'DENY');
    if (config().BETTER_AUTH_URL.startsWith('https://'))
      response.headers.set('strict-transport-security', 'max-age=31536000');
    // Pages get Astro's policy (hashes of its scripts and styles, astro.config.mjs); anything else none at all.
    if (!response.headers.has('content-security-policy'))
      response.headers.set(
        'content-security-policy',
        "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'",
      );
  } catch {
    // Redirect responses have immutable headers; they carry no content to protect.
  }
  return response;
}

/**
 * Refuses what must never reach a route (TRACE, unknown API paths and methods, foreign origins,
 * oversized bodies), then puts the signed-in user (or null) on locals. Sessions live in
 * PostgreSQL, so any instance can answer any request; a session idle too long ends here.
 * A database outage is an error, never "signed out".
 */
export const onRequest = defineMiddleware(async (ctx, next) => {
  if (config().MAIL_WORKER === 'on') startMailWorker();
  if (config().JOB_QUEUE === 'on') void startJobQueue().catch(() => undefined);
  ctx.locals.user = null;
  ctx.locals.sessionId = null;
  // The request log line names the route pattern (/api/users/[id]), never the path or query.
  const record = requestRecord();
  if (record) record.route = ctx.routePattern;
  if (ctx.isPrerendered) return next();
  const refused = gate(ctx);
  if (refused) return secure(refused, ctx);
  // Vector tiles carry a short-lived signed token (lib/auth/tile-token.ts) instead of needing a session look-up.
  const tileUser = ctx.url.pathname.startsWith('/api/tiles/')
    ? verifyTileToken(ctx.url.searchParams.get('t') ?? '')
    : null;
  if (tileUser) {
    ctx.locals.user = { id: tileUser, name: '', email: '', roles: [] };
    return secure(await next(), ctx);
  }
  // Pure calculators may recognise a session from a copy a few seconds old (lib/auth/session-cache.ts).
  const copyAllowed = SESSION_CACHED_PATHS.has(ctx.url.pathname);
  const copy = copyAllowed ? cachedSession(ctx.request.headers.get('cookie')) : undefined;
  if (copy) {
    ctx.locals.user = copy.user;
    ctx.locals.sessionId = copy.sessionId;
    return secure(await next(), ctx);
  }
  // better-auth finds a session only through its session-token cookie: without one, there is nothing to look up.
  const found = SESSION_COOKIE.test(ctx.request.headers.get('cookie') ?? '')
    ? await auth.api.getSession({ headers: ctx.request.headers })
    : null;
  if (found && !found.user.banned && (await useSession(db, found.session))) {
    const u = found.user as typeof found.user & { role?: string | null };
    ctx.locals.user = { id: u.id, name: u.name, email: u.email, roles: parseRoles(u.role) };
    ctx.locals.sessionId = found.session.id;
    if (copyAllowed)
      rememberSession(ctx.request.headers.get('cookie'), { user: ctx.locals.user, sessionId: found.session.id });
  }
  const response = await next();
  await widenPolicy(response, MAP_PAGES.test(ctx.url.pathname) && response.status === 200);
  return secure(response, ctx);
});

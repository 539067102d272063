import { defineMiddleware } from 'astro:middleware';
import { sessionOf } from './lib/auth/request-session';
import { verifyTileToken } from './lib/auth/tile-token';
import { db } from './lib/db/client';
import { getGisSettings } from './lib/db/gis-settings';
import './lib/http/direct-lane';
import { gate, secure as secureHeaders, startBackgroundWork } from './lib/http/gate';
import { requestRecord } from './lib/request-context';

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
  return secureHeaders(response, ctx.url.pathname, !!ctx.locals.user);
}

/**
 * Refuses what must never reach a route (TRACE, unknown API paths and methods, foreign origins,
 * oversized bodies: lib/http/gate.ts), then puts the signed-in user (or null) on locals
 * (lib/auth/request-session.ts). Importing lib/http/direct-lane.ts offers scripts/serve.mjs the
 * direct lane for the pure-computation routes it lists.
 */
export const onRequest = defineMiddleware(async (ctx, next) => {
  startBackgroundWork();
  ctx.locals.user = null;
  ctx.locals.sessionId = null;
  // The request log line names the route pattern (/api/users/[id]), never the path or query.
  const record = requestRecord();
  if (record) record.route = ctx.routePattern;
  if (ctx.isPrerendered) return next();
  const { request, url } = ctx;
  const refused = gate({ method: request.method, pathname: url.pathname, header: (n) => request.headers.get(n) });
  if (refused) return secure(refused, ctx);
  // Vector tiles carry a short-lived signed token (lib/auth/tile-token.ts) instead of needing a session look-up.
  const tileUser = url.pathname.startsWith('/api/tiles/') ? verifyTileToken(url.searchParams.get('t') ?? '') : null;
  if (tileUser) {
    ctx.locals.user = { id: tileUser, name: '', email: '', roles: [] };
    return secure(await next(), ctx);
  }
  const session = await sessionOf(url.pathname, request.headers.get('cookie'), () => request.headers);
  if (session) {
    ctx.locals.user = session.user;
    ctx.locals.sessionId = session.sessionId;
  }
  const response = await next();
  await widenPolicy(response, MAP_PAGES.test(url.pathname) && response.status === 200);
  return secure(response, ctx);
});

/**
 * The checks every request passes before anything reads it, and the security headers every answer
 * gets: used by the middleware (src/middleware.ts) and by the direct lane (./direct-lane.ts), so
 * both refuse and protect alike.
 */
import { config } from '../config';
import { startJobQueue } from '../jobs/queue';
import { startMailWorker } from '../mail/worker';
import { matchApiRoute } from './api-routes';
import { declaredOver, MAX_JSON_BYTES } from './body';
import { errorResponse, type ErrorCode } from './errors';

const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);
const NEVER = new Set(['TRACE', 'TRACK', 'CONNECT']);

/** What the gate reads of a request: its method, path and headers (by lower-case name). */
export type GateRequest = { method: string; pathname: string; header: (name: string) => string | null };

/** The background workers this instance runs (config MAIL_WORKER, JOB_QUEUE), started on the first request. */
export function startBackgroundWork(): void {
  if (begun) return;
  begun = true;
  if (config().MAIL_WORKER === 'on') startMailWorker();
  if (config().JOB_QUEUE === 'on') void startJobQueue().catch(() => undefined);
}
let begun = false;

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

/** The origin of BETTER_AUTH_URL, parsed once per value of the setting. */
let own: { url: string; origin: string } | null = null;
function ownOrigin(): string {
  const url = config().BETTER_AUTH_URL;
  if (own?.url !== url) own = { url, origin: new URL(url).origin };
  return own.origin;
}

/**
 * A state-changing request must come from our own pages: its Origin must be the configured public
 * URL (BETTER_AUTH_URL); without Origin, the browser's Sec-Fetch-Site must say "same-origin".
 * Other ports of the same host are other origins (cookies would count them as same-site).
 */
function foreignOrigin(request: GateRequest): string | null {
  const origin = request.header('origin');
  if (origin !== null)
    return origin === ownOrigin()
      ? null
      : `the request came from ${origin === 'null' ? 'an opaque origin' : 'another site'}`;
  const site = request.header('sec-fetch-site');
  if (site === 'same-origin') return null;
  return 'the request did not say where it came from (send an Origin header)';
}

/** Checks every request may go on before anything reads it; a Response means refused. */
export function gate(request: GateRequest): Response | null {
  const { method, pathname } = request;
  const api = pathname.startsWith('/api/');
  if (NEVER.has(method))
    return refuse(api, 'METHOD_NOT_ALLOWED', `${method} is not served.`, { allow: 'GET, HEAD, POST' });
  let multipart = false;
  if (api && !pathname.startsWith('/api/auth/')) {
    const route = matchApiRoute(pathname, method);
    if (!route) return refuse(true, 'NOT_FOUND', 'No such API route.');
    if (method === 'OPTIONS')
      return new Response(null, { status: 204, headers: { allow: [...route.allowed, 'OPTIONS'].join(', ') } });
    if (!route.allowed.includes(method))
      return refuse(true, 'METHOD_NOT_ALLOWED', `Use ${route.allowed.join(' or ')} here.`, {
        allow: route.allowed.join(', '),
      });
    multipart = route.multipart;
  }
  if (STATE_CHANGING.has(method)) {
    const why = foreignOrigin(request);
    if (why) return refuse(api, 'FORBIDDEN', `Refused: ${why}.`);
    // Uploads have their own, larger cap (lib/http/multipart.ts); everything else stays small.
    if (!multipart && declaredOver(request.header('content-length'), MAX_JSON_BYTES))
      return refuse(api, 'PAYLOAD_TOO_LARGE', `The request body is larger than the allowed ${MAX_JSON_BYTES} bytes.`);
  }
  return null;
}

/**
 * The security headers an answer gets, given whether it already has a header (`has`): no caching
 * of API answers and of signed-in pages (unless the route set its own caching: vector tiles are
 * private with an ETag by data version), nosniff, referrer policy, no framing, HSTS over HTTPS,
 * and a closed content-security-policy for anything that is not a page (pages keep Astro's policy).
 */
export function securityHeaders(
  pathname: string,
  signedIn: boolean,
  has: (name: string) => boolean,
): [string, string][] {
  const out: [string, string][] = [];
  if ((pathname.startsWith('/api/') || signedIn) && !has('cache-control')) out.push(['cache-control', 'no-store']);
  out.push(['x-content-type-options', 'nosniff'], ['referrer-policy', 'same-origin'], ['x-frame-options', 'DENY']);
  if (config().BETTER_AUTH_URL.startsWith('https://')) out.push(['strict-transport-security', 'max-age=31536000']);
  if (!has('content-security-policy'))
    out.push([
      'content-security-policy',
      "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'",
    ]);
  return out;
}

/** Puts securityHeaders on a Response. */
export function secure(response: Response, pathname: string, signedIn: boolean): Response {
  try {
    for (const [k, v] of securityHeaders(pathname, signedIn, (n) => response.headers.has(n)))
      response.headers.set(k, v);
  } catch {
    // Redirect responses have immutable headers; they carry no content to protect.
  }
  return response;
}

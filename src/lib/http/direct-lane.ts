/**
 * The direct lane: scripts/serve.mjs hands the requests for the routes of direct-routes.ts (pure
 * computations on fixed paths) to this module instead of Astro's pipeline, whose Request,
 * web-stream body, router, render context and Response cost more than the computation itself.
 * Every step is the shared code the Astro way in runs: the gate (unknown route or method, Origin
 * or Sec-Fetch-Site, declared body size: gate.ts), the session (lib/auth/request-session.ts),
 * handle()'s role check, NUL, integer and zod checks and error answers (handlePlain), readJson's
 * body checks (size cap while reading, media type, UTF-8 JSON) and the security headers (gate.ts).
 * serve.mjs still adds the request id, the log line and compression. Registered on globalThis when
 * the middleware module loads (the server's warm-up request); until then requests go through Astro.
 * DIRECT_LANE=off (read by serve.mjs) sends everything through Astro.
 */
import type { IncomingMessage, ServerResponse } from 'node:http';
import { sessionOf, type RequestSession } from '../auth/request-session';
import { requestRecord } from '../request-context';
import { declaredOver, jsonOfBytes, MAX_JSON_BYTES, requireJson, tooLarge } from './body';
import { DIRECT_ROUTES, type DirectRoute } from './direct-routes';
import { HttpError } from './errors';
import { gate, secure, securityHeaders, startBackgroundWork } from './gate';
import { failure, handlePlain } from './handle';

const routes = new Map(DIRECT_ROUTES.map((r) => [`${r.spec.method} ${r.spec.path}`, r]));

function headerOf(req: IncomingMessage, name: string): string | null {
  const v = req.headers[name];
  return v === undefined ? null : Array.isArray(v) ? v.join(', ') : v;
}

function headersOf(req: IncomingMessage): Headers {
  const h = new Headers();
  for (const [k, v] of Object.entries(req.headers))
    if (v !== undefined) for (const one of Array.isArray(v) ? v : [v]) h.append(k, one);
  return h;
}

/** The body's bytes, capped like readBodyCapped: 413 on a declared or an actual length over the cap. */
function bodyOf(req: IncomingMessage, res: ServerResponse, cap: number): Promise<Uint8Array> {
  if (declaredOver(headerOf(req, 'content-length'), cap)) return Promise.reject(tooLarge(cap));
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let total = 0;
    const onData = (c: Buffer) => {
      total += c.length;
      if (total <= cap) return void chunks.push(c);
      req.off('data', onData);
      // What is still coming is read and dropped, and the connection closed after the answer.
      res.setHeader('connection', 'close');
      req.resume();
      reject(tooLarge(cap));
    };
    req.on('data', onData);
    req.once('end', () => resolve(chunks.length === 1 ? chunks[0]! : Buffer.concat(chunks, total)));
    // A client that goes away mid-body: nothing to answer, nothing to log as a server error.
    const cut = () => reject(new HttpError('BAD_REQUEST', 'The request body did not arrive in full.'));
    req.once('error', cut);
    req.once('close', () => req.complete || cut());
  });
}

/** Writes a Response (refusals, errors, 204) to the Node answer. */
async function send(res: ServerResponse, response: Response): Promise<void> {
  const body = response.body ? Buffer.from(await response.arrayBuffer()) : undefined;
  res.writeHead(response.status, Object.fromEntries(response.headers));
  res.end(body);
}

async function serve(route: DirectRoute, pathname: string, query: string, req: IncomingMessage, res: ServerResponse) {
  const method = req.method ?? 'GET';
  const record = requestRecord();
  if (record) record.route = route.spec.path;
  startBackgroundWork();
  const header = (n: string) => headerOf(req, n);
  const refused = gate({ method, pathname, header });
  if (refused) return send(res, secure(refused, pathname, false));
  let session: RequestSession | null;
  try {
    session = await sessionOf(pathname, header('cookie'), () => headersOf(req));
  } catch (err) {
    return send(res, secure(failure(err, route.spec, method), pathname, false));
  }
  const answer = await handlePlain(route.spec, route.run, {
    method,
    user: session?.user ?? null,
    params: {},
    search: new URLSearchParams(query),
    readBody: async () => {
      requireJson(header('content-type'));
      return jsonOfBytes(await bodyOf(req, res, MAX_JSON_BYTES));
    },
  });
  if (answer instanceof Response) return send(res, secure(answer, pathname, !!session));
  const headers: Record<string, string> = {
    'content-type': 'application/json; charset=utf-8',
    'content-length': String(Buffer.byteLength(answer.text)),
  };
  for (const [k, v] of securityHeaders(pathname, !!session, (n) => n in headers)) headers[k] = v;
  res.writeHead(answer.status, headers);
  res.end(answer.text);
}

/** The lane's server for this request, or null when the route is not one of DIRECT_ROUTES (Astro serves it). */
export function directLane(
  method: string | undefined,
  url: string | undefined,
): ((req: IncomingMessage, res: ServerResponse) => Promise<void>) | null {
  if (!url) return null;
  const q = url.indexOf('?');
  const pathname = q < 0 ? url : url.slice(0, q);
  const route = routes.get(`${method} ${pathname}`);
  if (!route) return null;
  return (req, res) =>
    serve(route, pathname, q < 0 ? '' : url.slice(q + 1), req, res).catch((err) => {
      // Never left hanging: whatever went wrong is logged like handle()'s failures.
      const answer = failure(err, route.spec, method ?? 'GET');
      if (!res.headersSent) return send(res, secure(answer, pathname, false));
      res.destroy();
    });
}

(globalThis as unknown as Record<symbol, typeof directLane>)[Symbol.for('swardkeep.direct-lane')] = directLane;

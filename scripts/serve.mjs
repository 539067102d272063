/**
 * Runs the built app (`astro build` → dist/server/entry.mjs) behind a Node HTTP server we own,
 * for three things the adapter's own server cannot do:
 * - The client address. The adapter believes the first X-Forwarded-For value, which any client
 *   can write. Here forwarding headers count only when the connection comes from a trusted proxy
 *   (TRUSTED_PROXIES: empty = none, the default; a hop count like "1"; or addresses/CIDRs and the
 *   names loopback, linklocal, uniquelocal, comma-separated), else the socket address is used.
 *   The result is handed on as the only X-Forwarded-For value, so Astro's clientAddress is it.
 * - Security headers on static files (nosniff, no framing), which never reach Astro's middleware.
 * - TRACE and friends are refused before the app sees them.
 * - Compression: static files from their precompressed copies (scripts/compressed-static.mjs);
 *   dynamic answers (HTML, JSON, CSV, GeoJSON, vector tiles) with Brotli or gzip at a low level
 *   that costs little CPU (the `compression` package).
 * - One JSON log line per request (pino, src/lib/log.mjs): request id, method, route pattern,
 *   status, duration; never the raw path, query string, client address or user. The request id
 *   comes from X-Request-Id when well formed, else is made here, and is echoed in the answer.
 * - Graceful shutdown on SIGTERM/SIGINT: stop accepting, let requests in flight finish (up to
 *   SHUTDOWN_GRACE_MS, default 15000), run the app's stop hooks (job queue, mail worker), then its
 *   close hooks (the database pool), exit 0 (1 if requests had to be cut off).
 * - The direct lane: the few pure-computation API routes listed in src/lib/http/direct-routes.ts
 *   (POST /api/estimates) skip Astro's pipeline and run the same gate, session, contract checks and
 *   security headers from the app's own code (src/lib/http/direct-lane.ts, which the app registers
 *   on globalThis); request id, log line and compression stay as here. DIRECT_LANE=off turns it off.
 * Environment: HOST, PORT, SWARDKEEP_DIST (build folder), TRUSTED_PROXIES, LOG_LEVEL, SHUTDOWN_GRACE_MS, DIRECT_LANE.
 */
import { AsyncLocalStorage } from 'node:async_hooks';
import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import compression from 'compression';
import proxyaddr from 'proxy-addr';
import zlib from 'node:zlib';
import { compressedStatic, plainStatic } from './compressed-static.mjs';
import { logger, REQUEST_ID } from '../src/lib/log.mjs';

export function trustFrom(setting) {
  const value = (setting ?? '').trim();
  if (value === '') return () => false;
  if (/^\d+$/.test(value)) {
    const hops = Number(value);
    return (_addr, i) => i < hops;
  }
  return proxyaddr.compile(
    value
      .split(',')
      .map((s) => s.trim())
      .filter(Boolean),
  );
}

const trust = trustFrom(process.env.TRUSTED_PROXIES);
const FORWARDING = [
  'x-forwarded-for',
  'x-forwarded-host',
  'x-forwarded-proto',
  'x-forwarded-port',
  'forwarded',
  'x-real-ip',
  'x-client-ip',
];

function prepare(req, res) {
  const socketAddress = req.socket.remoteAddress ?? '';
  const viaProxy = trust(socketAddress, 0);
  const client = viaProxy ? proxyaddr(req, trust) : socketAddress;
  // Only headers that are there are deleted (deleting makes the headers object slower to read).
  if (!viaProxy) for (const h of FORWARDING) h in req.headers && delete req.headers[h];
  else for (const h of ['forwarded', 'x-real-ip', 'x-client-ip']) h in req.headers && delete req.headers[h];
  req.headers['x-forwarded-for'] = client;
  res.setHeader('x-content-type-options', 'nosniff');
  res.setHeader('x-frame-options', 'DENY');
  res.setHeader('content-security-policy', "frame-ancestors 'none'");
}

const EXTRA_COMPRESSIBLE = /^(application\/(vnd\.mapbox-vector-tile|geo\+json|x-protobuf)|text\/csv)\b/;

/** Brotli quality 4 and gzip level 5: most of the saving for a small share of the CPU of the top levels. */
export const compress = compression({
  level: 5,
  brotli: { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 4 } },
  filter: (req, res) =>
    EXTRA_COMPRESSIBLE.test(String(res.getHeader('content-type') ?? '')) || compression.filter(req, res),
});

/**
 * Backpressure for streamed answers. Astro writes a response body as fast as the route makes it,
 * whatever the client reads; this watches the writes (after compression's, so a full gzip
 * stream counts too) and gives routes `locals.room()`, which waits for 'drain' when the last
 * write said the buffer was full (src/lib/http/text-stream.ts).
 */
function roomFor(res) {
  let full = false;
  let waiting = null;
  const release = () => {
    full = false;
    const w = waiting;
    waiting = null;
    w?.();
  };
  const write = res.write;
  let listening = false;
  res.write = function (...args) {
    const ok = write.apply(this, args);
    if (!ok) {
      full = true;
      if (!listening) {
        listening = true;
        res.on('drain', release);
        res.on('close', release);
      }
    }
    return ok;
  };
  return () => (full && !res.destroyed ? new Promise((resolve) => (waiting = resolve)) : undefined);
}

/** The request's record (id, route pattern), read by the app through src/lib/request-context.ts. */
const requestContext = new AsyncLocalStorage();
globalThis[Symbol.for('swardkeep.request-context')] = requestContext;

function requestIdOf(req) {
  const given = req.headers['x-request-id'];
  return typeof given === 'string' && REQUEST_ID.test(given) ? given : randomUUID();
}

const DIRECT_LANE = Symbol.for('swardkeep.direct-lane');
const laneOn = process.env.DIRECT_LANE !== 'off';

/** Probes from the load balancer come every few seconds: logged at debug level unless they fail. */
const PROBES = new Set(['/api/health', '/api/ready']);

function logRequest(req, res, record, started) {
  const durationMs = Math.round(Number(process.hrtime.bigint() - started) / 1e5) / 10;
  const status = res.statusCode;
  const line = {
    reqId: record.id,
    method: req.method,
    route: record.route,
    status,
    durationMs,
    ...(res.writableFinished ? {} : { aborted: true }),
  };
  const level = status >= 500 ? 'error' : PROBES.has(record.route ?? '') && status < 400 ? 'debug' : 'info';
  logger[level](line, 'request');
}

async function main() {
  process.env.ASTRO_NODE_AUTOSTART = 'disabled';
  const entry = path.resolve(process.env.SWARDKEEP_DIST ?? 'dist', 'server/entry.mjs');
  // The GIS pool's threads load the build's bundled tasks (scripts/build-worker.mjs), not the source through tsx.
  const worker = path.resolve(process.env.SWARDKEEP_DIST ?? 'dist', 'server/gis-worker.mjs');
  if (!process.env.SWARDKEEP_GIS_WORKER && existsSync(worker)) process.env.SWARDKEEP_GIS_WORKER = worker;
  const { handler } = await import(pathToFileURL(entry).href);
  const clientDir = path.resolve(process.env.SWARDKEEP_DIST ?? 'dist', 'client');
  const [compressedFile, plainFile] = [compressedStatic(clientDir), plainStatic(clientDir)];
  const serveStatic = async (req, res) => (await compressedFile(req, res)) || plainFile(req, res);
  const inFlight = new Set();
  let stopping = false;
  const server = http.createServer((req, res) => {
    const started = process.hrtime.bigint();
    const record = { id: requestIdOf(req), route: null };
    req.headers['x-request-id'] = record.id;
    res.setHeader('x-request-id', record.id);
    if (stopping) res.setHeader('connection', 'close');
    inFlight.add(res);
    res.once('close', () => {
      inFlight.delete(res);
      logRequest(req, res, record, started);
      if (stopping) server.closeIdleConnections();
    });
    if (['TRACE', 'TRACK', 'CONNECT'].includes(req.method ?? '')) {
      record.route = 'refused';
      res.writeHead(405, {
        allow: 'GET, HEAD, POST',
        'content-type': 'text/plain; charset=utf-8',
        'x-content-type-options': 'nosniff',
      });
      res.end(`${req.method} is not served.`);
      return;
    }
    try {
      decodeURI(req.url ?? '/');
    } catch {
      record.route = 'refused';
      res.writeHead(400, { 'content-type': 'text/plain; charset=utf-8' });
      res.end('Bad request.');
      return;
    }
    prepare(req, res);
    const app = () => compress(req, res, () => handler(req, res, undefined, { room: roomFor(res) }));
    requestContext.run(record, () => {
      // API paths are never files: no file-system look-up for them.
      if (req.url?.startsWith('/api/')) {
        const direct = laneOn ? globalThis[DIRECT_LANE]?.(req.method, req.url) : null;
        // Without Accept-Encoding nothing is compressed: only the header compression would add is set.
        if (direct && req.headers['accept-encoding'] === undefined) {
          res.setHeader('vary', 'Accept-Encoding');
          void direct(req, res);
        } else if (direct) compress(req, res, () => void direct(req, res));
        else app();
      } else serveStatic(req, res).then((served) => (served ? (record.route = 'static') : app()), app);
    });
  });
  const host = process.env.HOST ?? '127.0.0.1';
  const port = Number(process.env.PORT ?? 4321);
  server.listen(port, host, () => {
    logger.info({ host, port }, `Swardkeep listening on http://${host}:${port}`);
    // Warm up now rather than on a user's first request (src/lib/warm-up.ts).
    fetch(`http://${host.includes(':') ? `[${host}]` : host}:${port}/api/health`).then(
      (r) => r.arrayBuffer(),
      () => undefined,
    );
  });
  const stop = async (signal) => {
    if (stopping) {
      logger.warn({ signal }, 'second signal: exiting at once');
      process.exit(1);
    }
    stopping = true;
    const graceMs = Number(process.env.SHUTDOWN_GRACE_MS ?? 15000);
    logger.info(
      { signal, inFlight: inFlight.size, graceMs },
      'shutting down: no new connections, finishing requests in flight',
    );
    // Answers still to be written tell the client to close; idle keep-alive connections go now.
    for (const res of inFlight) if (!res.headersSent) res.setHeader('connection', 'close');
    const closed = new Promise((resolve) => server.close(resolve));
    server.closeIdleConnections();
    let cutOff = false;
    const grace = setTimeout(() => {
      cutOff = inFlight.size > 0;
      if (cutOff)
        logger.warn({ inFlight: inFlight.size }, 'requests still running after the grace period: closing them');
      server.closeAllConnections();
    }, graceMs);
    await closed;
    clearTimeout(grace);
    // Stop hooks (job queue, mail worker) may still use the database; close hooks (the pool) come last.
    setTimeout(() => {
      logger.error('stop hooks did not finish within 10 s: exiting');
      process.exit(1);
    }, 10_000).unref();
    for (const name of ['swardkeep.stop-hooks', 'swardkeep.close-hooks']) {
      const hooks = globalThis[Symbol.for(name)] ?? [];
      const results = await Promise.allSettled(hooks.map((hook) => hook()));
      for (const r of results)
        if (r.status === 'rejected') logger.error({ err: r.reason, hooks: name }, 'a shutdown hook failed');
    }
    logger.info({ cutOff }, 'stopped');
    logger.flush();
    process.exit(cutOff ? 1 : 0);
  };
  process.on('SIGTERM', () => void stop('SIGTERM'));
  process.on('SIGINT', () => void stop('SIGINT'));
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) await main();

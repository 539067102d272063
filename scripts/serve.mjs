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
 * Environment: HOST, PORT, SWARDKEEP_DIST (build folder), TRUSTED_PROXIES.
 */
import http from 'node:http';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import compression from 'compression';
import proxyaddr from 'proxy-addr';
import zlib from 'node:zlib';
import { compressedStatic } from './compressed-static.mjs';

export function trustFrom(setting) {
  const value = (setting ?? '').trim();
  if (value === '') return () => false;
  if (/^\d+$/.test(value)) {
    const hops = Number(value);
    return (_addr, i) => i < hops;
  }
  return proxyaddr.compile(value.split(',').map((s) => s.trim()).filter(Boolean));
}

const trust = trustFrom(process.env.TRUSTED_PROXIES);
const FORWARDING = ['x-forwarded-for', 'x-forwarded-host', 'x-forwarded-proto', 'x-forwarded-port', 'forwarded', 'x-real-ip', 'x-client-ip'];

function prepare(req, res) {
  const socketAddress = req.socket.remoteAddress ?? '';
  const viaProxy = trust(socketAddress, 0);
  const client = viaProxy ? proxyaddr(req, trust) : socketAddress;
  if (!viaProxy) for (const h of FORWARDING) delete req.headers[h];
  else for (const h of ['forwarded', 'x-real-ip', 'x-client-ip']) delete req.headers[h];
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
  filter: (req, res) => EXTRA_COMPRESSIBLE.test(String(res.getHeader('content-type') ?? '')) || compression.filter(req, res),
});

async function main() {
  process.env.ASTRO_NODE_AUTOSTART = 'disabled';
  const entry = path.resolve(process.env.SWARDKEEP_DIST ?? 'dist', 'server/entry.mjs');
  const { handler } = await import(pathToFileURL(entry).href);
  const serveStatic = compressedStatic(path.resolve(process.env.SWARDKEEP_DIST ?? 'dist', 'client'));
  const server = http.createServer((req, res) => {
    if (['TRACE', 'TRACK', 'CONNECT'].includes(req.method ?? '')) {
      res.writeHead(405, { allow: 'GET, HEAD, POST', 'content-type': 'text/plain; charset=utf-8', 'x-content-type-options': 'nosniff' });
      res.end(`${req.method} is not served.`);
      return;
    }
    prepare(req, res);
    // API paths are never files: no file-system look-up for them.
    if (req.url?.startsWith('/api/')) {
      compress(req, res, () => handler(req, res));
      return;
    }
    serveStatic(req, res).then(
      (served) => served || compress(req, res, () => handler(req, res)),
      () => compress(req, res, () => handler(req, res)),
    );
  });
  const host = process.env.HOST ?? '127.0.0.1';
  const port = Number(process.env.PORT ?? 4321);
  server.listen(port, host, () => {
    console.log(`Swardkeep listening on http://${host}:${port}`);
    // Warm up now rather than on a user's first request (src/lib/warm-up.ts).
    fetch(`http://${host.includes(':') ? `[${host}]` : host}:${port}/api/health`).then((r) => r.arrayBuffer(), () => undefined);
  });
  // Stop at once on Ctrl-C or TERM: finish nothing new, drop idle keep-alive connections, let the
  // app's stop hooks run (the job queue stops its workers), and exit within 5 s even if a request
  // hangs (the callers' `wait` then returns and the port is free).
  const stop = async () => {
    const closed = new Promise((resolve) => server.close(resolve));
    server.closeIdleConnections();
    setTimeout(() => process.exit(0), 5000).unref();
    const hooks = globalThis[Symbol.for('swardkeep.stop-hooks')] ?? [];
    await Promise.allSettled(hooks.map((hook) => hook()));
    await closed;
    process.exit(0);
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) await main();

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
 * Environment: HOST, PORT, SWARDKEEP_DIST (build folder), TRUSTED_PROXIES.
 */
import http from 'node:http';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import proxyaddr from 'proxy-addr';

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

async function main() {
  process.env.ASTRO_NODE_AUTOSTART = 'disabled';
  const entry = path.resolve(process.env.SWARDKEEP_DIST ?? 'dist', 'server/entry.mjs');
  const { handler } = await import(pathToFileURL(entry).href);
  const server = http.createServer((req, res) => {
    if (['TRACE', 'TRACK', 'CONNECT'].includes(req.method ?? '')) {
      res.writeHead(405, { allow: 'GET, HEAD, POST', 'content-type': 'text/plain; charset=utf-8', 'x-content-type-options': 'nosniff' });
      res.end(`${req.method} is not served.`);
      return;
    }
    prepare(req, res);
    handler(req, res);
  });
  const host = process.env.HOST ?? '127.0.0.1';
  const port = Number(process.env.PORT ?? 4321);
  server.listen(port, host, () => console.log(`Swardkeep listening on http://${host}:${port}`));
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

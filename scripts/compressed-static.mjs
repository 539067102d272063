/**
 * Serves the build's precompressed static files (scripts/precompress.mjs) when the client accepts
 * Brotli or gzip; everything else goes on to the app. Paths are resolved inside the client folder
 * only (no traversal). Hashed assets under /_astro/ are cached for a year, as Astro does.
 */
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import path from 'node:path';
import Negotiator from 'negotiator';
import send from 'send';
import { PRECOMPRESSED_TYPES } from './precompress.mjs';

export function compressedStatic(clientDir) {
  const root = path.resolve(clientDir);
  return async function serve(req, res) {
    if (req.method !== 'GET' && req.method !== 'HEAD') return false;
    let pathname;
    try {
      pathname = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
    } catch {
      return false;
    }
    const type = PRECOMPRESSED_TYPES[path.extname(pathname)];
    if (!type || pathname.includes('\0')) return false;
    const file = path.resolve(root, `.${pathname}`);
    if (!file.startsWith(root + path.sep)) return false;
    const encoding = new Negotiator(req).encoding(['br', 'gzip', 'identity'], ['br', 'gzip']);
    if (encoding !== 'br' && encoding !== 'gzip') return false;
    const compressed = `${file}.${encoding === 'br' ? 'br' : 'gz'}`;
    const info = await stat(compressed).catch(() => null);
    if (!info?.isFile()) return false;
    res.statusCode = 200;
    res.setHeader('content-type', type);
    res.setHeader('content-encoding', encoding);
    res.setHeader('content-length', info.size);
    res.setHeader('vary', 'Accept-Encoding');
    res.setHeader(
      'cache-control',
      pathname.startsWith('/_astro/') ? 'public, max-age=31536000, immutable' : 'public, max-age=0',
    );
    if (req.method === 'HEAD') return (res.end(), true);
    createReadStream(compressed).pipe(res);
    return true;
  };
}

/**
 * The rest of the build's client files (icons, fonts, and scripts for a client that accepts no
 * compression), served with `send` as Astro's standalone server did: hashed assets under /_astro/
 * cached for a year, dot-files refused. Only paths with a file extension are looked up (pages and
 * API routes have none, so they cost no file-system call); a miss resolves false and goes on to the app.
 */
export function plainStatic(clientDir) {
  const root = path.resolve(clientDir);
  return function serve(req, res) {
    if (req.method !== 'GET' && req.method !== 'HEAD') return Promise.resolve(false);
    const pathname = (req.url ?? '/').split(/[?#]/, 1)[0];
    if (!path.posix.extname(pathname)) return Promise.resolve(false);
    return new Promise((resolve) => {
      const stream = send(req, pathname, { root, index: false, dotfiles: 'deny' });
      stream.on('error', () => resolve(false));
      stream.on('directory', () => resolve(false));
      stream.on('headers', (r) => {
        if (pathname.startsWith('/_astro/')) r.setHeader('cache-control', 'public, max-age=31536000, immutable');
      });
      stream.on('file', () => resolve(true));
      stream.pipe(res);
    });
  };
}

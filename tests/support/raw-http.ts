/** Requests fetch() will not make: TRACE, and bodies streamed in chunks that may be cut off by the server. */
import http from 'node:http';
import { APP_PORT } from './env';

export type RawResponse = { status: number; headers: http.IncomingHttpHeaders; body: string; sentBytes: number };

/**
 * Sends `totalBytes` of `chunk` repeated, chunked (no Content-Length) unless `declareLength`,
 * and resolves with the answer as soon as it comes, even while the body is still being sent.
 */
export function rawRequest(opts: { method: string; path: string; headers?: Record<string, string>; body?: string; totalBytes?: number; declareLength?: boolean; port?: number }): Promise<RawResponse> {
  return new Promise((resolve, reject) => {
    const total = opts.totalBytes ?? 0;
    const headers: Record<string, string> = { ...(opts.headers ?? {}) };
    if (total > 0 && opts.declareLength) headers['content-length'] = String(total);
    const req = http.request({ host: '127.0.0.1', port: opts.port ?? APP_PORT, method: opts.method, path: opts.path, headers });
    let sent = 0;
    let answered = false;
    req.on('response', (res) => {
      answered = true;
      let body = '';
      res.setEncoding('utf8');
      res.on('data', (d) => (body += d));
      res.on('end', () => {
        resolve({ status: res.statusCode ?? 0, headers: res.headers, body, sentBytes: sent });
        req.destroy();
      });
    });
    req.on('error', (err) => {
      if (!answered) reject(err);
    });
    const piece = Buffer.alloc(64 * 1024, 0x20); // spaces: valid JSON whitespace, so only the size can be refused
    const pump = () => {
      while (!answered && sent < total) {
        const n = Math.min(piece.length, total - sent);
        sent += n;
        if (!req.write(n === piece.length ? piece : piece.subarray(0, n))) return void req.once('drain', pump);
      }
      if (!answered) req.end();
    };
    if (total > 0) pump();
    else req.end(opts.body);
  });
}

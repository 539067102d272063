/** Requests fetch() will not make: TRACE, and bodies the server must refuse before they end. */
import http from 'node:http';
import { APP_PORT } from './env';

export type RawResponse = { status: number; headers: http.IncomingHttpHeaders; body: string };

/**
 * Sends the headers, then `body` or `totalBytes` of spaces (chunked unless `declaredLength` is
 * given). With `holdOpen` the request is never finished: an answer then proves the server
 * decided before the body ended (it stopped reading at its cap, or never started).
 */
export function rawRequest(opts: {
  method: string;
  path: string;
  headers?: Record<string, string>;
  body?: string;
  totalBytes?: number;
  declaredLength?: number;
  holdOpen?: boolean;
  port?: number;
}): Promise<RawResponse> {
  return new Promise((resolve, reject) => {
    const headers: Record<string, string> = { ...(opts.headers ?? {}) };
    if (opts.declaredLength !== undefined) headers['content-length'] = String(opts.declaredLength);
    const req = http.request({
      host: '127.0.0.1',
      port: opts.port ?? APP_PORT,
      method: opts.method,
      path: opts.path,
      headers,
    });
    const timer = setTimeout(() => {
      req.destroy();
      reject(new Error(`${opts.method} ${opts.path}: no answer within 20 s`));
    }, 20_000);
    req.on('response', (res) => {
      let body = '';
      res.setEncoding('utf8');
      res.on('data', (d) => (body += d));
      res.on('end', () => {
        clearTimeout(timer);
        resolve({ status: res.statusCode ?? 0, headers: res.headers, body });
        req.destroy();
      });
    });
    req.on('error', (err) => {
      clearTimeout(timer);
      reject(err);
    });
    if (opts.totalBytes)
      req.write(Buffer.alloc(opts.totalBytes, 0x20)); // spaces: valid JSON whitespace, so only the size can be refused
    else if (opts.body !== undefined) req.write(opts.body);
    if (opts.holdOpen) req.flushHeaders();
    else req.end();
  });
}

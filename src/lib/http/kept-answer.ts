/**
 * Answers made once and sent many times (the public register's list for one head and query): the
 * UTF-8 bytes, an ETag derived from what fixes them, and Brotli / gzip copies made on first demand.
 * A request whose If-None-Match names the ETag gets 304; one that accepts Brotli or gzip gets the
 * kept copy (scripts/serve.mjs leaves an answer that already has a Content-Encoding alone), so a
 * busy list compresses each answer once, not once per request.
 */
import { createHash } from 'node:crypto';
import { promisify } from 'node:util';
import zlib from 'node:zlib';
import { keptBytesResponse } from './errors';

const brotli = promisify(zlib.brotliCompress);
const gzip = promisify(zlib.gzip);
/** Below this size compression saves too little to be worth a header. */
const MIN_COMPRESS_BYTES = 1024;

export type KeptAnswer = { bytes: Uint8Array; etag: string; encoded: Map<'br' | 'gzip', Promise<Uint8Array>> };

/** `key` must name everything the bytes depend on: the same key always means the same bytes. */
export function keptAnswer(bytes: Uint8Array, key: string): KeptAnswer {
  const etag = `"k${createHash('sha256').update(key).digest('base64url').slice(0, 27)}"`;
  return { bytes, etag, encoded: new Map() };
}

/** Whether an Accept-Encoding header accepts a content coding (RFC 9110 §12.5.3: q=0 refuses; `*` stands for any coding not named). */
export function acceptsEncoding(header: string | null, coding: 'br' | 'gzip'): boolean {
  if (!header) return false;
  let star: number | null = null;
  for (const part of header.split(',')) {
    const [name, ...params] = part.trim().toLowerCase().split(';');
    const qParam = params.map((p) => p.trim()).find((p) => p.startsWith('q='));
    const q = qParam ? Number(qParam.slice(2)) : 1;
    if (name === coding) return q > 0;
    if (name === '*') star = q;
  }
  return star !== null && star > 0;
}

function encode(kept: KeptAnswer, coding: 'br' | 'gzip'): Promise<Uint8Array> {
  let p = kept.encoded.get(coding);
  if (!p) {
    p =
      coding === 'br'
        ? brotli(kept.bytes, { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 9 } })
        : gzip(kept.bytes, { level: 9 });
    kept.encoded.set(coding, p);
    p.catch(() => kept.encoded.delete(coding));
  }
  return p;
}

/** The answer to one request: 304, a kept compressed copy, or the bytes; `headers` without content-encoding. */
export async function sendKept(request: Request, kept: KeptAnswer, headers: Record<string, string>): Promise<Response> {
  const common = { ...headers, etag: kept.etag, vary: 'Accept-Encoding' };
  if (request.headers.get('if-none-match') === kept.etag) return new Response(null, { status: 304, headers: common });
  if (kept.bytes.byteLength >= MIN_COMPRESS_BYTES) {
    const accept = request.headers.get('accept-encoding');
    const coding = acceptsEncoding(accept, 'br') ? 'br' : acceptsEncoding(accept, 'gzip') ? 'gzip' : null;
    if (coding) return keptBytesResponse(await encode(kept, coding), { ...common, 'content-encoding': coding });
  }
  return keptBytesResponse(kept.bytes, common);
}

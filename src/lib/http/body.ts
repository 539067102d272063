/**
 * Reading request bodies safely: the size is capped while streaming (a declared Content-Length
 * over the cap is refused before reading; a chunked body is cut off at the cap), the media type
 * is parsed exactly (RFC 9110 §8.3.1, with the `content-type` package), and text containing the
 * NUL character is refused (PostgreSQL cannot store it).
 */
import contentType from 'content-type';
import { HttpError } from './errors';

export const MAX_JSON_BYTES = 1_000_000;
/** Sign-in, reset and the plain sign-in form carry a few short fields. */
export const MAX_AUTH_BODY_BYTES = 16 * 1024;

export function tooLarge(cap: number): HttpError {
  return new HttpError('PAYLOAD_TOO_LARGE', `The request body is larger than the allowed ${cap} bytes.`);
}

/** The declared length is over the cap (no body is read). */
export function declaredTooLarge(request: Request, cap: number): boolean {
  return declaredOver(request.headers.get('content-length'), cap);
}

/** A Content-Length header value over the cap. */
export function declaredOver(contentLength: string | null, cap: number): boolean {
  const declared = Number(contentLength ?? 0);
  return Number.isFinite(declared) && declared > cap;
}

/** The whole body, or 413 as soon as more than `cap` bytes have arrived. */
export async function readBodyCapped(request: Request, cap: number): Promise<Uint8Array> {
  if (declaredTooLarge(request, cap)) throw tooLarge(cap);
  if (!request.body) return new Uint8Array(0);
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > cap) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge(cap);
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/** The media type ("application/json"), lower case, or null without a Content-Type; 415 when unreadable or not UTF-8. */
export function mediaTypeOf(request: Request): string | null {
  return mediaTypeOfHeader(request.headers.get('content-type'));
}

/** mediaTypeOf for a Content-Type header value. */
export function mediaTypeOfHeader(header: string | null | undefined): string | null {
  if (!header) return null;
  let parsed: contentType.ParsedMediaType;
  try {
    parsed = contentType.parse(header);
  } catch {
    throw new HttpError('UNSUPPORTED_MEDIA_TYPE', 'The Content-Type header could not be read.');
  }
  const charset = parsed.parameters.charset?.toLowerCase();
  if (charset && charset !== 'utf-8') throw new HttpError('UNSUPPORTED_MEDIA_TYPE', 'Send text as UTF-8.');
  return parsed.type;
}

/** Throws 400 when any string (or object key) in a parsed value contains the NUL character. */
export function rejectNul(value: unknown, path: (string | number)[] = []): void {
  nulWalk(value, [...path]);
}

/** rejectNul's walk: `path` is pushed and popped on the way (copied only for the error). */
function nulWalk(value: unknown, path: (string | number)[]): void {
  if (typeof value === 'string') {
    if (value.includes('\u0000'))
      throw new HttpError('BAD_REQUEST', 'Text may not contain the NUL character (code 0).', [
        { path: [...path], message: 'contains NUL' },
      ]);
  } else if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      if (!(i in value)) continue;
      path.push(i);
      nulWalk(value[i], path);
      path.pop();
    }
  } else if (value && typeof value === 'object') {
    const o = value as Record<string, unknown>;
    for (const k of Object.keys(o)) {
      nulWalk(k, path);
      path.push(k);
      nulWalk(o[k], path);
      path.pop();
    }
  }
}

/** A JSON body: exactly application/json, at most `cap` bytes, valid, without NUL characters. */
export async function readJson(request: Request, cap = MAX_JSON_BYTES): Promise<unknown> {
  requireJson(request.headers.get('content-type'));
  return jsonOfBytes(await readBodyCapped(request, cap));
}

/** 415 unless the Content-Type header value says application/json (UTF-8). */
export function requireJson(contentTypeHeader: string | null | undefined): void {
  if (mediaTypeOfHeader(contentTypeHeader) !== 'application/json')
    throw new HttpError('UNSUPPORTED_MEDIA_TYPE', 'Send the request body as application/json.');
}

/** Decodes whole bodies (no streaming state), so one decoder serves every request. */
const UTF8 = new TextDecoder('utf-8', { fatal: true });

/** The parsed JSON of a body's bytes: 400 when not UTF-8 or not JSON, or when it holds a NUL character. */
export function jsonOfBytes(bytes: Uint8Array): unknown {
  let value: unknown;
  try {
    value = JSON.parse(UTF8.decode(bytes));
  } catch {
    throw new HttpError('BAD_REQUEST', 'The request body is not valid JSON.');
  }
  rejectNul(value);
  return value;
}

/** A form body (application/x-www-form-urlencoded), capped, without NUL characters. */
export async function readForm(request: Request, cap = MAX_AUTH_BODY_BYTES): Promise<URLSearchParams> {
  if (mediaTypeOf(request) !== 'application/x-www-form-urlencoded')
    throw new HttpError('UNSUPPORTED_MEDIA_TYPE', 'Send the form as application/x-www-form-urlencoded.');
  const text = new TextDecoder().decode(await readBodyCapped(request, cap));
  const form = new URLSearchParams(text);
  rejectNul(Object.fromEntries(form));
  return form;
}

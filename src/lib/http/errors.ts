/** One error shape for every API route: { error: { code, message, issues? } }. */
export const ERROR_STATUS = {
  BAD_REQUEST: 400,
  UNAUTHORIZED: 401,
  FORBIDDEN: 403,
  NOT_FOUND: 404,
  METHOD_NOT_ALLOWED: 405,
  CONFLICT: 409,
  GONE: 410,
  PAYLOAD_TOO_LARGE: 413,
  UNSUPPORTED_MEDIA_TYPE: 415,
  UNPROCESSABLE_CONTENT: 422,
  TOO_MANY_REQUESTS: 429,
  INTERNAL_SERVER_ERROR: 500,
  SERVICE_UNAVAILABLE: 503,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;
export type Issue = { path: (string | number)[]; message: string };

export class HttpError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly issues?: Issue[],
  ) {
    super(message);
  }
  get status(): number {
    return ERROR_STATUS[this.code];
  }
}

export function json(data: unknown, status = 200, headers: Record<string, string> = {}): Response {
  return new Response(JSON.stringify(data), {
    status,
    headers: { 'content-type': 'application/json; charset=utf-8', ...headers },
  });
}

export function errorResponse(code: ErrorCode, message: string, issues?: Issue[]): Response {
  return json({ error: { code, message, ...(issues?.length ? { issues } : {}) } }, ERROR_STATUS[code]);
}

/**
 * An answer whose body is bytes kept between requests (a cached JSON text): sent as they are, with
 * their length, without the copy a Response makes of a byte body or the encoding of a string body.
 * The bytes are shared by every answer that sends them: never change them.
 */
export function keptBytesResponse(bytes: Uint8Array, headers: Record<string, string>, status = 200): Response {
  const body = new ReadableStream<Uint8Array>({
    start(controller) {
      controller.enqueue(bytes);
      controller.close();
    },
  });
  return new Response(body, { status, headers: { ...headers, 'content-length': String(bytes.byteLength) } });
}

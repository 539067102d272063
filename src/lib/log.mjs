/**
 * The one logger (pino): JSON lines on stdout, read by scripts/serve.mjs (request lines) and by the
 * app (errors). Plain JavaScript so that the server wrapper, which runs outside the build, shares it.
 *
 * Never log personal data: no names, e-mail addresses, client addresses, query strings, bodies or
 * raw paths (the route pattern, such as /api/users/[id], says enough). Errors keep their type, code,
 * message and stack only: PostgreSQL's `detail` and similar fields can repeat the values of a row.
 * Environment: LOG_LEVEL (fatal, error, warn, info, debug; default info).
 */
import pino from 'pino';

/** @param {unknown} err */
export function errorFields(err) {
  if (!(err instanceof Error)) return { type: typeof err, message: String(err).slice(0, 200) };
  const code = /** @type {{ code?: unknown }} */ (err).code;
  return { type: err.name, ...(typeof code === 'string' ? { code } : {}), message: err.message, stack: err.stack };
}

export const logger = pino({
  level: process.env.LOG_LEVEL ?? 'info',
  base: { service: 'swardkeep' },
  timestamp: pino.stdTimeFunctions.isoTime,
  formatters: { level: (label) => ({ level: label }) },
  serializers: { err: errorFields },
});

/** A request id from a client or proxy is used only when it looks like one: 8 to 128 letters, digits, `-`, `_`, `.`, `:`. */
export const REQUEST_ID = /^[A-Za-z0-9._:-]{8,128}$/;

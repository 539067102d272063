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

const LOG_FLUSH_MS = 250;

/** @param {unknown} err */
export function errorFields(err) {
  if (!(err instanceof Error)) return { type: typeof err, message: String(err).slice(0, 200) };
  const code = /** @type {{ code?: unknown }} */ (err).code;
  return { type: err.name, ...(typeof code === 'string' ? { code } : {}), message: err.message, stack: err.stack };
}

/**
 * Lines are gathered up to 4 kB and written together (one write per ~20 request lines instead of
 * one each, which cost a busy server several per cent of its CPU), at the latest LOG_FLUSH_MS (250)
 * after they were logged. pino writes what is left synchronously when the process exits, however
 * it exits; only a process killed outright (SIGKILL, out of memory) loses the last fraction of a
 * second. The server wrapper and the built app each load this module: they share one logger (one
 * buffer, one writer), so their lines never interleave.
 */
function makeLogger() {
  const destination = pino.destination({ dest: 1, sync: false, minLength: 4096 });
  let unwritten = false;
  setInterval(() => {
    if (unwritten) destination.flush();
    unwritten = false;
  }, LOG_FLUSH_MS).unref();
  return pino(
    {
      level: process.env.LOG_LEVEL ?? 'info',
      base: { service: 'swardkeep' },
      timestamp: pino.stdTimeFunctions.isoTime,
      formatters: { level: (label) => ({ level: label }) },
      serializers: { err: errorFields },
      hooks: {
        streamWrite: (line) => {
          unwritten = true;
          return line;
        },
      },
    },
    destination,
  );
}

const SHARED = Symbol.for('swardkeep.logger');
/** @type {import('pino').Logger} */
export const logger = /** @type {any} */ (globalThis)[SHARED] ?? makeLogger();
/** @type {any} */ (globalThis)[SHARED] = logger;

/** A request id from a client or proxy is used only when it looks like one: 8 to 128 letters, digits, `-`, `_`, `.`, `:`. */
export const REQUEST_ID = /^[A-Za-z0-9._:-]{8,128}$/;

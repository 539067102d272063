/**
 * The request's own record, kept by scripts/serve.mjs in an AsyncLocalStorage it puts on globalThis:
 * the request id (echoed as X-Request-Id) and the route pattern the middleware fills in for the
 * request log line. Empty under `astro dev`, where serve.mjs does not run.
 */
import type { AsyncLocalStorage } from 'node:async_hooks';

export type RequestRecord = { id: string; route: string | null };

export function requestRecord(): RequestRecord | undefined {
  const store = (globalThis as unknown as Record<symbol, AsyncLocalStorage<RequestRecord> | undefined>)[
    Symbol.for('swardkeep.request-context')
  ];
  return store?.getStore();
}

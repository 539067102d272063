/**
 * Hooks scripts/serve.mjs runs on SIGTERM/SIGINT after the requests in flight have finished:
 * first every stop hook (workers that may still use the database), then every close hook
 * (the database pool). Kept on globalThis because serve.mjs runs outside the build.
 */
type Hook = () => Promise<void>;

function hooks(name: 'swardkeep.stop-hooks' | 'swardkeep.close-hooks'): Hook[] {
  const g = globalThis as unknown as Record<symbol, Hook[] | undefined>;
  return (g[Symbol.for(name)] ??= []);
}

export function onServerStop(fn: Hook): void {
  hooks('swardkeep.stop-hooks').push(fn);
}

export function onServerClose(fn: Hook): void {
  hooks('swardkeep.close-hooks').push(fn);
}

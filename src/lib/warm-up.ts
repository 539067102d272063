/**
 * Loads what would otherwise load on first use and stall every request meanwhile (the event loop
 * is busy while an 8 MB catalogue or a password dictionary is parsed): the GIS worker pool, the
 * EPSG catalogue and the password-strength dictionaries. The first /api/health call starts it,
 * and the front server (scripts/serve.mjs) makes that call right after it starts listening.
 */
import { warmGisPool } from './workers/pool';

let started = false;

export function warmUp(): void {
  if (started) return;
  started = true;
  warmGisPool();
  // One at a time, each in its own turn of the event loop, so requests in between still get answered.
  setTimeout(() => {
    void import('./gis/crs-catalogue.server')
      .then((m) => m.crsFromEpsg(4326))
      .catch(() => undefined)
      .then(() => new Promise((r) => setTimeout(r, 20)))
      .then(() => import('./auth/password-policy'))
      .then((m) => m.passwordProblem('warm-up only, never stored'))
      .catch(() => undefined);
  }, 10);
}

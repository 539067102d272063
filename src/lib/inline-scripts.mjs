// @ts-check
/**
 * The only inline script on our pages, and its CSP hash (astro.config.mjs lists it, BaseLayout
 * renders it). zod 4 probes `new Function` on first use to decide whether to compile parsers; under
 * our CSP that probe is a violation. Setting `jitless` before any module loads stops the probe.
 */
import { createHash } from 'node:crypto';

export const ZOD_JITLESS_SCRIPT = 'globalThis.__zod_globalConfig={jitless:true};';

/** @param {string} script */
export function cspHashOf(script) {
  return `sha256-${createHash('sha256').update(script, 'utf8').digest('base64')}`;
}

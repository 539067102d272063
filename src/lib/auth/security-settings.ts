/**
 * Sign-in throttling and session idle timeout, stored in app_setting (key → jsonb) so every
 * instance agrees; defaults here (pure). Why the defaults (see README "Sign-in security"):
 * - An office behind one address: 30 wrong passwords within 15 minutes from one address before
 *   any delay, so a busy office's typos never lock it out; a single account gets 5.
 * - After that each further failure makes the next try wait twice as long as the last, from
 *   30 s up to 15 minutes: a guesser gets a few dozen tries an hour per account at most
 *   (OWASP ASVS 2.2.1: no more than 100 failed attempts per hour), a person who mistyped waits
 *   half a minute.
 * - Idle timeout 8 hours (a working day): a session unused that long ends; seven days at most.
 */
import { z } from 'zod';

export const securitySettingsSchema = z.object({
  'auth.throttle.window-minutes': z
    .number()
    .int()
    .min(1)
    .max(24 * 60)
    .default(15),
  'auth.throttle.account-free-failures': z.number().int().min(1).max(1000).default(5),
  'auth.throttle.address-free-failures': z.number().int().min(1).max(10_000).default(30),
  'auth.throttle.first-delay-seconds': z.number().int().min(1).max(3600).default(30),
  'auth.throttle.max-delay-seconds': z
    .number()
    .int()
    .min(1)
    .max(24 * 3600)
    .default(900),
  /** Reset mails one account may be sent per window (whether or not the address has an account). */
  'auth.throttle.reset-mails-per-account': z.number().int().min(1).max(100).default(3),
  'auth.session.idle-minutes': z
    .number()
    .int()
    .min(5)
    .max(7 * 24 * 60)
    .default(8 * 60),
});

export type SecuritySettings = z.output<typeof securitySettingsSchema>;
export const SECURITY_SETTING_KEYS = Object.keys(securitySettingsSchema.shape) as (keyof SecuritySettings)[];

/** Settings from stored rows; an invalid stored value fails loudly with its key. */
export function readSecuritySettings(rows: { key: string; value: unknown }[]): SecuritySettings {
  const stored = Object.fromEntries(
    rows.filter((r) => (SECURITY_SETTING_KEYS as string[]).includes(r.key)).map((r) => [r.key, r.value]),
  );
  const parsed = securitySettingsSchema.safeParse(stored);
  if (!parsed.success) {
    const i = parsed.error.issues[0]!;
    throw new Error(`setting "${String(i.path[0])}" is invalid: ${i.message}`);
  }
  return parsed.data;
}

/**
 * Seconds to wait before the next try, given the failures already counted in the window
 * (newest last) and now; 0 = go ahead. The first `free` failures cost nothing; after the n-th
 * failure beyond them the wait is firstDelay · 2^(n-1), capped, counted from the newest failure.
 */
export function backOffSeconds(
  failures: number,
  newestAtMs: number | null,
  nowMs: number,
  free: number,
  s: SecuritySettings,
): number {
  if (failures < free || newestAtMs === null) return 0;
  const over = failures - free + 1;
  const delay = Math.min(
    s['auth.throttle.first-delay-seconds'] * 2 ** Math.min(over - 1, 30),
    s['auth.throttle.max-delay-seconds'],
  );
  const left = Math.ceil((newestAtMs + delay * 1000 - nowMs) / 1000);
  return Math.max(0, left);
}

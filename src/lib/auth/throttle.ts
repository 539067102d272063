/**
 * Throttling of failed sign-ins per account and per client address, with back-off, and of
 * reset mails per account. Attempts live in PostgreSQL (auth_attempt), so every instance
 * counts the same; settings in app_setting (security-settings.ts). The client address is
 * the trusted one (scripts/serve.mjs), never a header the client chose.
 */
import type { Db } from '../db/client';
import { getSecuritySettings } from '../db/security-settings';
import { backOffSeconds, type SecuritySettings } from './security-settings';

const accountKey = (email: string) => `sign-in:account:${email.trim().toLowerCase()}`;
const addressKey = (address: string) => `sign-in:address:${address}`;
const resetKey = (email: string) => `reset:account:${email.trim().toLowerCase()}`;

async function failuresIn(
  db: Db,
  key: string,
  s: SecuritySettings,
  exceptId: number,
): Promise<{ count: number; newestMs: number | null }> {
  const row = await db('auth_attempt')
    .where({ key })
    .whereNot('id', exceptId)
    .where('at', '>', db.raw(`now() - make_interval(mins => ?)`, [s['auth.throttle.window-minutes']]))
    .first(db.raw('count(*)::int as count'), db.raw('max(at) as newest'));
  return { count: row?.count ?? 0, newestMs: row?.newest ? new Date(row.newest).getTime() : null };
}

export type SignInTicket = { wait: number; ids: number[] };

/**
 * Call before checking a password. It records the attempt as failed at once (so parallel
 * guesses see each other), then says how long to wait: > 0 means refuse (the attempt is
 * forgotten again). After the check, call `settleSignIn` with the outcome.
 */
export async function beginSignIn(db: Db, email: string, address: string, now = Date.now()): Promise<SignInTicket> {
  const s = await getSecuritySettings(db);
  const keys = [accountKey(email), addressKey(address)];
  const ids = (
    await db('auth_attempt')
      .insert(keys.map((key) => ({ key })))
      .returning('id')
  ).map((r: { id: number }) => r.id);
  const [account, byAddress] = [await failuresIn(db, keys[0]!, s, ids[0]!), await failuresIn(db, keys[1]!, s, ids[1]!)];
  const wait = Math.max(
    backOffSeconds(account.count, account.newestMs, now, s['auth.throttle.account-free-failures'], s),
    backOffSeconds(byAddress.count, byAddress.newestMs, now, s['auth.throttle.address-free-failures'], s),
  );
  if (wait > 0) await db('auth_attempt').whereIn('id', ids).del();
  return { wait, ids };
}

/** A wrong password stays counted; anything else (signed in, deactivated, refused) is not a guess. */
export async function settleSignIn(
  db: Db,
  ticket: SignInTicket,
  email: string,
  outcome: 'signed-in' | 'wrong-password' | 'other',
): Promise<void> {
  if (outcome === 'wrong-password') return;
  await db('auth_attempt').whereIn('id', ticket.ids).del();
  // Signed in: the account's owner knows the password, earlier typos no longer count against it.
  if (outcome === 'signed-in') await clearSignInFailures(db, email);
}

export async function clearSignInFailures(db: Db, email: string): Promise<void> {
  await db('auth_attempt')
    .where({ key: accountKey(email) })
    .del();
}

/** Counts a reset-mail request for this address; true when it is over the per-account limit. */
export async function resetMailRefused(db: Db, email: string): Promise<boolean> {
  const s = await getSecuritySettings(db);
  const [{ id }] = await db('auth_attempt')
    .insert({ key: resetKey(email) })
    .returning('id');
  const { count } = await failuresIn(db, resetKey(email), s, id);
  if (count < s['auth.throttle.reset-mails-per-account']) return false;
  await db('auth_attempt').where({ id }).del();
  return true;
}

/** Drops attempts older than a day (no window is longer); called now and then by sign-ins. */
export async function pruneAttempts(db: Db): Promise<void> {
  await db('auth_attempt').where('at', '<', db.raw(`now() - interval '1 day'`)).del();
}

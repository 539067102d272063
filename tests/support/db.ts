/** Direct database access for assertions (the same test database the server uses). */
import knexFactory from 'knex';
import { TEST_DATABASE_URL } from './env';

export const testDb = knexFactory({ client: 'pg', connection: TEST_DATABASE_URL, pool: { min: 0, max: 3 } });

/** Changes stored register entries by hand, as the database owner past the append-only trigger (tamper tests). */
export const editRegisterByHand = (sql: string, args: unknown[]) =>
  testDb.transaction(async (trx) => {
    await trx.raw('alter table register_entry disable trigger register_entry_no_update');
    await trx.raw(sql, args as never[]);
    await trx.raw('alter table register_entry enable trigger register_entry_no_update');
  });

/** Waits for the SMTP fake to have stored a mail to `to` whose subject matches, newer than `afterId`. */
export async function waitForMail(
  to: string,
  subject: RegExp,
  afterId = 0,
  timeoutMs = 15_000,
): Promise<{ id: number; subject: string; body_text: string }> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const rows = await testDb('mail_capture')
      .where('id', '>', afterId)
      .whereRaw('? = any(rcpt_to)', [to.toLowerCase()])
      .orderBy('id', 'desc');
    const hit = rows.find((r) => subject.test(r.subject));
    if (hit) return hit;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`no mail to ${to} matching ${subject} within ${timeoutMs} ms`);
}

export async function lastMailId(): Promise<number> {
  const r = await testDb('mail_capture').max('id as id').first();
  return Number(r?.id ?? 0);
}

export function linkIn(text: string): string {
  const m = text.match(/https?:\/\/\S+/);
  if (!m) throw new Error(`no link in mail: ${text}`);
  return m[0];
}

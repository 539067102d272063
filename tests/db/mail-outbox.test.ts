/** The outbox keeps mail when the mail server is down, and backs off before trying again. */
import { afterAll, describe, expect, it } from 'vitest';
import { appEnv } from '../support/env';

// Point this process at a port where no mail server listens.
Object.assign(process.env, { ...appEnv(), SMTP_PORT: '9' });
const { db } = await import('~/lib/db/client');
const { enqueueMail } = await import('~/lib/mail/outbox');
const { deliverDueMail } = await import('~/lib/mail/worker');

afterAll(() => db.destroy());

describe('mail outbox', () => {
  it('a failed delivery keeps the message, counts the attempt and schedules a retry', async () => {
    const to = `outbox.${Date.now()}@tarrow.example`;
    // Other rows may be due from the running server; claim only what this test wrote.
    await db('mail_outbox')
      .whereNull('sent_at')
      .update({ next_attempt_at: db.raw("now() + interval '1 hour'") });
    await enqueueMail(db, { to, subject: 'Test', text: 'Body', html: '<p>Body</p>' });
    const sent = await deliverDueMail();
    expect(sent).toBe(0);
    const row = await db('mail_outbox').where({ recipient: to }).first();
    expect(row.sent_at).toBeNull();
    expect(row.attempts).toBe(1);
    expect(row.last_error).toBeTruthy();
    expect(new Date(row.next_attempt_at).getTime()).toBeGreaterThan(Date.now() + 20_000);
    expect(await deliverDueMail()).toBe(0); // not due yet: nothing claimed
    await db('mail_outbox').whereNull('sent_at').update({ next_attempt_at: db.fn.now() });
  });
});

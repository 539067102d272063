/**
 * Transactional outbox: mail is written to mail_outbox in the same transaction as the change
 * that causes it, and delivered later by the worker (lib/mail/worker.ts). A mail server that
 * is down delays mail; it never loses it or rolls back the user's action.
 */
import type { Db } from '../db/client';
import type { MailContent } from './templates';

export type OutgoingMail = MailContent & { to: string };

export async function enqueueMail(db: Db, mail: OutgoingMail): Promise<void> {
  await db('mail_outbox').insert({
    recipient: mail.to,
    subject: mail.subject,
    body_text: mail.text,
    body_html: mail.html,
  });
}

export type OutboxRow = {
  id: number;
  recipient: string;
  subject: string;
  body_text: string;
  body_html: string;
  attempts: number;
};

/** Claims up to `limit` due messages; SKIP LOCKED lets several app instances share the queue. */
export async function claimDueMail(trx: Db, limit: number): Promise<OutboxRow[]> {
  return trx('mail_outbox')
    .select('id', 'recipient', 'subject', 'body_text', 'body_html', 'attempts')
    .whereNull('sent_at')
    .where('next_attempt_at', '<=', trx.fn.now())
    .where('attempts', '<', MAX_ATTEMPTS)
    .orderBy('id')
    .limit(limit)
    .forUpdate()
    .skipLocked();
}

export const MAX_ATTEMPTS = 12;

export async function markSent(trx: Db, id: number): Promise<void> {
  await trx('mail_outbox').where({ id }).update({ sent_at: trx.fn.now(), last_error: null });
}

/** Exponential back-off: 30 s, 1 min, 2 min … capped at 1 h. */
export async function markFailed(trx: Db, row: OutboxRow, error: string): Promise<void> {
  const delayS = Math.min(3600, 30 * 2 ** row.attempts);
  await trx('mail_outbox')
    .where({ id: row.id })
    .update({
      attempts: row.attempts + 1,
      last_error: error.slice(0, 500),
      next_attempt_at: trx.raw(`now() + make_interval(secs => ?)`, [delayS]),
    });
}

/**
 * Delivers the outbox. Every app instance runs one loop; rows are claimed with
 * FOR UPDATE SKIP LOCKED, so no mail is sent twice and none is lost if an instance dies
 * (its claim ends with its transaction).
 */
import { db } from '../db/client';
import { claimDueMail, markFailed, markSent } from './outbox';
import { sendMail } from './send';
import { logger } from '../log.mjs';
import { onServerStop } from '../shutdown';

const BATCH = 10;
const INTERVAL_MS = 1500;
let started = false;

/** Sends what is due now; returns how many were sent. Exposed for tests and the CLI. */
export async function deliverDueMail(): Promise<number> {
  return db.transaction(async (trx) => {
    const rows = await claimDueMail(trx, BATCH);
    let sent = 0;
    for (const row of rows) {
      try {
        await sendMail({ to: row.recipient, subject: row.subject, text: row.body_text, html: row.body_html });
        await markSent(trx, row.id);
        sent++;
      } catch (err) {
        await markFailed(trx, row, (err as Error).message);
      }
    }
    return sent;
  });
}

export function startMailWorker(): void {
  if (started) return;
  started = true;
  let stopped = false;
  let running: Promise<void> = Promise.resolve();
  const tick = async () => {
    try {
      while (!stopped && (await deliverDueMail()) === BATCH);
    } catch (err) {
      logger.error({ err }, 'mail worker error');
    }
    if (!stopped) setTimeout(() => (running = tick()), INTERVAL_MS).unref();
  };
  setTimeout(() => (running = tick()), 200).unref();
  // On shutdown: no further rounds; the round under way finishes (its claims commit or roll back).
  onServerStop(async () => {
    stopped = true;
    await running;
  });
}

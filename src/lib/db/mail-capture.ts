/** Mail caught by the local SMTP fake (development, demo and tests). */
import type { Db } from './client';

export type CapturedMail = {
  id: number;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
};

export async function insertCapturedMail(
  db: Db,
  m: { from: string; to: string[]; subject: string; text: string; html: string | null },
): Promise<void> {
  await db('mail_capture').insert({
    mail_from: m.from,
    rcpt_to: m.to,
    subject: m.subject,
    body_text: m.text,
    body_html: m.html,
  });
}

export async function listCapturedMail(
  db: Db,
  opts: { limit: number; beforeId?: number; to?: string },
): Promise<CapturedMail[]> {
  const q = db('mail_capture').select('*').orderBy('id', 'desc').limit(opts.limit);
  if (opts.beforeId) q.where('id', '<', opts.beforeId);
  if (opts.to) q.whereRaw('? = any(rcpt_to)', [opts.to.toLowerCase()]);
  const rows = await q;
  return rows.map((r) => ({
    id: r.id,
    receivedAt: r.received_at.toISOString(),
    from: r.mail_from,
    to: r.rcpt_to,
    subject: r.subject,
    text: r.body_text,
  }));
}

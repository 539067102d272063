/** SMTP transport (server-only): the local fake in development and tests, a real relay in production. */
import nodemailer, { type Transporter } from 'nodemailer';
import { config } from '../config';
import type { OutgoingMail } from './outbox';

let transport: Transporter | null = null;

function getTransport(): Transporter {
  const c = config();
  transport ??= nodemailer.createTransport({
    host: c.SMTP_HOST,
    port: c.SMTP_PORT,
    secure: c.SMTP_SECURE === 'true',
    auth: c.SMTP_USER ? { user: c.SMTP_USER, pass: c.SMTP_PASS } : undefined,
    connectionTimeout: 5000,
    greetingTimeout: 5000,
  });
  return transport;
}

export async function sendMail(mail: OutgoingMail): Promise<void> {
  await getTransport().sendMail({
    from: config().MAIL_FROM,
    to: mail.to,
    subject: mail.subject,
    text: mail.text,
    html: mail.html,
  });
}

/**
 * Local SMTP fake for development, the demo and tests: accepts any mail on 127.0.0.1 and stores
 * it in the mail_capture table, where admins read it in the app (/admin/mail). Never used when
 * SMTP_HOST points at a real relay.
 */
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { db } from '../src/lib/db/client';
import { insertCapturedMail } from '../src/lib/db/mail-capture';

const port = Number(process.env.SMTP_PORT ?? 2525);
const MAX_BYTES = 5_000_000;

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  size: MAX_BYTES,
  logger: false,
  onData(stream, session, callback) {
    simpleParser(stream)
      .then(async (mail) => {
        const to = session.envelope.rcptTo.map((r) => r.address.toLowerCase());
        const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
        await insertCapturedMail(db, {
          from,
          to,
          subject: mail.subject ?? '',
          text: mail.text ?? '',
          html: typeof mail.html === 'string' ? mail.html : null,
        });
        callback();
      })
      .catch((err: Error) => callback(err));
  },
});

server.on('error', (err: NodeJS.ErrnoException) => {
  console.error(
    err.code === 'EADDRINUSE'
      ? `mail-fake: port ${port} is taken; set SMTP_PORT to another port`
      : `mail-fake: ${err.message}`,
  );
  process.exit(1);
});

server.listen(port, '127.0.0.1', () =>
  console.log(`mail-fake: SMTP on 127.0.0.1:${port}, storing mail in the database`),
);

for (const sig of ['SIGINT', 'SIGTERM'] as const) {
  process.on(sig, () => server.close(() => db.destroy().finally(() => process.exit(0))));
}

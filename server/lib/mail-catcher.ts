// A local SMTP server that stands in for a hosted mail service: it accepts every message on
// loopback and keeps it in PostgreSQL, where an owner can read it in the app during development.
import { SMTPServer } from 'smtp-server';
import { simpleParser, type AddressObject } from 'mailparser';
import { storeCaughtMail } from '../services/caught-mail-service';
import { logger } from './logger';

function addresses(a: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(a) ? a : a ? [a] : [];
  return list.flatMap((x) => x.value.map((v) => v.address ?? '')).filter(Boolean);
}

export function startMailCatcher(port: number): Promise<SMTPServer> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    size: 5 * 1024 * 1024,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((mail) =>
          storeCaughtMail({
            from: mail.from?.text ?? '',
            to: addresses(mail.to),
            subject: mail.subject ?? '(no subject)',
            text: mail.text ?? '',
          }),
        )
        .then(() => callback())
        .catch((err: Error) => {
          logger.error({ err }, 'mail catcher could not store a message');
          callback(err);
        });
    },
  });
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve(server));
  });
}

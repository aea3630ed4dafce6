import nodemailer, { type Transporter } from 'nodemailer';
import { env } from './env';
import { logger } from './logger';

let transport: Transporter | undefined;

function getTransport(): Transporter {
  if (!transport) transport = nodemailer.createTransport(env().SMTP_URL);
  return transport;
}

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
}

export async function sendMail(mail: OutgoingMail): Promise<void> {
  await getTransport().sendMail({ from: env().MAIL_FROM, ...mail });
  logger.info({ to: mail.to, subject: mail.subject }, 'mail sent');
}

export function closeMailer() {
  transport?.close();
  transport = undefined;
}

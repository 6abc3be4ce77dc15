import nodemailer, { type Transporter } from 'nodemailer';
import { config } from './config';

let transport: Transporter | undefined;

/** The SMTP transport: the local mail fake on one machine, any SMTP relay in production. */
export function mailer(): Transporter {
  const settings = config();
  transport ??= nodemailer.createTransport({
    host: settings.SMTP_HOST,
    port: settings.SMTP_PORT,
    secure: false,
    ignoreTLS: settings.SMTP_HOST === '127.0.0.1' || settings.SMTP_HOST === 'localhost',
    auth: settings.SMTP_USER ? { user: settings.SMTP_USER, pass: settings.SMTP_PASSWORD } : undefined,
  });
  return transport;
}

export async function pingMail(): Promise<void> {
  await mailer().verify();
}

export interface Message {
  to: string;
  subject: string;
  text: string;
  html?: string;
}

export async function sendMail(message: Message): Promise<void> {
  await mailer().sendMail({ from: config().MAIL_FROM, ...message });
}

import nodemailer from 'nodemailer';
import type { Env } from '../env';

export type MailMessage = { to: string; subject: string; text: string; html?: string };
/**
 * Sends (or, in the app, enqueues) one message. `db`: the open transaction of the change that
 * causes the mail, so the mail goes out only if that change is saved; `wineryId`: whose mail it
 * is (its owners see it if it cannot be delivered).
 */
export type MailOptions = { db?: import('../db/client').DbOrTx; wineryId?: string | null };
export type Mailer = { send(message: MailMessage, opts?: MailOptions): Promise<void> };

export type SmtpSettings = {
  host: string;
  port: number;
  secure?: boolean;
  user?: string;
  password?: string;
  from: string;
};

/** The SMTP relay from the environment, or the local fake SMTP server listening on `fakePort`. */
export function smtpSettingsFrom(env: Env, fakePort?: number): SmtpSettings {
  return fakePort !== undefined
    ? { host: '127.0.0.1', port: fakePort, from: env.MAIL_FROM }
    : { host: env.SMTP_HOST!, port: env.SMTP_PORT, secure: env.SMTP_SECURE, user: env.SMTP_USER, password: env.SMTP_PASSWORD, from: env.MAIL_FROM };
}

/** Sends mail over SMTP through nodemailer (a real relay, or the local fake in development). */
export function createSmtpMailer(settings: SmtpSettings): Mailer {
  const transport = nodemailer.createTransport({
    host: settings.host,
    port: settings.port,
    secure: settings.secure ?? false,
    ignoreTLS: !settings.secure && !settings.user,
    auth: settings.user ? { user: settings.user, pass: settings.password ?? '' } : undefined,
  });
  return {
    async send(message) {
      await transport.sendMail({ from: settings.from, ...message });
    },
  };
}

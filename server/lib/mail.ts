import nodemailer from 'nodemailer';

export type MailMessage = { to: string; subject: string; text: string; html?: string };
export type Mailer = { send(message: MailMessage): Promise<void> };

export type SmtpSettings = {
  host: string;
  port: number;
  secure?: boolean;
  user?: string;
  password?: string;
  from: string;
};

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

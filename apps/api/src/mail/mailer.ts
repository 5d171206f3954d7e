import nodemailer from 'nodemailer';
import type { Config } from '../config';

export interface OutgoingMail {
  readonly to: string;
  readonly subject: string;
  readonly text: string;
  readonly html?: string | null;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

const LOOPBACK = new Set(['127.0.0.1', 'localhost', '::1']);

/** SMTP through nodemailer; STARTTLS is skipped only for a loopback relay (dev and tests). */
export function createSmtpMailer(config: Config): Mailer {
  const transport = nodemailer.createTransport({
    host: config.smtpHost,
    port: config.smtpPort,
    secure: false,
    ignoreTLS: LOOPBACK.has(config.smtpHost),
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  });
  return {
    async send(mail) {
      await transport.sendMail({
        from: config.mailFrom,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        ...(mail.html ? { html: mail.html } : {}),
      });
    },
    close() {
      transport.close();
    },
  };
}

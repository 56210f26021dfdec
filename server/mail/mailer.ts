import nodemailer from "nodemailer";
import type { Config } from "../config.ts";

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
}

/** Sends one message or throws; the outbox decides about retries. Tests inject their own. */
export interface Mailer {
  send: (message: MailMessage) => Promise<void>;
  close: () => void;
}

/** nodemailer over SMTP, as configured: the local sink in development and tests, a real relay in production. */
export function createSmtpMailer(config: Config): Mailer {
  const transport = nodemailer.createTransport({
    host: config.SMTP_HOST,
    port: config.SMTP_PORT,
    secure: config.SMTP_SECURE,
    auth: config.SMTP_USER ? { user: config.SMTP_USER, pass: config.SMTP_PASSWORD ?? "" } : undefined,
    // A relay that is down should fail fast; the outbox retries later.
    connectionTimeout: 5000,
    greetingTimeout: 5000,
    socketTimeout: 15_000,
  });
  return {
    send: async (m) => {
      await transport.sendMail({ from: config.MAIL_FROM, to: m.to, subject: m.subject, text: m.text });
    },
    close: () => transport.close(),
  };
}

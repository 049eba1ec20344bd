import nodemailer from 'nodemailer';
import type { Config } from '../../config.ts';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  /** True when the SMTP server accepts a connection (for readiness reports, never fatal). */
  verify(): Promise<boolean>;
  close(): void;
}

/** Sends Lagbook's mail through SMTP (the local capture in dev and tests, the lab's relay in production). */
export function createMailer(smtp: Config['smtp']): Mailer {
  const transport = nodemailer.createTransport({
    host: smtp.host,
    port: smtp.port,
    secure: smtp.secure,
    ignoreTLS: !smtp.secure && (smtp.host === '127.0.0.1' || smtp.host === 'localhost'),
    auth: smtp.user ? { user: smtp.user, pass: smtp.password ?? '' } : undefined,
    connectionTimeout: 5000,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from: smtp.from, ...mail });
    },
    async verify() {
      try {
        await transport.verify();
        return true;
      } catch {
        return false;
      }
    },
    close: () => transport.close(),
  };
}

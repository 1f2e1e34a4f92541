import nodemailer from 'nodemailer';
import type { Config } from '../config';

export interface MailMessage {
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  messageId: string;
}

/** The one thing the sender needs of a mail server; tests can hand in a server that refuses. */
export interface MailTransport {
  send(message: MailMessage): Promise<{ messageId: string; response: string }>;
  close(): void;
}

/**
 * SMTP through nodemailer with bounded waits: the sender holds an outbox row
 * locked while it talks to the server, so a silent server must not hold it long.
 */
export function smtpTransport(config: Pick<Config, 'SMTP_HOST' | 'SMTP_PORT' | 'SMTP_SECURE' | 'SMTP_USER' | 'SMTP_PASS'>): MailTransport {
  const transporter = nodemailer.createTransport({
    host: config.SMTP_HOST,
    port: config.SMTP_PORT,
    secure: config.SMTP_SECURE,
    auth: config.SMTP_USER ? { user: config.SMTP_USER, pass: config.SMTP_PASS ?? '' } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  });
  return {
    async send(message) {
      const info = await transporter.sendMail({ ...message, to: message.to.join(', ') });
      return { messageId: String(info.messageId), response: String(info.response ?? '') };
    },
    close: () => transporter.close(),
  };
}

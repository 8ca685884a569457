/**
 * Outgoing e-mail through nodemailer over SMTP: to SMTP_URL when set, else to the local catcher
 * (server/lib/mail-catcher.ts) that fills the Outbox. Each message carries the organisation it
 * belongs to in a header, so the Outbox shows an organisation only its own mail.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import { logger } from './logger.js';

export const ORGANIZATION_HEADER = 'X-Statorline-Organization';

export interface OutgoingMail {
  organizationId: number | null;
  to: string[];
  subject: string;
  text: string;
  html?: string;
  attachments?: Array<{ filename: string; content: Buffer; contentType: string }>;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<{ messageId: string }>;
  close(): void;
}

export function createMailer(options: { smtpUrl?: string | undefined; catcherPort: number; from: string }): Mailer {
  const transport: Transporter = options.smtpUrl
    ? nodemailer.createTransport(options.smtpUrl)
    : nodemailer.createTransport({ host: '127.0.0.1', port: options.catcherPort, secure: false, ignoreTLS: true });
  return {
    async send(mail) {
      const info = await transport.sendMail({
        from: options.from,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        ...(mail.html ? { html: mail.html } : {}),
        ...(mail.attachments ? { attachments: mail.attachments } : {}),
        headers: mail.organizationId === null ? {} : { [ORGANIZATION_HEADER]: String(mail.organizationId) },
      });
      logger.info('mail sent', { to: mail.to, subject: mail.subject });
      return { messageId: String(info.messageId) };
    },
    close() {
      transport.close();
    },
  };
}

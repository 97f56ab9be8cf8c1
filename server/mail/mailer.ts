// Outgoing mail through nodemailer over SMTP (MAIL_URL, or the local fake's smtp://127.0.0.1:port).
import nodemailer from 'nodemailer';

/** The header that tells the local mail fake which shop a message concerns (for the Outbox). */
export const SHOP_HEADER = 'X-Crankwise-Shop';

/** One message to send. */
export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** Files attached (the report PDF). */
  attachments?: { filename: string; content: Buffer; contentType: string }[];
  /** The shop the message concerns; the fake stores it so the shop's admins see it in the Outbox. */
  shopId?: number;
}

/** What the app needs from a mailer; createApp() takes one so tests can point it at their own fake. */
export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

/**
 * An SMTP mailer. `url` is smtp://[user:pass@]host:port (or smtps://).
 * @param from the From header, e.g. `Crankwise <no-reply@crankwise.test>`
 */
export function createSmtpMailer(url: string, from: string): Mailer {
  const transport = nodemailer.createTransport(url);
  return {
    async send(mail) {
      await transport.sendMail({
        from,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        html: mail.html,
        attachments: mail.attachments,
        headers: mail.shopId !== undefined ? { [SHOP_HEADER]: String(mail.shopId) } : undefined,
      });
    },
    close: () => transport.close(),
  };
}

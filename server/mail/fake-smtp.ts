// The local mail fake: an SMTP server on 127.0.0.1 (smtp-server) that stores every message it
// receives in mail_messages, so admins read them on the Outbox and tests follow their links.
// It runs only when MAIL_URL is unset (development, demo and tests); it never relays anything.
import { simpleParser, type AddressObject } from 'mailparser';
import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import type { Logger } from '../logger';
import { MailMessage, Shop } from '../models';
import { SHOP_HEADER } from './mailer';

/** A running mail fake. */
export interface MailFake {
  port: number;
  url: string;
  stop(): Promise<void>;
}

const MAX_MESSAGE_BYTES = 5 * 1024 * 1024;

function addresses(value: AddressObject | AddressObject[] | undefined): string {
  if (!value) return '';
  return (Array.isArray(value) ? value : [value]).map((a) => a.text).join(', ');
}

/**
 * Starts the fake on 127.0.0.1:`port` (0 = any free port). Messages are stored once the SMTP DATA
 * command is answered, so when nodemailer's sendMail resolves the row is already there.
 */
export async function startMailFake(port: number, logger: Logger): Promise<MailFake> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: MAX_MESSAGE_BYTES,
    banner: 'Crankwise local mail fake (stores, never relays)',
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const shopHeader = parsed.headers.get(SHOP_HEADER.toLowerCase());
          const shopId = Number(typeof shopHeader === 'string' ? shopHeader : NaN);
          const knownShop = Number.isInteger(shopId) && (await Shop.count({ where: { id: shopId } })) > 0;
          await MailMessage.create({
            shopId: knownShop ? shopId : null,
            to: addresses(parsed.to).slice(0, 1000),
            from: addresses(parsed.from).slice(0, 1000),
            subject: (parsed.subject ?? '').slice(0, 1000),
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
            attachments: parsed.attachments.length === 0 ? null : JSON.stringify(parsed.attachments.map((a) => ({
              filename: a.filename ?? 'attachment', contentType: a.contentType, size: a.size, base64: a.content.toString('base64'),
            }))),
          });
          callback();
        })
        .catch((error: unknown) => {
          logger.error('mail fake could not store a message', { error });
          callback(error instanceof Error ? error : new Error(String(error)));
        });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
  server.on('error', (error) => logger.error('mail fake error', { error }));
  const actual = ((server as unknown as { server: { address(): AddressInfo } }).server.address()).port;
  return {
    port: actual,
    url: `smtp://127.0.0.1:${actual}`,
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

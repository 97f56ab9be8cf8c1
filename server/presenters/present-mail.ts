import type { OutboxItem, OutboxMessage } from '../../shared/schemas/invites';
import type { MailMessage } from '../models';

/** MailMessage → an Outbox list row. */
export function presentOutboxItem(m: MailMessage): OutboxItem {
  return { id: m.id, to: m.to, from: m.from, subject: m.subject, createdAt: m.createdAt.toISOString() };
}

/** MailMessage → the full Outbox message. The client renders `html` sandboxed, never as live markup. */
export function presentOutboxMessage(m: MailMessage): OutboxMessage {
  return { ...presentOutboxItem(m), text: m.text, html: m.html };
}

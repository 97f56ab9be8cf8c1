import type { OutboxItem, OutboxMessage } from '../../shared/schemas/invites';
import type { MailMessage } from '../models';

/** MailMessage → an Outbox list row. */
export function presentOutboxItem(m: MailMessage): OutboxItem {
  return { id: m.id, to: m.to, from: m.from, subject: m.subject, createdAt: m.createdAt.toISOString() };
}

/** MailMessage → the full Outbox message. The client renders `html` sandboxed, never as live markup. */
export function presentOutboxMessage(m: MailMessage): OutboxMessage {
  const attachments = mailAttachments(m).map((a, index) => ({ index, filename: a.filename, contentType: a.contentType, size: a.size }));
  return { ...presentOutboxItem(m), text: m.text, html: m.html, attachments };
}

/** The attachments the fake stored with a message (none when the column is empty or unreadable). */
export function mailAttachments(m: MailMessage): { filename: string; contentType: string; size: number; base64: string }[] {
  if (!m.attachments) return [];
  try {
    const list = JSON.parse(m.attachments) as unknown;
    return Array.isArray(list) ? (list as { filename: string; contentType: string; size: number; base64: string }[]) : [];
  } catch {
    return [];
  }
}

import { ADMIN_ONLY } from '../../shared/auth/access';
import type { MailMessage } from '../models';
import { notFound } from '../errors';
import { mailAttachments, presentOutboxItem, presentOutboxMessage } from '../presenters/present-mail';
import { listOutbox } from '../services/outbox';
import type { RouteRow } from './route-row';

/** The Outbox: what the local mail fake received for the admin's shop. */
export const outboxRoutes: RouteRow[] = [
  {
    method: 'get',
    path: '/outbox',
    roles: ADMIN_ONLY,
    summary: "mail sent to the shop's users and invitees",
    handlers: [async (req, res) => void res.json({ items: (await listOutbox(req.user!.shopId)).map(presentOutboxItem) })],
  },
  {
    method: 'get',
    path: '/outbox/:id',
    roles: ADMIN_ONLY,
    ownedParam: 'id',
    resource: 'mail',
    summary: 'one message in full',
    handlers: [(_req, res) => void res.json({ message: presentOutboxMessage(res.locals.owned as MailMessage) })],
  },
  {
    method: 'get',
    path: '/outbox/:id/attachments/:index',
    roles: ADMIN_ONLY,
    ownedParam: 'id',
    resource: 'mail',
    summary: 'one attachment of a message, as the file',
    handlers: [(req, res) => {
      const a = mailAttachments(res.locals.owned as MailMessage)[Number(req.params.index)];
      if (!a) throw notFound('Attachment');
      res.attachment(a.filename.replace(/[^\w.\- ]+/g, '_'));
      res.type(a.contentType).send(Buffer.from(a.base64, 'base64'));
    }],
  },
];

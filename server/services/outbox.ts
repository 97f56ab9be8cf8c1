import { MailMessage } from '../models';

/** The latest 200 messages the mail fake stored for a shop, newest first. */
export async function listOutbox(shopId: number): Promise<MailMessage[]> {
  return MailMessage.findAll({
    where: { shopId },
    attributes: ['id', 'to', 'from', 'subject', 'createdAt'],
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
    limit: 200,
  });
}

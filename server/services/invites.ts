import { Op, type Sequelize } from 'sequelize';
import { ROLE_LABELS } from '../../shared/auth/roles';
import type { AcceptInvite, CreateInvite, InviteInfo } from '../../shared/schemas/invites';
import { hashPassword } from '../auth/passwords';
import { hashToken, newToken } from '../auth/tokens';
import type { AppContext } from '../context';
import { AppError, tokenInvalid } from '../errors';
import { Invite, Shop, User } from '../models';
import { inviteExistingAccountMail, inviteMail } from '../mail/templates';

/** A shop's invites, newest first. */
export async function listInvites(shopId: number): Promise<Invite[]> {
  return Invite.findAll({ where: { shopId }, order: [['createdAt', 'DESC'], ['id', 'DESC']] });
}

/**
 * Invites `email` into the admin's shop with `role` and e-mails a one-time link valid for
 * INVITE_TTL_HOURS. A pending invite to the same address in the shop is replaced. The row is
 * committed only once the mail server accepted the message, so no invite exists without its mail.
 * 409 `email_in_use` when the address already belongs to a user of this shop (the admin sees them
 * on the Team page anyway). An address with an account in ANOTHER shop is answered exactly like
 * any invite (so the answer reveals nothing about other shops' users); its owner gets a notice
 * instead of a link, and the pending row holds a token nobody was sent, so it can never be accepted.
 */
export async function createInvite(ctx: AppContext, admin: User, input: CreateInvite): Promise<Invite> {
  const existing = await User.findOne({ where: { email: input.email } });
  if (existing && existing.shopId === admin.shopId) {
    throw new AppError(409, 'email_in_use', `${input.email} already belongs to someone in your shop; see the Team page`);
  }
  const shop = await Shop.findByPk(admin.shopId);
  if (!shop) throw new AppError(404, 'not_found', 'Shop not found');
  const { token, tokenHash } = newToken();
  const ttlHours = ctx.env.INVITE_TTL_HOURS;
  return ctx.sequelize.transaction(async (transaction) => {
    await Invite.destroy({ where: { shopId: shop.id, email: input.email, acceptedAt: null }, transaction });
    const invite = await Invite.create(
      {
        shopId: shop.id,
        email: input.email,
        role: input.role,
        tokenHash,
        invitedById: admin.id,
        expiresAt: new Date(Date.now() + ttlHours * 3_600_000),
      },
      { transaction },
    );
    const outgoing = existing
      ? { to: input.email, ...inviteExistingAccountMail(shop.name, ctx.publicUrl), shopId: existing.shopId }
      : { to: input.email, ...inviteMail(shop.name, ROLE_LABELS[input.role], `${ctx.publicUrl}/invite/${token}`, ttlHours), shopId: shop.id };
    try {
      await ctx.mailer.send(outgoing);
    } catch (error) {
      // Rolls the invite back: no invitation exists that its invitee never received.
      ctx.logger.error('invitation mail failed', { error, task: 'invite' });
      throw new AppError(502, 'mail_failed', 'The invitation e-mail could not be sent; check the mail settings (MAIL_URL) and try again');
    }
    return invite;
  });
}

async function findUsableInvite(token: string): Promise<Invite | null> {
  return Invite.findOne({
    where: { tokenHash: hashToken(token), acceptedAt: null, expiresAt: { [Op.gt]: new Date() } },
    include: [{ model: Shop, as: 'shop' }],
  });
}

/** What the accept page shows for a token; 400 `token_invalid` when unknown, used or expired. */
export async function inviteInfo(token: string): Promise<InviteInfo> {
  const invite = await findUsableInvite(token);
  if (!invite || !invite.shop) throw tokenInvalid();
  return { email: invite.email, role: invite.role, shopName: invite.shop.name };
}

/**
 * Accepts an invite once: creates the user with the given name and password and marks the invite
 * used, in one transaction with the invite row locked, so a second use (even a concurrent one)
 * gets 400 `token_invalid`.
 */
export async function acceptInvite(sequelize: Sequelize, input: AcceptInvite, bcryptRounds: number): Promise<User> {
  const passwordHash = await hashPassword(input.password, bcryptRounds);
  return sequelize.transaction(async (transaction) => {
    const invite = await Invite.findOne({
      where: { tokenHash: hashToken(input.token) },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!invite || invite.acceptedAt !== null || invite.expiresAt.getTime() <= Date.now()) throw tokenInvalid();
    const user = await User.create(
      { shopId: invite.shopId, email: invite.email, name: input.name, role: invite.role, passwordHash },
      { transaction },
    );
    invite.acceptedAt = new Date();
    await invite.save({ transaction });
    user.shop = (await Shop.findByPk(invite.shopId, { transaction }))!;
    return user;
  });
}

import { Op, type Sequelize } from 'sequelize';
import type { PasswordResetComplete } from '../../shared/schemas/auth';
import { hashPassword } from '../auth/passwords';
import { hashToken, newToken } from '../auth/tokens';
import type { AppContext } from '../context';
import { tokenInvalid } from '../errors';
import { PasswordReset, User } from '../models';
import { resetMail } from '../mail/templates';
import { endSessionsOf } from './end-sessions';

/**
 * Starts a password reset for `email`. Answers the same way whether or not the address is known
 * (the route replies 202 at once); for an active user it stores a one-time token valid RESET_TTL_MIN
 * minutes and e-mails the link. Mail failures are logged, never shown to the requester.
 */
export async function requestPasswordReset(ctx: AppContext, email: string): Promise<void> {
  const user = await User.findOne({ where: { email, active: true } });
  if (!user) return;
  const { token, tokenHash } = newToken();
  const ttlMin = ctx.env.RESET_TTL_MIN;
  await PasswordReset.create({ userId: user.id, tokenHash, expiresAt: new Date(Date.now() + ttlMin * 60_000) });
  const mail = resetMail(`${ctx.publicUrl}/reset-password/${token}`, ttlMin);
  await ctx.mailer.send({ to: user.email, ...mail, shopId: user.shopId });
}

/**
 * Sets a new password with a reset token, once: the token (and every other open reset of that
 * user) is marked used and the user's sessions end. 400 `token_invalid` when unknown, used or expired.
 */
export async function completePasswordReset(sequelize: Sequelize, input: PasswordResetComplete, bcryptRounds: number): Promise<void> {
  const passwordHash = await hashPassword(input.password, bcryptRounds);
  await sequelize.transaction(async (transaction) => {
    const reset = await PasswordReset.findOne({
      where: { tokenHash: hashToken(input.token) },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!reset || reset.usedAt !== null || reset.expiresAt.getTime() <= Date.now()) throw tokenInvalid();
    const user = await User.findOne({ where: { id: reset.userId, active: true }, transaction });
    if (!user) throw tokenInvalid();
    user.passwordHash = passwordHash;
    await user.save({ transaction });
    await PasswordReset.update({ usedAt: new Date() }, { where: { userId: user.id, usedAt: { [Op.is]: null } }, transaction });
    await endSessionsOf(user.id, transaction);
  });
}

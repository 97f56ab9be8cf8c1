import type { Sequelize } from 'sequelize';
import { transactionWithRetry } from '../db/retry';
import { AppError, forbidden } from '../errors';
import { Shop, User } from '../models';
import type { UpdateUser } from '../../shared/schemas/users';
import { endSessionsOf } from './end-sessions';

/** Every user of a shop, admins first, then by name. */
export async function listUsers(shopId: number): Promise<User[]> {
  return User.findAll({
    where: { shopId },
    include: [{ model: Shop, as: 'shop' }],
    order: [
      ['active', 'DESC'],
      ['name', 'ASC'],
    ],
  });
}

/**
 * An admin changes another user's role, active flag or name. An admin may rename themselves but not
 * demote or deactivate themselves (409 `cannot_change_self`); the shop always keeps one active admin
 * (409 `last_admin`). Deactivating ends the user's sessions in the same transaction.
 *
 * Two admins demoting (or deactivating) each other at once must not both succeed: the transaction
 * first locks the shop's row (`SELECT … FOR UPDATE`), so every change that could remove an admin of
 * that shop runs one after the other, and only then re-reads the actor and counts the admins. A
 * deadlock or lock-wait timeout reruns the whole transaction (transactionWithRetry), never a 500.
 * @param actor the signed-in admin
 * @param target a user of the actor's shop (the route table already checked ownership)
 */
export async function updateUser(sequelize: Sequelize, actor: User, target: User, changes: UpdateUser): Promise<User> {
  const demotes = changes.role !== undefined && changes.role !== 'admin';
  const deactivates = changes.active === false;
  if (actor.id === target.id && (demotes || deactivates)) {
    throw new AppError(409, 'cannot_change_self', 'You cannot demote or deactivate yourself; ask another admin');
  }
  return transactionWithRetry(sequelize, async (transaction) => {
    const shop = await Shop.findByPk(actor.shopId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!shop) throw new AppError(404, 'not_found', 'User not found');
    // The actor may have been demoted or deactivated by a change that held the lock before this one.
    const self = await User.findOne({ where: { id: actor.id, shopId: actor.shopId }, transaction });
    if (!self || self.role !== 'admin' || !self.active) throw forbidden();
    const user = await User.findOne({ where: { id: target.id, shopId: actor.shopId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!user) throw new AppError(404, 'not_found', 'User not found');
    if (user.role === 'admin' && user.active && (demotes || deactivates)) {
      const admins = await User.count({ where: { shopId: actor.shopId, role: 'admin', active: true }, transaction });
      if (admins <= 1) throw new AppError(409, 'last_admin', 'The shop must keep at least one active admin');
    }
    if (changes.role !== undefined) user.role = changes.role;
    if (changes.active !== undefined) user.active = changes.active;
    if (changes.name !== undefined) user.name = changes.name;
    await user.save({ transaction });
    if (deactivates) await endSessionsOf(user.id, transaction);
    user.shop = shop;
    return user;
  });
}

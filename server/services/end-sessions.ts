import type { Transaction } from 'sequelize';
import { Session } from '../models';

/**
 * Deletes every stored session of a user (deactivation, password reset), so other browsers are
 * signed out at once. Sessions carry userId thanks to the store's extendDefaultFields.
 */
export async function endSessionsOf(userId: number, transaction?: Transaction): Promise<number> {
  return Session.destroy({ where: { userId }, transaction });
}

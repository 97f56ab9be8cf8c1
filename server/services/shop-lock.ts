/**
 * The shop's row lock. Writes to a shop's engines and bearing table take it first (SELECT … FOR
 * UPDATE on the shop's row), so rules that span rows — an engine name is free, a bearing a part
 * names is not deleted, "(copy n)" is the next free number — are checked where no other write of
 * the shop can change them (STYLE.md §5). Reads after it in the same transaction see every write
 * committed before the lock was granted.
 */
import type { Transaction } from 'sequelize';
import { notFound } from '../errors';
import { Shop } from '../models/shop';

/** Locks the shop's row for the rest of `transaction`. */
export async function lockShop(shopId: number, transaction: Transaction): Promise<void> {
  const shop = await Shop.findByPk(shopId, { transaction, lock: transaction.LOCK.UPDATE, attributes: ['id'] });
  if (!shop) throw notFound('Shop');
}

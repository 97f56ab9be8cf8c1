import type { Sequelize, Transaction } from 'sequelize';
import { hashPassword } from '../auth/passwords';
import { AppError } from '../errors';
import { Shop, User } from '../models';
import { seedPublishedBearings } from './bearings';
import type { Role } from '../../shared/auth/roles';

/** A user to create with a new shop. */
export interface NewShopUser {
  name: string;
  email: string;
  password: string;
  role: Role;
}

/** Input of {@link createShop}: values already validated (SetupSchema or the create-shop CLI). */
export interface CreateShopInput {
  name: string;
  isDemo?: boolean;
  users: NewShopUser[];
}

/**
 * Creates a shop and its users in one transaction: either all rows are written or none.
 * Hashing happens before the transaction so it stays short. An e-mail already in use anywhere
 * gives 409 `email_in_use`.
 * @returns the shop and its users (each with `shop` set)
 */
export async function createShop(
  sequelize: Sequelize,
  input: CreateShopInput,
  bcryptRounds: number,
): Promise<{ shop: Shop; users: User[] }> {
  const hashes = await Promise.all(input.users.map((u) => hashPassword(u.password, bcryptRounds)));
  const emails = input.users.map((u) => u.email.trim().toLowerCase());
  return sequelize.transaction(async (transaction: Transaction) => {
    const taken = await User.findOne({ where: { email: emails }, transaction });
    if (taken) throw new AppError(409, 'email_in_use', `${taken.email} already has a Crankwise account`);
    const shop = await Shop.create({ name: input.name.trim(), isDemo: input.isDemo ?? false }, { transaction });
    await seedPublishedBearings(shop.id, transaction); // Drive library: docs/references.md §1 published rows
    const users: User[] = [];
    for (const [i, u] of input.users.entries()) {
      const user = await User.create(
        { shopId: shop.id, name: u.name.trim(), email: emails[i]!, role: u.role, passwordHash: hashes[i]! },
        { transaction },
      );
      user.shop = shop;
      users.push(user);
    }
    return { shop, users };
  });
}
